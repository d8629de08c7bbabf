import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { call, sessionCookie } from '../helpers/api.ts';
import { appDatabase } from '../helpers/db.ts';
import { clearPlan, dispatchTestDate } from './dates.ts';
import { checkSolution, createProblem } from '../../../src/lib/solver/index.ts';
import { listDayBarns, listDayFarriers, listDayJobs, loadRoutes } from '../../../src/lib/db/plans.ts';
import { buildDayProblem, dayPlaces, farrierKey, jobKey, barnKey } from '../../../src/lib/dispatch/problem.ts';
import { dayMatrix } from '../../../src/lib/dispatch/matrix-cache.ts';
import { dateToLocalSec, isoWeekday } from '../../../src/lib/dispatch/time.ts';
import { getPractice } from '../../../src/lib/db/practices.ts';

const TZ = 'America/New_York';
let knex: Knex;
let dispatcher: string;
let lead: string;
let farrier: string;
let other: string;

beforeAll(async () => {
  knex = appDatabase();
  [dispatcher, lead, farrier, other] = await Promise.all([
    sessionCookie('dispatcher@demo.test'), sessionCookie('lead@demo.test'), sessionCookie('farrier1@demo.test'), sessionCookie('dispatcher@other.test'),
  ]);
});
afterAll(async () => {
  await knex.destroy();
});

describe('planning the demo practice’s next working day', () => {
  const date = dispatchTestDate(TZ, 1);
  let plan: any;

  it('stores a complete draft that the engine’s independent checker finds feasible', async () => {
    await clearPlan(knex, 1, date);
    const res = await call('POST', '/api/plans', { cookie: dispatcher, body: { date, budgetSeconds: 5 } });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    plan = res.body;
    expect(plan.date).toBe(date);
    expect(plan.state).toBe('draft');
    expect(plan.version).toBe(1);
    // Times carry the practice's offset (New York: -05:00 in winter, -04:00 in summer).
    const first = plan.routes.find((r: any) => r.stops.length)!;
    expect(first.start).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}-0[45]:00$/);
    expect(plan.routes.length).toBeGreaterThanOrEqual(5);
    expect(plan.figures.horses).toBeGreaterThan(20);

    // Rebuild the day's problem from the database and re-time the stored routes from scratch.
    const practice = (await getPractice(knex, 1))!;
    const routes = await loadRoutes(knex, 1, plan.id);
    const jobIds = [...routes.flatMap((r) => r.stops.flatMap((s) => s.jobIds)), ...plan.unplanned.map((u: any) => u.jobId)];
    const jobs = await listDayJobs(knex, 1, { ids: jobIds });
    const farriers = (await listDayFarriers(knex, 1)).filter((f) => f.workingDays.includes(isoWeekday(date)));
    const barns = await listDayBarns(knex, 1, [...new Set(jobs.map((j) => j.barnId))]);
    const places = dayPlaces(farriers, barns);
    const problem = createProblem(buildDayProblem({ date, practice, farriers, jobs, barns, places, matrix: dayMatrix(places.points) }));
    const check = checkSolution(
      problem,
      {
        routes: routes.map((r) => ({
          farrierId: farrierKey(r.farrierId),
          stops: r.stops.map((s) => ({ barnId: barnKey(s.barnId), jobIds: s.jobIds.map(jobKey), arrivalSec: dateToLocalSec(date, s.arrivalAt, TZ), startSec: dateToLocalSec(date, s.startAt, TZ), departureSec: dateToLocalSec(date, s.departureAt, TZ) })),
        })),
        unplanned: plan.unplanned.map((u: any) => ({ jobId: jobKey(u.jobId) })),
      },
      { complete: true, compareTimes: true },
    );
    expect(check.violations).toEqual([]);
    expect(check.feasible).toBe(true);
    // Stored figures agree with the checker's re-timing (drive seconds summed over routes).
    expect(routes.reduce((a, r) => a + r.driveSeconds, 0)).toBe(check.costs.driveSec);
  });

  it('marks the planned jobs planned and writes one audit row for the plan', async () => {
    const ids = plan.routes.flatMap((r: any) => r.stops.flatMap((s: any) => s.jobs.map((j: any) => j.id)));
    const states = await knex('jobs').whereIn('id', ids).distinct('state');
    expect(states.map((s: any) => s.state)).toEqual(['planned']);
    const audits = await knex('audit_log').where({ entity: 'plan', entity_id: plan.id, action: 'plan.create' }).count({ n: '*' });
    expect(Number(audits[0]!.n)).toBe(1);
  });

  it('answers GET by date and by id with the same plan, and a second POST for the date with 409', async () => {
    const byDate = await call('GET', `/api/plans?date=${date}`, { cookie: lead });
    const byId = await call('GET', `/api/plans/${plan.id}`, { cookie: dispatcher });
    expect(byDate.status).toBe(200);
    expect(byId.body).toEqual(byDate.body);
    const again = await call('POST', '/api/plans', { cookie: dispatcher, body: { date } });
    expect(again.status).toBe(409);
  });

  it('refuses a farrier with 403 and hides the plan from another practice with 404', async () => {
    expect((await call('POST', '/api/plans', { cookie: farrier, body: { date } })).status).toBe(403);
    expect((await call('PATCH', `/api/plans/${plan.id}`, { cookie: farrier, body: { version: 1, moves: [] } })).status).toBe(403);
    expect((await call('GET', `/api/plans/${plan.id}`, { cookie: other })).status).toBe(404);
    const patch = await call('PATCH', `/api/plans/${plan.id}`, { cookie: other, body: { version: 1, moves: [{ jobId: 1, toFarrierId: null }] } });
    expect(patch.status).toBe(404);
    expect((await call('POST', `/api/plans/${plan.id}/publish`, { cookie: other, body: { version: 1 } })).status).toBe(404);
  });

  it('answers bad input with 400 naming the field', async () => {
    const noDate = await call('POST', '/api/plans', { cookie: dispatcher, body: {} });
    expect(noDate.status).toBe(400);
    expect(Object.keys(noDate.body.error.fields)).toContain('date');
    const badDate = await call('POST', '/api/plans', { cookie: dispatcher, body: { date: '2026-02-30' } });
    expect(badDate.body.error.fields.date).toBeDefined();
    const badMove = await call('PATCH', `/api/plans/${plan.id}`, { cookie: dispatcher, body: { version: 1, moves: [{ jobId: 'x', toFarrierId: 1 }] } });
    expect(badMove.status).toBe(400);
    expect(Object.keys(badMove.body.error.fields)).toContain('moves.0.jobId');
    const noVersion = await call('POST', `/api/plans/${plan.id}/publish`, { cookie: dispatcher, body: {} });
    expect(noVersion.body.error.fields.version).toBeDefined();
    const q = await call('GET', '/api/plans?date=tomorrow', { cookie: dispatcher });
    expect(q.status).toBe(400);
    expect(q.body.error.fields.date).toBeDefined();
  });
});
