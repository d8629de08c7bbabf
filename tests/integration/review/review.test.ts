import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { call, sessionCookie } from '../helpers/api.ts';
import { appDatabase } from '../helpers/db.ts';

/*
 * The review of seeded weeks against an independent calculation from the raw rows, written here with
 * plain code and SQL (not the review library): working time = end − start in UTC seconds less the
 * farrier's break when the published route has one (the actual day is charged the route's break);
 * weekly overtime over the practice threshold; distance in tenths of a mile per day (1 mi =
 * 1,609.344 m, international mile); mileage cost = tenths × rate, to the cent.
 */

const MI = 1609.344;
let knex: Knex;
let lead: string;
let weeks: { from: string; to: string }[];

function addDays(iso: string, n: number): string {
  const d = new Date(`${iso}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + n);
  return d.toISOString().slice(0, 10);
}

function hmm(text: string): number {
  const [h, m] = text.split(':').map(Number);
  return h! * 60 + m!;
}

interface Expected {
  name: string;
  plannedMinutes: number;
  actualMinutes: number;
  overtimeMinutes: number;
  overtimeCost: number;
  driveMinutes: number;
  plannedDistance: number;
  actualDistance: number;
  mileageCost: number;
  horsesPlanned: number;
  horsesDone: number;
  stopsSkipped: number;
  plannedRevenue: number;
  revenue: number;
}

/** Plain-code review of one Monday-to-Sunday week of practice 1, from the raw rows. */
async function expectedWeek(from: string, to: string): Promise<Map<number, Expected>> {
  const practice = await knex('practices').where({ id: 1 }).first();
  const farriers = await knex('farriers').where({ practice_id: 1 }).select('id', 'name', 'cost_per_hour_cents', 'break_minutes');
  const routes = await knex('routes as r').join('plans as p', 'p.id', 'r.plan_id')
    .where({ 'p.practice_id': 1, 'p.state': 'published' }).whereBetween('p.plan_date', [from, to])
    .select('r.id', 'r.farrier_id', 'p.plan_date', 'r.start_at', 'r.end_at', 'r.drive_seconds', 'r.distance_m', 'r.break_start_at');
  const prices = await knex.raw(
    `SELECT s.route_id, COUNT(DISTINCT sj.job_id) AS horses, COALESCE(SUM(wt.price_cents), 0) AS cents
       FROM stops s JOIN stop_jobs sj ON sj.stop_id = s.id
       LEFT JOIN job_work_types jwt ON jwt.job_id = sj.job_id LEFT JOIN work_types wt ON wt.id = jwt.work_type_id
      WHERE s.practice_id = 1 GROUP BY s.route_id`,
  );
  const priceByRoute = new Map<number, { horses: number; cents: number }>(
    prices[0].map((r: { route_id: number; horses: number; cents: string | number }) => [r.route_id, { horses: Number(r.horses), cents: Number(r.cents) }]),
  );
  const days = await knex('day_logs').where({ practice_id: 1 }).whereNotNull('ended_at').whereBetween('work_date', [from, to]);
  const visits = await knex('visit_logs').where({ practice_id: 1 }).whereBetween('visit_date', [from, to]).select('id', 'farrier_id', 'state');
  const horses = visits.length ? await knex('visit_log_horses').whereIn('visit_log_id', visits.map((v) => v.id)).select('visit_log_id', 'revenue_cents') : [];
  const rate = Number(practice.mileage_rate);
  const out = new Map<number, Expected>();
  for (const f of farriers) {
    const mine = routes.filter((r) => r.farrier_id === f.id);
    const breakSec = (date: string) => (mine.find((r) => r.plan_date === date)?.break_start_at ? f.break_minutes * 60 : 0);
    const plannedSec = mine.reduce((s, r) => s + (r.end_at.getTime() - r.start_at.getTime()) / 1000 - (r.break_start_at ? f.break_minutes * 60 : 0), 0);
    const myDays = days.filter((d) => d.farrier_id === f.id);
    const actualSec = myDays.reduce((s, d) => s + (d.ended_at.getTime() - d.started_at.getTime()) / 1000 - breakSec(d.work_date), 0);
    const overtimeSec = Math.max(0, actualSec - practice.overtime_weekly_minutes * 60);
    const plannedTenths = mine.reduce((s, r) => s + Math.round((r.distance_m / MI) * 10), 0);
    const actualTenths = myDays.reduce((s, d) => s + Math.round((d.distance_m / MI) * 10), 0);
    const myVisits = visits.filter((v) => v.farrier_id === f.id);
    const done = new Set(myVisits.filter((v) => v.state === 'done').map((v) => v.id));
    const doneHorses = horses.filter((h) => done.has(h.visit_log_id));
    out.set(f.id, {
      name: f.name,
      plannedMinutes: Math.round(plannedSec / 60),
      actualMinutes: Math.round(actualSec / 60),
      overtimeMinutes: Math.round(overtimeSec / 60),
      overtimeCost: Math.round((overtimeSec / 3600) * f.cost_per_hour_cents * Number(practice.overtime_weekly_multiplier)) / 100,
      driveMinutes: Math.round(mine.reduce((s, r) => s + r.drive_seconds, 0) / 60),
      plannedDistance: plannedTenths / 10,
      actualDistance: actualTenths / 10,
      mileageCost: Math.round(actualTenths * rate * 10) / 100,
      horsesPlanned: mine.reduce((s, r) => s + (priceByRoute.get(r.id)?.horses ?? 0), 0),
      horsesDone: doneHorses.length,
      stopsSkipped: myVisits.filter((v) => v.state === 'skipped').length,
      plannedRevenue: mine.reduce((s, r) => s + (priceByRoute.get(r.id)?.cents ?? 0), 0) / 100,
      revenue: doneHorses.reduce((s, h) => s + h.revenue_cents, 0) / 100,
    });
  }
  return out;
}

beforeAll(async () => {
  knex = appDatabase();
  lead = await sessionCookie('lead@demo.test');
  // The last three whole Monday weeks of the seeded history (the demo practice's weeks start on Monday).
  // Seeded history ends before today; other tests write day logs on days of their own in the future.
  const today = new Intl.DateTimeFormat('en-CA', { timeZone: 'America/New_York', year: 'numeric', month: '2-digit', day: '2-digit' }).format(new Date());
  const last = (await knex('day_logs').where({ practice_id: 1 }).andWhere('work_date', '<', today).max({ d: 'work_date' }).first())!.d as string;
  const monday = addDays(last, -((new Date(`${last}T00:00:00Z`).getUTCDay() + 6) % 7));
  weeks = [1, 2, 3].map((k) => ({ from: addDays(monday, -7 * k), to: addDays(monday, -7 * k + 6) }));
});

afterAll(async () => {
  await knex.destroy();
});

describe('GET /api/review on the seeded history', () => {
  it('is lead only: anonymous 401, dispatcher and farrier 403, for the table and the CSV', async () => {
    const q = `?from=${weeks[0]!.from}&to=${weeks[0]!.to}`;
    for (const path of ['/api/review', '/api/review/csv']) {
      expect((await call('GET', path + q)).status).toBe(401);
      for (const email of ['dispatcher@demo.test', 'farrier1@demo.test']) {
        const res = await call('GET', path + q, { cookie: await sessionCookie(email) });
        expect(res.status).toBe(403);
        expect(res.body.error.code).toBe('forbidden');
      }
    }
  });

  it('refuses a missing, reversed, impossible or too long range with a 400 naming the field', async () => {
    expect((await call('GET', '/api/review', { cookie: lead })).status).toBe(400);
    const reversed = await call('GET', '/api/review?from=2026-03-09&to=2026-03-02', { cookie: lead });
    expect(reversed.status).toBe(400);
    expect(reversed.body.error.fields.to).toBeTruthy();
    expect((await call('GET', '/api/review?from=2026-02-30&to=2026-03-02', { cookie: lead })).status).toBe(400);
    expect((await call('GET', '/api/review?from=2026-01-01&to=2026-06-30', { cookie: lead })).status).toBe(400);
  });

  it('matches an independent calculation from the raw rows for each of the last three seeded weeks', async () => {
    const practice = await knex('practices').where({ id: 1 }).first();
    // The independent calculation below implements the weekly rule only; the demo practice has no daily rule.
    expect(practice.overtime_daily_minutes).toBeNull();
    for (const week of weeks) {
      const expected = await expectedWeek(week.from, week.to);
      const res = await call('GET', `/api/review?from=${week.from}&to=${week.to}`, { cookie: lead });
      expect(res.status).toBe(200);
      expect(res.body.units).toBe('miles');
      const ids = res.body.farriers.map((f: { farrierId: number }) => f.farrierId).sort();
      expect(ids).toEqual([...expected.keys()].sort());
      let actualTotal = 0;
      for (const row of res.body.farriers) {
        const e = expected.get(row.farrierId)!;
        expect({ ...pick(row, Object.keys(e)) }, `${week.from} ${e.name}`).toEqual(e);
        actualTotal += row.actualMinutes;
      }
      expect(res.body.totals.actualMinutes).toBe(actualTotal);
      // The seeded weeks are real weeks of work, not empty ones.
      expect(actualTotal).toBeGreaterThan(60 * 60);
    }
  });

  it('counts a month as the sum of its days, with totals equal to the sum of the farrier rows', async () => {
    const from = weeks[2]!.from;
    const to = weeks[0]!.to; // three whole weeks, 21 days
    const res = await call('GET', `/api/review?from=${from}&to=${to}`, { cookie: lead });
    expect(res.status).toBe(200);
    const perWeek = await Promise.all(weeks.map((w) => expectedWeek(w.from, w.to)));
    for (const row of res.body.farriers) {
      const sum = perWeek.reduce((s, m) => s + m.get(row.farrierId)!.actualMinutes, 0);
      // Minutes are rounded once over the range, so three weekly roundings may differ by at most 1 each.
      expect(Math.abs(row.actualMinutes - sum)).toBeLessThanOrEqual(1);
      const tenths = perWeek.reduce((s, m) => s + Math.round(m.get(row.farrierId)!.actualDistance * 10), 0);
      expect(Math.round(row.actualDistance * 10)).toBe(tenths);
    }
    expect(res.body.weeks).toHaveLength(3);
    expect(res.body.days).toHaveLength(21);
  });

  it('exports a CSV with exactly the figures of the JSON table, row by row and column by column', async () => {
    const week = weeks[0]!;
    const json = await call('GET', `/api/review?from=${week.from}&to=${week.to}`, { cookie: lead });
    const csv = await call('GET', `/api/review/csv?from=${week.from}&to=${week.to}`, { cookie: lead });
    expect(csv.status).toBe(200);
    expect(csv.headers.get('content-type')).toMatch(/text\/csv/);
    expect(csv.headers.get('content-disposition')).toContain(`review-${week.from}-to-${week.to}.csv`);
    const lines = (csv.body as string).trimEnd().split('\r\n').map((l) => l.split(','));
    const header = lines[0]!;
    expect(lines).toHaveLength(json.body.farriers.length + 2);
    const col = (label: string) => header.indexOf(label);
    const rows = [...json.body.farriers, { name: 'Team total', ...json.body.totals }];
    rows.forEach((row, i) => {
      const cells = lines[i + 1]!;
      expect(cells[0]).toBe(row.name);
      expect(hmm(cells[col('Planned hours (h:mm)')]!)).toBe(row.plannedMinutes);
      expect(hmm(cells[col('Actual hours (h:mm)')]!)).toBe(row.actualMinutes);
      expect(hmm(cells[col('Actual overtime (h:mm)')]!)).toBe(row.overtimeMinutes);
      expect(Number(cells[col('Actual distance (mi)')])).toBe(row.actualDistance);
      expect(Number(cells[col('Mileage cost (USD)')])).toBe(row.mileageCost);
      expect(Number(cells[col('Overtime cost (USD)')])).toBe(row.overtimeCost);
      expect(Number(cells[col('Horses done')])).toBe(row.horsesDone);
      expect(Number(cells[col('Revenue (USD)')])).toBe(row.revenue);
    });
  });

  it('shows another practice’s lead only their own farriers', async () => {
    const other = await sessionCookie('lead@other.test');
    const week = weeks[0]!;
    const res = await call('GET', `/api/review?from=${week.from}&to=${week.to}`, { cookie: other });
    expect(res.status).toBe(200);
    const mine = await knex('farriers').where({ practice_id: 2 }).pluck('id');
    for (const row of res.body.farriers) expect(mine).toContain(row.farrierId);
  });

  it('opens the day page of a seeded day with the plan and the actual visits', async () => {
    const week = weeks[0]!;
    const route = await knex('routes as r').join('plans as p', 'p.id', 'r.plan_id').where({ 'p.practice_id': 1 }).whereBetween('p.plan_date', [week.from, week.to]).first('r.farrier_id', 'p.plan_date');
    const res = await call('GET', `/review/day/${route.plan_date}?farrier=${route.farrier_id}`, { cookie: lead });
    expect(res.status).toBe(200);
    const stops = await knex('stops as s').join('routes as r', 'r.id', 's.route_id').join('plans as p', 'p.id', 'r.plan_id').join('barns as b', 'b.id', 's.barn_id')
      .where({ 'p.plan_date': route.plan_date, 'r.farrier_id': route.farrier_id }).pluck('b.name');
    for (const barn of stops) expect(res.body as string).toContain(barn.replace(/&/g, '&amp;'));
  });
});

function pick(row: Record<string, unknown>, keys: string[]) {
  return Object.fromEntries(keys.map((k) => [k, row[k]]));
}
