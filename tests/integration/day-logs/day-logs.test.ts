import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { appDatabase } from '../helpers/db.ts';
import { APP_URL, call, sessionCookie } from '../helpers/api.ts';
import { publishedDay, type OwnerSpec, type PublishedDay } from '../day-sheet/fixture.ts';

/*
 * Start the day / Back home through the running app, on published days of our own in the week of
 * Monday 2 August 2027 (the demo practice's weeks start on Monday; nobody else uses these dates).
 * The fixture's routes: start 25 min before the first arrival, 90 min per stop, 14,000 m per stop,
 * no break. Distances in the demo's miles: 1 mi = 1,609.344 m exactly (international yard and pound
 * agreement, 1959).
 */
const WEEK = { from: '2027-08-02', to: '2027-08-08' };
const DAY_A = '2027-08-03'; // farrier3: marks with odometer readings
const DAY_B = '2027-08-04'; // farrier5: first stop before Start the day; corrected by the office
const DAY_C = '2027-08-05'; // farrier6: no readings → planned distance
let knex: Knex;
let a: PublishedDay;
let b: PublishedDay;
let c: PublishedDay;
const cookies: Record<string, string> = {};

const owners = (tag: string): OwnerSpec[] => [
  { name: `Aldous ${tag}wick`, phone: '+12705550131', consent: false, horses: [{ name: `${tag} Clover`, work: ['Trim'] }] },
  { name: `Briony ${tag}holt`, phone: '+12705550132', consent: false, horses: [{ name: `${tag} Sorrel`, work: ['Trim'] }] },
  { name: `Caspar ${tag}ridge`, phone: '+12705550133', consent: false, horses: [{ name: `${tag} Yarrow`, work: ['Trim'] }] },
];

const dayMark = (body: Record<string, unknown>, cookie: string) => call('POST', '/api/day-logs', { cookie, body });
const logOf = (d: PublishedDay, date: string) => knex('day_logs').where({ farrier_id: d.farrierId, work_date: date }).first();
const page = async (path: string, cookie: string) => (await fetch(`${APP_URL}${path}`, { headers: { cookie } })).text();

beforeAll(async () => {
  knex = appDatabase();
  // First arrival 12:40Z (08:40 EDT): route 12:15Z–17:35Z (12:40 + 3 × 90 min + 25 min), 3 × 14,000 = 42,000 m.
  a = await publishedDay(knex, { date: DAY_A, farrierEmail: 'farrier3@demo.test', tag: 'Odoa', firstArrivalUtc: `${DAY_A}T12:40:00Z`, owners: owners('Odoa') });
  b = await publishedDay(knex, { date: DAY_B, farrierEmail: 'farrier5@demo.test', tag: 'Odob', firstArrivalUtc: `${DAY_B}T12:40:00Z`, owners: owners('Odob') });
  c = await publishedDay(knex, { date: DAY_C, farrierEmail: 'farrier6@demo.test', tag: 'Odoc', firstArrivalUtc: `${DAY_C}T12:40:00Z`, owners: owners('Odoc') });
  for (const email of ['farrier3', 'farrier5', 'farrier6', 'farrier1', 'dispatcher', 'lead']) cookies[email] = await sessionCookie(`${email}@demo.test`);
  cookies.otherDispatcher = await sessionCookie('dispatcher@other.test');
});
afterAll(async () => {
  await knex.destroy();
});

describe('Start the day and Back home with odometer readings', () => {
  const f3 = () => cookies.farrier3!;

  it('refuses Back home before the day has a start with a 409 that says so, and writes nothing', async () => {
    const r = await dayMark({ clientKey: 'odoa-end-early', kind: 'end', date: DAY_A, at: `${DAY_A}T18:00:00.000Z`, odometer: 45_262 }, f3());
    expect(r.status).toBe(409);
    expect(r.body.error.code).toBe('conflict');
    expect(r.body.error.message).toMatch(/before the day was started/);
    expect(await logOf(a, DAY_A)).toBeUndefined();
  });

  it('validates the body with clear field errors', async () => {
    const bad = await dayMark({ clientKey: 'odoa-bad-1', kind: 'middle', date: '2027-8-3', at: 'soon', odometer: 12.5 }, f3());
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('invalid_request');
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['at', 'date', 'kind', 'odometer']);
    expect((await dayMark({}, f3())).status).toBe(400);
    // A time far from the planned day (a phone with a wrong clock) is refused on the field.
    const wrongDay = await dayMark({ clientKey: 'odoa-bad-2', kind: 'start', date: DAY_A, at: '2026-01-05T12:00:00.000Z' }, f3());
    expect(wrongDay.status).toBe(400);
    expect(wrongDay.body.error.fields.at).toBeTruthy();
  });

  it('starts the day once: a replay answers 200 replayed, a second start is a 409 and changes nothing', async () => {
    const start = { clientKey: 'odoa-start-1', kind: 'start', date: DAY_A, at: `${DAY_A}T12:10:00.000Z`, odometer: 45_210 };
    const first = await dayMark(start, f3());
    expect(first.status).toBe(201);
    expect(first.body.dayLog).toMatchObject({ farrierId: a.farrierId, date: DAY_A, startedAt: `${DAY_A}T12:10:00.000Z`, startOdometer: 45_210, startSource: 'marked', endedAt: null });
    const replay = await dayMark(start, f3());
    expect(replay.status).toBe(200);
    expect(replay.body.replayed).toBe(true);
    const second = await dayMark({ ...start, clientKey: 'odoa-start-2', at: `${DAY_A}T12:20:00.000Z`, odometer: 45_999 }, f3());
    expect(second.status).toBe(409);
    expect(second.body.error.message).toMatch(/already started at 8:10am/);
    const rows = await knex('day_logs').where({ farrier_id: a.farrierId, work_date: DAY_A });
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ start_odometer: 45_210, start_source: 'marked' });
    expect(new Date(rows[0].started_at).toISOString()).toBe(`${DAY_A}T12:10:00.000Z`);
  });

  it('a stop mark after Start the day leaves the marked start alone', async () => {
    expect((await call('POST', '/api/visits', { cookie: f3(), body: { clientKey: 'odoa-stop-1', stopId: a.stopIds[0], state: 'done', at: `${DAY_A}T13:45:00.000Z` } })).status).toBe(201);
    const log = await logOf(a, DAY_A);
    expect(log.start_source).toBe('marked');
    expect(new Date(log.started_at).toISOString()).toBe(`${DAY_A}T12:10:00.000Z`);
  });

  it('keeps the day to its own farrier and practice', async () => {
    const body = { clientKey: 'odoa-other-1', kind: 'end', date: DAY_A, at: `${DAY_A}T18:00:00.000Z`, farrierId: a.farrierId };
    expect((await dayMark(body, cookies.farrier1!)).status).toBe(404);
    expect((await dayMark({ ...body, clientKey: 'odoa-other-2' }, cookies.otherDispatcher!)).status).toBe(404);
    // A dispatcher must say whose day it is.
    const noFarrier = await dayMark({ clientKey: 'odoa-other-3', kind: 'end', date: DAY_A, at: `${DAY_A}T18:00:00.000Z` }, cookies.dispatcher!);
    expect(noFarrier.status).toBe(400);
    expect(noFarrier.body.error.fields.farrierId).toBeTruthy();
    const mine = await call('GET', `/api/day-logs?date=${DAY_A}`, { cookie: cookies.farrier1! });
    expect(mine.body.dayLogs).toEqual([]);
    expect((await call('GET', `/api/day-logs?date=${DAY_A}`, { cookie: f3() })).body.dayLogs).toHaveLength(1);
    expect((await logOf(a, DAY_A)).ended_at).toBeNull();
  });

  it('refuses an end before the start (409) and an odometer going backwards (400 on the field)', async () => {
    const before = await dayMark({ clientKey: 'odoa-end-1', kind: 'end', date: DAY_A, at: `${DAY_A}T12:00:00.000Z`, odometer: 45_262 }, f3());
    expect(before.status).toBe(409);
    expect(before.body.error.message).toMatch(/before the day's start/);
    const backwards = await dayMark({ clientKey: 'odoa-end-2', kind: 'end', date: DAY_A, at: `${DAY_A}T18:40:00.000Z`, odometer: 45_200 }, f3());
    expect(backwards.status).toBe(400);
    expect(backwards.body.error.fields.odometer).toMatch(/below/);
  });

  it('Back home with a reading stores both readings and the odometer distance; replays and a second end change nothing', async () => {
    const end = { clientKey: 'odoa-end-3', kind: 'end', date: DAY_A, at: `${DAY_A}T18:40:00.000Z`, odometer: 45_262 };
    const r = await dayMark(end, f3());
    expect(r.status).toBe(201);
    // 45,262 − 45,210 = 52 mi × 1,609.344 = 83,685.888 m → 83,686 m.
    expect(r.body.dayLog).toMatchObject({ endedAt: `${DAY_A}T18:40:00.000Z`, startOdometer: 45_210, endOdometer: 45_262, distanceM: 83_686, distanceSource: 'odometer' });
    expect((await dayMark(end, f3())).body.replayed).toBe(true);
    const again = await dayMark({ ...end, clientKey: 'odoa-end-4', at: `${DAY_A}T19:10:00.000Z`, odometer: 45_300 }, f3());
    expect(again.status).toBe(409);
    const log = await logOf(a, DAY_A);
    expect(log).toMatchObject({ distance_m: 83_686, distance_source: 'odometer', end_odometer: 45_262 });
    const audits = await knex('audit_log').where({ entity: 'day_log', entity_id: log.id }).pluck('action');
    expect(audits.sort()).toEqual(['day_log.ended', 'day_log.started']);
  });
});

describe('a stop marked before Start the day', () => {
  it('starts the day at the planned departure and the sheet says so', async () => {
    const f5 = cookies.farrier5!;
    expect((await page(`/day/${DAY_B}`, f5))).toContain('Start the day');
    expect((await call('POST', '/api/visits', { cookie: f5, body: { clientKey: 'odob-stop-1', stopId: b.stopIds[0], state: 'arrived', at: `${DAY_B}T12:50:00.000Z` } })).status).toBe(201);
    const log = await logOf(b, DAY_B);
    // Planned departure = first arrival 12:40Z − 25 min = 12:15Z.
    expect(new Date(log.started_at).toISOString()).toBe(`${DAY_B}T12:15:00.000Z`);
    expect(log.start_source).toBe('first_stop');
    const html = await page(`/day/${DAY_B}`, f5);
    // React puts <!-- --> between neighbouring text parts in server-rendered HTML.
    expect(html).toMatch(/the planned departure: stop (<!-- -->)?1(<!-- -->)? was marked before Start the day/);
    // A later Start the day changes nothing.
    const late = await dayMark({ clientKey: 'odob-start-1', kind: 'start', date: DAY_B, at: `${DAY_B}T12:55:00.000Z`, odometer: 30_100 }, f5);
    expect(late.status).toBe(409);
    expect(late.body.error.message).toMatch(/planned departure/);
    // Back home without a reading: the planned route's 3 × 14,000 = 42,000 m, marked as planned.
    const end = await dayMark({ clientKey: 'odob-end-1', kind: 'end', date: DAY_B, at: `${DAY_B}T17:30:00.000Z` }, f5);
    expect(end.status).toBe(201);
    expect(end.body.dayLog).toMatchObject({ distanceM: 42_000, distanceSource: 'planned', startOdometer: null, endOdometer: null });
  });
});

describe('corrections by the office', () => {
  it('a dispatcher corrects a day with a reason; the distance follows the readings and the audit keeps before and after', async () => {
    const log = await logOf(b, DAY_B);
    const path = `/api/day-logs/${log.id}`;
    expect((await call('PATCH', path, { cookie: cookies.farrier5!, body: { reason: 'Mine', startOdometer: 1 } })).status).toBe(403);
    const noReason = await call('PATCH', path, { cookie: cookies.dispatcher!, body: { startOdometer: 30_100 } });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fields.reason).toBeTruthy();
    expect((await call('PATCH', path, { cookie: cookies.otherDispatcher!, body: { reason: 'Not mine', startOdometer: 1 } })).status).toBe(404);
    const reversed = await call('PATCH', path, { cookie: cookies.dispatcher!, body: { reason: 'Typo', endedAt: `${DAY_B}T11:00:00.000Z` } });
    expect(reversed.status).toBe(400);
    expect(reversed.body.error.fields.endedAt).toBeTruthy();
    const fixed = await call('PATCH', path, { cookie: cookies.dispatcher!, body: { reason: 'Readings from the paper mileage log', startOdometer: 30_100, endOdometer: 30_127, startedAt: `${DAY_B}T12:05:00.000Z` } });
    expect(fixed.status).toBe(200);
    // 27 mi × 1,609.344 = 43,452.288 m → 43,452 m.
    expect(fixed.body.dayLog).toMatchObject({ startedAt: `${DAY_B}T12:05:00.000Z`, startOdometer: 30_100, endOdometer: 30_127, distanceM: 43_452, distanceSource: 'odometer' });
    const row = await knex('audit_log').where({ entity: 'day_log', entity_id: log.id, action: 'day_log.corrected' }).first();
    const detail = typeof row.detail === 'string' ? JSON.parse(row.detail) : row.detail;
    expect(detail.reason).toBe('Readings from the paper mileage log');
    expect(detail.before).toMatchObject({ distanceM: 42_000, distanceSource: 'planned' });
    expect(detail.after).toMatchObject({ distanceM: 43_452, distanceSource: 'odometer' });
  });
});

describe('the review of that week', () => {
  it('shows actual hours from the marks, odometer distance as measured and a day without readings as planned distance', async () => {
    // farrier6: start and end without readings → the planned 42,000 m.
    const f6 = cookies.farrier6!;
    expect((await dayMark({ clientKey: 'odoc-start-1', kind: 'start', date: DAY_C, at: `${DAY_C}T12:00:00.000Z` }, f6)).status).toBe(201);
    expect((await dayMark({ clientKey: 'odoc-end-1', kind: 'end', date: DAY_C, at: `${DAY_C}T17:45:00.000Z` }, f6)).status).toBe(201);

    const res = await call('GET', `/api/review?from=${WEEK.from}&to=${WEEK.to}`, { cookie: cookies.lead! });
    expect(res.status).toBe(200);
    const row = (id: number) => res.body.farriers.find((f: { farrierId: number }) => f.farrierId === id);
    // farrier3: 12:10Z → 18:40Z = 6 h 30 min = 390 min (the route has no break); 83,686 m / 1,609.344 = 52.0000 mi.
    expect(row(a.farrierId)).toMatchObject({ actualMinutes: 390, actualDistance: 52, plannedDistanceDays: 0, daysWorked: 1 });
    // farrier5 corrected: 12:05Z → 17:30Z = 325 min; 27 mi by odometer.
    expect(row(b.farrierId)).toMatchObject({ actualMinutes: 325, actualDistance: 27, plannedDistanceDays: 0 });
    // farrier6: 12:00Z → 17:45Z = 345 min; 42,000 / 1,609.344 = 26.097 → 26.1 mi, one day at planned distance.
    expect(row(c.farrierId)).toMatchObject({ actualMinutes: 345, actualDistance: 26.1, plannedDistanceDays: 1 });
    const day = (date: string, id: number) => res.body.days.find((d: { date: string }) => d.date === date).farriers.find((f: { farrierId: number }) => f.farrierId === id);
    expect(day(DAY_A, a.farrierId).actualDistanceSource).toBe('odometer');
    expect(day(DAY_C, c.farrierId).actualDistanceSource).toBe('planned');

    const csv = await call('GET', `/api/review/csv?from=${WEEK.from}&to=${WEEK.to}`, { cookie: cookies.lead! });
    const lines = (csv.body as string).trimEnd().split('\r\n').map((l) => l.split(','));
    const col = lines[0]!.indexOf('Days at planned distance');
    expect(col).toBeGreaterThan(0);
    const name = row(c.farrierId).name as string;
    expect(lines.find((l) => l[0] === name)![col]).toBe('1');
  });
});
