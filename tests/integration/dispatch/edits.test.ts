import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { call, sessionCookie } from '../helpers/api.ts';
import { appDatabase } from '../helpers/db.ts';
import { clearPlan, dispatchTestDate } from './dates.ts';

const TZ = 'America/New_York';
let knex: Knex;
let cookie: string;
let plan: any;
const date = dispatchTestDate(TZ, 3);

const routed = (p: any) => p.routes.filter((r: any) => r.stops.length > 0);
const farrierOf = (p: any, jobId: number) => p.routes.find((r: any) => r.stops.some((s: any) => s.jobs.some((j: any) => j.id === jobId)))?.farrierId ?? null;

beforeAll(async () => {
  knex = appDatabase();
  cookie = await sessionCookie('dispatcher@demo.test');
  await clearPlan(knex, 1, date);
  const res = await call('POST', '/api/plans', { cookie, body: { date, budgetSeconds: 1 } });
  if (res.status !== 201) throw new Error(`planning ${date} answered ${res.status} ${JSON.stringify(res.body)}`);
  plan = res.body;
});
afterAll(async () => {
  await knex.destroy();
});

describe('hand edits of a plan', () => {
  it('moves a job to another farrier, re-times both routes and persists the move', async () => {
    const [a, b] = routed(plan);
    const job = a.stops[0].jobs[0];
    const res = await call('PATCH', `/api/plans/${plan.id}`, { cookie, body: { version: plan.version, moves: [{ jobId: job.id, toFarrierId: b.farrierId, position: 1 }] } });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.version).toBe(plan.version + 1);
    const bAfter = res.body.routes.find((r: any) => r.farrierId === b.farrierId);
    expect(bAfter.stops[0].jobs.map((j: any) => j.id)).toContain(job.id);
    // The receiving route now does one more horse; its first arrival follows the new first stop.
    expect(bAfter.horses).toBe(b.horses + 1);
    const aAfter = res.body.routes.find((r: any) => r.farrierId === a.farrierId);
    expect(aAfter.horses).toBe(a.horses - 1);
    // Persisted: a fresh GET and the stop_jobs table both show it with the new farrier.
    const fresh = await call('GET', `/api/plans/${plan.id}`, { cookie });
    expect(farrierOf(fresh.body, job.id)).toBe(b.farrierId);
    const row = await knex('stop_jobs as sj').join('stops as s', 's.id', 'sj.stop_id').join('routes as r', 'r.id', 's.route_id').where('sj.job_id', job.id).first('r.farrier_id');
    expect(row.farrier_id).toBe(b.farrierId);
    const audit = await knex('audit_log').where({ entity: 'plan', entity_id: plan.id, action: 'plan.edit' }).count({ n: '*' });
    expect(Number(audit[0]!.n)).toBe(1);
    plan = res.body;
  });

  it('says in words what a move breaks and moves nothing else: forge work on the truck without a forge', async () => {
    const noForge = plan.routes.find((r: any) => !r.hasForge);
    const forgeJob = routed(plan).flatMap((r: any) => r.stops.flatMap((s: any) => s.jobs)).find((j: any) => j.workTypes.includes('Hot fit') || j.workTypes.includes('Bar shoes'))
      ?? plan.unplanned.map((u: any) => u.job).find((j: any) => j.workTypes.includes('Hot fit'));
    expect(noForge && forgeJob).toBeTruthy();
    const before = JSON.stringify(plan.routes.filter((r: any) => r.farrierId !== noForge.farrierId && r.farrierId !== farrierOf(plan, forgeJob.id)).map((r: any) => r.stops));
    const res = await call('PATCH', `/api/plans/${plan.id}`, { cookie, body: { version: plan.version, moves: [{ jobId: forgeJob.id, toFarrierId: noForge.farrierId }] } });
    expect(res.status).toBe(200);
    const lane = res.body.routes.find((r: any) => r.farrierId === noForge.farrierId);
    const warnings = [...lane.warnings, ...lane.stops.flatMap((s: any) => s.warnings)];
    expect(warnings.map((w: any) => w.code)).toContain('no_forge');
    expect(warnings.find((w: any) => w.code === 'no_forge').message).toMatch(/^No forge: .* has no forge$/);
    expect(farrierOf(res.body, forgeJob.id)).toBe(noForge.farrierId);
    const after = JSON.stringify(res.body.routes.filter((r: any) => r.farrierId !== noForge.farrierId && r.farrierId !== farrierOf(plan, forgeJob.id)).map((r: any) => r.stops));
    expect(after).toBe(before);
    plan = res.body;
  });

  it('answers a stale version with 409 stale_version and changes nothing', async () => {
    const before = await call('GET', `/api/plans/${plan.id}`, { cookie });
    const auditsBefore = await knex('audit_log').where({ entity: 'plan', entity_id: plan.id }).count({ n: '*' });
    const [a, b] = routed(plan);
    const res = await call('PATCH', `/api/plans/${plan.id}`, { cookie, body: { version: plan.version - 1, moves: [{ jobId: a.stops[0].jobs[0].id, toFarrierId: b.farrierId }] } });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('stale_version');
    const after = await call('GET', `/api/plans/${plan.id}`, { cookie });
    expect(after.body).toEqual(before.body);
    const auditsAfter = await knex('audit_log').where({ entity: 'plan', entity_id: plan.id }).count({ n: '*' });
    expect(auditsAfter).toEqual(auditsBefore);
  });

  it('never loses an edit when two PATCHes arrive at once: one wins, the other gets 409, the winner persists', async () => {
    const [a, b, c] = routed(plan);
    const j1 = a.stops[a.stops.length - 1].jobs[0].id;
    const j2 = b.stops[b.stops.length - 1].jobs[0].id;
    const [r1, r2] = await Promise.all([
      call('PATCH', `/api/plans/${plan.id}`, { cookie, body: { version: plan.version, moves: [{ jobId: j1, toFarrierId: c.farrierId }] } }),
      call('PATCH', `/api/plans/${plan.id}`, { cookie, body: { version: plan.version, moves: [{ jobId: j2, toFarrierId: c.farrierId }] } }),
    ]);
    expect([r1.status, r2.status].sort()).toEqual([200, 409]);
    const winner = r1.status === 200 ? j1 : j2;
    const fresh = await call('GET', `/api/plans/${plan.id}`, { cookie });
    expect(fresh.body.version).toBe(plan.version + 1);
    expect(farrierOf(fresh.body, winner)).toBe(c.farrierId);
    // The loser retries on the new version and both edits are kept.
    const loser = winner === j1 ? j2 : j1;
    const retry = await call('PATCH', `/api/plans/${plan.id}`, { cookie, body: { version: fresh.body.version, moves: [{ jobId: loser, toFarrierId: c.farrierId }] } });
    expect(retry.status).toBe(200);
    expect(farrierOf(retry.body, winner)).toBe(c.farrierId);
    expect(farrierOf(retry.body, loser)).toBe(c.farrierId);
    plan = retry.body;
  });

  it('pins a job, keeps it with its farrier on "re-plan the rest", and takes a job off the plan with a reason', async () => {
    const r = routed(plan)[0];
    const job = r.stops[0].jobs[0];
    const pinned = await call('PATCH', `/api/plans/${plan.id}`, { cookie, body: { version: plan.version, moves: [{ jobId: job.id, toFarrierId: r.farrierId, position: 1, pin: true }] } });
    expect(pinned.status).toBe(200);
    expect(pinned.body.routes.find((x: any) => x.farrierId === r.farrierId).stops[0].jobs.find((j: any) => j.id === job.id).pinned).toBe(true);
    const replanned = await call('POST', `/api/plans/${plan.id}/replan`, { cookie, body: { version: pinned.body.version, budgetSeconds: 1 } });
    expect(replanned.status, JSON.stringify(replanned.body)).toBe(200);
    expect(farrierOf(replanned.body, job.id)).toBe(r.farrierId);
    const other = routed(replanned.body).flatMap((x: any) => x.stops.flatMap((s: any) => s.jobs)).find((j: any) => j.id !== job.id);
    const off = await call('PATCH', `/api/plans/${plan.id}`, { cookie, body: { version: replanned.body.version, moves: [{ jobId: other.id, toFarrierId: null }] } });
    expect(off.status).toBe(200);
    const u = off.body.unplanned.find((x: any) => x.jobId === other.id);
    expect(u.reasonText).toBe('Taken off the plan by the dispatcher');
    expect((await knex('jobs').where({ id: other.id }).first('state')).state).toBe('due');
    plan = off.body;
  });

  it('publishes: plan published, its jobs booked, one owner text per stop and window, day sheets e-mailed', async () => {
    const res = await call('POST', `/api/plans/${plan.id}/publish`, { cookie, body: { version: plan.version } });
    expect(res.status).toBe(200);
    expect(res.body.state).toBe('published');
    const ids = res.body.routes.flatMap((r: any) => r.stops.flatMap((s: any) => s.jobs.map((j: any) => j.id)));
    expect((await knex('jobs').whereIn('id', ids).distinct('state')).map((s: any) => s.state)).toEqual(['booked']);
    const messages = await knex('messages').where({ plan_id: plan.id, channel: 'sms' });
    expect(messages.length).toBeGreaterThan(0);
    expect(new Set(messages.map((m: any) => m.idempotency_key)).size).toBe(messages.length);
    // Sent right after publishing, or held back when the test runs inside the owners' quiet hours.
    expect(messages.filter((m: any) => !['queued', 'sent', 'delivered'].includes(m.state)).map((m: any) => `${m.state}: ${m.error}`)).toEqual([]);
    const mails = await knex('messages').where({ plan_id: plan.id, channel: 'email' });
    expect(mails.length).toBeGreaterThan(0);
    expect(mails.every((m: any) => m.state === 'sent')).toBe(true);
    const stops = await knex('stops as s').join('routes as r', 'r.id', 's.route_id').where('r.plan_id', plan.id).whereNull('s.window_start_at').count({ n: '*' });
    expect(Number(stops[0]!.n)).toBe(0);
    // Publishing again with a stale version changes nothing.
    expect((await call('POST', `/api/plans/${plan.id}/publish`, { cookie, body: { version: plan.version } })).status).toBe(409);
    plan = res.body;
  });

  it('keeps a published plan editable: a move answers the re-timed plan, still published, one version up, and the moved job stays booked', async () => {
    const [a, b] = routed(plan);
    const job = a.stops[a.stops.length - 1].jobs[0];
    const res = await call('PATCH', `/api/plans/${plan.id}`, { cookie, body: { version: plan.version, moves: [{ jobId: job.id, toFarrierId: b.farrierId }] } });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.state).toBe('published');
    expect(res.body.version).toBe(plan.version + 1);
    expect(farrierOf(res.body, job.id)).toBe(b.farrierId);
    expect((await knex('plans').where({ id: plan.id }).first('version')).version).toBe(plan.version + 1);
    expect((await knex('jobs').where({ id: job.id }).first('state')).state).toBe('booked');
  });
});
