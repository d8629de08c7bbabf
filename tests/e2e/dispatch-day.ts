import { afterAll, beforeAll } from 'vitest';
import type { Knex } from 'knex';
import { launch } from './browser.ts';
import { appDatabase } from '../integration/helpers/db.ts';
import { clearPlan, dispatchTestDate } from '../integration/dispatch/dates.ts';

type Session = Awaited<ReturnType<typeof launch>>;

/**
 * The set-up every dispatch browser test shares: a plan date of the file's own (the n-th
 * Monday–Thursday after today, cleared of an earlier run's plan), the app's database and a browser,
 * closed again after the file's tests. Read `knex` and `browser` inside tests, after the set-up ran.
 */
export function dispatchBrowserDay(n: Parameters<typeof dispatchTestDate>[1], viewport = { width: 1500, height: 1000 }) {
  const day = { date: dispatchTestDate('America/New_York', n), knex: null as unknown as Knex, browser: null as unknown as Session };
  beforeAll(async () => {
    day.knex = appDatabase();
    await clearPlan(day.knex, 1, day.date);
    day.browser = await launch({ viewport });
  });
  afterAll(async () => {
    await day.browser?.close();
    await day.knex?.destroy();
  });
  return day;
}
