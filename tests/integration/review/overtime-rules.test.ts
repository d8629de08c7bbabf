import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { fromZonedTime } from 'date-fns-tz';
import { call, sessionCookie } from '../helpers/api.ts';
import { appDatabase } from '../helpers/db.ts';

/*
 * A practice of this test's own (unique names, removed afterwards) with California-style daily
 * thresholds and one farrier at $20/h, working the week of Monday 26 October – Sunday 1 November 2026:
 * the Sunday holds the New York change from EDT to EST (IANA tz: 2026-11-01T06:00Z), so its
 * 00:00–12:00 local shift is 13 h of real time, not 12.
 */
const NY = 'America/New_York';
const tag = `rt${process.pid}${Date.now().toString(36)}`;
let knex: Knex;
let practiceId: number;
let cookie: string;

const at = (date: string, clock: string) => fromZonedTime(`${date}T${clock}:00`, NY);
const SHIFTS: [string, string, string][] = [
  ['2026-10-26', '07:00', '20:00'], // 13 h
  ['2026-10-27', '07:00', '17:00'], // 10 h
  ['2026-10-28', '07:00', '17:00'],
  ['2026-10-29', '07:00', '17:00'],
  ['2026-10-30', '07:00', '17:00'],
  ['2026-11-01', '00:00', '12:00'], // 13 h elapsed across the change
];

beforeAll(async () => {
  knex = appDatabase();
  [practiceId] = await knex('practices').insert({
    name: `Review rule test ${tag} (fictional)`, time_zone: NY, units: 'miles', mileage_rate: 0.7, week_start: 1,
    overtime_weekly_minutes: 2400, overtime_weekly_multiplier: 1.5,
    overtime_daily_minutes: 480, overtime_daily_multiplier: 1.5, overtime_daily_double_minutes: 720, overtime_daily_double_multiplier: 2,
  });
  const [farrierId] = await knex('farriers').insert({
    practice_id: practiceId, name: `Test Farrier ${tag}`, home_address: '1 Test Lane', home_lat: 38.2, home_lon: -84.6, cost_per_hour_cents: 2000, break_minutes: 30,
  });
  const hash = (await knex('users').where({ email: 'lead@demo.test' }).first('password_hash')).password_hash;
  await knex('users').insert({ practice_id: practiceId, email: `lead-${tag}@review.test`, name: 'Test Lead', password_hash: hash, role: 'lead' });
  for (const [i, [date, start, end]] of SHIFTS.entries()) {
    const [planId] = await knex('plans').insert({ practice_id: practiceId, plan_date: date, state: 'published', version: 1 });
    await knex('routes').insert({
      practice_id: practiceId, plan_id: planId, farrier_id: farrierId, start_at: at(date, start), end_at: at(date, end), drive_seconds: 3600,
      // 1,234 mi on the Monday (1,234 × 1,609.344 m = 1,985,930.5 m), nothing else.
      distance_m: i === 0 ? 1_985_931 : 0, break_start_at: null,
    });
    await knex('day_logs').insert({ practice_id: practiceId, farrier_id: farrierId, work_date: date, started_at: at(date, start), ended_at: at(date, end), distance_m: i === 0 ? 1_985_931 : 0 });
  }
  cookie = await sessionCookie(`lead-${tag}@review.test`);
});

afterAll(async () => {
  if (practiceId) {
    await knex('day_logs').where({ practice_id: practiceId }).delete();
    await knex('routes').where({ practice_id: practiceId }).delete();
    await knex('plans').where({ practice_id: practiceId }).delete();
    const users = await knex('users').where({ practice_id: practiceId }).pluck('id');
    if (users.length) await knex('user_sessions').whereIn('user_id', users).delete();
    await knex('users').where({ practice_id: practiceId }).delete();
    await knex('farriers').where({ practice_id: practiceId }).delete();
    await knex('practices').where({ id: practiceId }).delete();
  }
  await knex.destroy();
});

describe('the review under daily and weekly overtime through the API', () => {
  it('pays a 13-hour Monday at $20 as $320 of which $160 is overtime (California Labor Code §510)', async () => {
    // 8 × 20 = 160 regular; 4 × 30 + 1 × 40 = 160 overtime.
    const res = await call('GET', '/api/review?from=2026-10-26&to=2026-10-26', { cookie });
    expect(res.status).toBe(200);
    const f = res.body.farriers[0];
    expect(f.actualMinutes).toBe(13 * 60);
    expect(f.overtimeMinutes).toBe(5 * 60);
    expect(f.overtimeCost).toBe(160);
    // 1,234 mi at the IRS 2025 rate of 70¢ (Notice 2025-5) = $863.80.
    expect(f.actualDistance).toBe(1234);
    expect(f.mileageCost).toBe(863.8);
  });

  it('counts the week in real elapsed hours across the autumn change and applies daily, double and weekly overtime', async () => {
    // Worked: 13 + 4 × 10 + 13 (Sunday 00:00–12:00 local = 13 h elapsed) = 66 h.
    // Daily 1.5×: Mon 4 + Tue–Fri 4 × 2 + Sun 4 = 16 h. Double 2×: Mon 1 + Sun 1 = 2 h.
    // Regular hours Mon–Fri = 5 × 8 = 40, so Sunday's 8 regular hours are weekly overtime at 1.5×.
    // Overtime = 16 + 2 + 8 = 26 h; cost = 16 × 30 + 2 × 40 + 8 × 30 = 480 + 80 + 240 = $800.
    // Counted on the wall clock, Sunday would be 12 h with no double time: $760.
    const res = await call('GET', '/api/review?from=2026-10-26&to=2026-11-01', { cookie });
    expect(res.status).toBe(200);
    const f = res.body.farriers[0];
    expect(f.actualMinutes).toBe(66 * 60);
    expect(f.plannedMinutes).toBe(66 * 60);
    expect(f.overtimeMinutes).toBe(26 * 60);
    expect(f.overtimeCost).toBe(800);
    expect(f.plannedOvertimeCost).toBe(800);
    expect(res.body.weeks).toEqual([{ from: '2026-10-26', to: '2026-11-01', farriers: [expect.objectContaining({ actualMinutes: 66 * 60, overtimeMinutes: 26 * 60 })] }]);
    const sunday = res.body.days.find((d: { date: string }) => d.date === '2026-11-01');
    expect(sunday.farriers[0].actualMinutes).toBe(13 * 60);
  });

  it('counts the whole week for weekly overtime when only its Sunday is asked for', async () => {
    // Sunday alone: 8 h weekly (the week already holds 40 regular hours) + 4 h daily + 1 h double = 13 h.
    const res = await call('GET', '/api/review?from=2026-11-01&to=2026-11-01', { cookie });
    expect(res.body.farriers[0].overtimeMinutes).toBe(13 * 60);
    // 8 × 30 + 4 × 30 + 1 × 40 = 240 + 120 + 40 = $400.
    expect(res.body.farriers[0].overtimeCost).toBe(400);
  });
});
