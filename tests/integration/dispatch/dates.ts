import type { Knex } from 'knex';
import { addDays, isoWeekday, todayIn } from '../../../src/lib/dispatch/time.ts';

/**
 * Plan dates the dispatch tests own, so they never share a day with each other or with other test
 * files: the n-th Monday–Thursday after the practice's today (every demo farrier but one works then).
 * 1 = the planning test (the next such working day), 2 = the browser test, 3 = the edit tests,
 * 4 = the long-lane browser test, 5 = the sideways keyboard-drag browser test, 6 = the map and board
 * browser test.
 */
export function dispatchTestDate(timeZone: string, n: 1 | 2 | 3 | 4 | 5 | 6): string {
  let d = todayIn(timeZone);
  let found = 0;
  for (;;) {
    d = addDays(d, 1);
    if (isoWeekday(d) <= 4 && ++found === n) return d;
  }
}

/** Removes a leftover plan of an earlier run for a date, and frees its jobs. */
export async function clearPlan(knex: Knex, practiceId: number, date: string): Promise<void> {
  const plan = await knex('plans').where({ practice_id: practiceId, plan_date: date }).first('id');
  if (!plan) return;
  const jobIds = (await knex('stop_jobs').where({ plan_id: plan.id }).select('job_id')).map((r: { job_id: number }) => r.job_id);
  if (jobIds.length) await knex('jobs').whereIn('id', jobIds).update({ state: 'due' });
  await knex('messages').where({ plan_id: plan.id }).delete();
  await knex('plans').where({ id: plan.id }).delete();
}
