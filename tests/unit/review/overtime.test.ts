import { describe, expect, it } from 'vitest';
import { fromZonedTime } from 'date-fns-tz';
import { splitOvertime, payCents, overtimeSecOf, type OvertimeRule } from '../../../src/lib/review/overtime.ts';
import { workingSec } from '../../../src/lib/review/compute.ts';
import { addDays } from '../../../src/lib/review/time.ts';

const H = 3600;
/** FLSA default: 40 h a week at 1.5, no daily overtime; weeks start on Monday. */
const FLSA: OvertimeRule = { weeklyMinutes: 2400, weeklyMultiplier: 1.5, dailyMinutes: null, dailyMultiplier: null, dailyDoubleMinutes: null, dailyDoubleMultiplier: null, weekStart: 1 };
/** California: daily 1.5 over 8 h, 2 over 12 h, and weekly 1.5 over 40 h. */
const CALIFORNIA: OvertimeRule = { ...FLSA, dailyMinutes: 480, dailyMultiplier: 1.5, dailyDoubleMinutes: 720, dailyDoubleMultiplier: 2 };

/** Days of a week starting Monday 2026-01-05, each with the given hours. */
function week(hours: number[], monday = '2026-01-05') {
  return hours.map((h, i) => ({ date: addDays(monday, i), workedSec: Math.round(h * H) }));
}

describe('weekly overtime (US FLSA, 29 CFR 778.104)', () => {
  it('pays 46 h at $12 as $588: the official example of 29 CFR 778.110(a)', () => {
    // 40 h × $12 = $480 regular + 6 h × $18 = $108 overtime = $588.
    const split = splitOvertime(week([9, 9, 9, 9, 10]), FLSA);
    const pay = payCents(split, FLSA, 1200);
    expect(pay).toEqual({ regularCents: 48_000, overtimeCents: 10_800, totalCents: 58_800 });
    expect(split.reduce((s, d) => s + overtimeSecOf(d), 0)).toBe(6 * H);
  });

  it('pays 46 h at $20 as $980 (reference value computed from the rule: 40 × 20 + 6 × 30)', () => {
    expect(payCents(splitOvertime(week([8, 8, 8, 8, 8, 6]), FLSA), FLSA, 2000).totalCents).toBe(98_000);
  });

  it('lets each workweek stand alone: 38 h and 44 h weeks at $18 are $684 and $828, not averaged (29 CFR 778.104)', () => {
    // Week 1: 38 × 18 = 684. Week 2: 40 × 18 + 4 × 27 = 720 + 108 = 828. Averaged (41 h) would differ.
    const days = [...week([8, 8, 8, 8, 6]), ...week([9, 9, 9, 9, 8], '2026-01-12')];
    const split = splitOvertime(days, FLSA);
    const first = split.filter((d) => d.date < '2026-01-12');
    const second = split.filter((d) => d.date >= '2026-01-12');
    expect(payCents(first, FLSA, 1800).totalCents).toBe(68_400);
    expect(payCents(second, FLSA, 1800).totalCents).toBe(82_800);
    expect(first.every((d) => d.weeklySec === 0)).toBe(true);
  });

  it('puts weekly overtime on the day the week crosses the threshold and the days after it', () => {
    // 10 + 10 + 10 + 8 = 38 h by Thursday; Friday 6 h → 2 h regular, 4 h overtime; Saturday 3 h all overtime.
    const split = splitOvertime(week([10, 10, 10, 8, 6, 3]), FLSA);
    expect(split.map((d) => d.weeklySec / H)).toEqual([0, 0, 0, 0, 4, 3]);
    expect(split[4]!.regularSec).toBe(2 * H);
  });

  it('follows the practice week start: with Sunday weeks, Sunday opens a new week', () => {
    // Mon 5 Jan – Sat 10 Jan: 6 × 8 = 48 h → 8 h overtime; Sunday 11 Jan 8 h starts the next Sunday-week.
    const sunday = { ...FLSA, weekStart: 0 };
    const split = splitOvertime(week([8, 8, 8, 8, 8, 8, 8]), sunday);
    expect(split.map((d) => d.weeklySec / H)).toEqual([0, 0, 0, 0, 0, 8, 0]);
    // Under Monday weeks the same seven days are one week: 56 h → 16 h overtime.
    expect(splitOvertime(week([8, 8, 8, 8, 8, 8, 8]), FLSA).reduce((s, d) => s + d.weeklySec, 0)).toBe(16 * H);
  });
});

describe('daily overtime (California Labor Code §510)', () => {
  it('pays a 13-hour day at $20 as $320: 8 × 20 + 4 × 30 + 1 × 40', () => {
    const split = splitOvertime(week([13]), CALIFORNIA);
    expect(split[0]).toMatchObject({ regularSec: 8 * H, dailySec: 4 * H, doubleSec: 1 * H, weeklySec: 0 });
    expect(payCents(split, CALIFORNIA, 2000).totalCents).toBe(32_000);
  });

  it('pays five 10-hour days at $20 as $1,100: daily overtime hours are not counted again toward 40 h', () => {
    // Each day 8 × 20 + 2 × 30 = 220; five days = 1,100. The 40 regular hours never pass the weekly 40.
    const split = splitOvertime(week([10, 10, 10, 10, 10]), CALIFORNIA);
    expect(payCents(split, CALIFORNIA, 2000).totalCents).toBe(110_000);
    expect(split.every((d) => d.weeklySec === 0)).toBe(true);
  });

  it('adds weekly overtime on a sixth 8-hour day once the regular hours pass 40 (no pyramiding)', () => {
    // Five 9 h days: 40 regular + 5 daily. Saturday 8 h: all weekly overtime. Pay at $20:
    // 40 × 20 + 5 × 30 + 8 × 30 = 800 + 150 + 240 = 1,190.
    const split = splitOvertime(week([9, 9, 9, 9, 9, 8]), CALIFORNIA);
    expect(split[5]!.weeklySec).toBe(8 * H);
    expect(payCents(split, CALIFORNIA, 2000).totalCents).toBe(119_000);
  });

  it('with daily thresholds off the same 13-hour day has no overtime (weekly rule only)', () => {
    expect(overtimeSecOf(splitOvertime(week([13]), FLSA)[0]!)).toBe(0);
  });
});

describe('real elapsed hours across daylight-saving changes (IANA tz rules, America/New_York 2026)', () => {
  const NY = 'America/New_York';
  it('counts local midnight to midnight on 8 March 2026 as 23 h and on 1 November 2026 as 25 h', () => {
    expect(workingSec(fromZonedTime('2026-03-08T00:00:00', NY), fromZonedTime('2026-03-09T00:00:00', NY), 0)).toBe(23 * H);
    expect(workingSec(fromZonedTime('2026-11-01T00:00:00', NY), fromZonedTime('2026-11-02T00:00:00', NY), 0)).toBe(25 * H);
  });

  it('counts a week with the spring change in elapsed hours: the overtime is 1 h less than the wall clock says', () => {
    // Mon 2 – Fri 6 Mar: 8 h each (40 h). Sun 8 Mar 00:00–12:00 local: 12 h on the wall clock but
    // 11 h elapsed (02:00 EST → 03:00 EDT). Weekly overtime 11 h, not 12 h.
    const days = [0, 1, 2, 3, 4].map((i) => {
      const date = addDays('2026-03-02', i);
      return { date, workedSec: workingSec(fromZonedTime(`${date}T07:00:00`, NY), fromZonedTime(`${date}T15:00:00`, NY), 0) };
    });
    days.push({ date: '2026-03-08', workedSec: workingSec(fromZonedTime('2026-03-08T00:00:00', NY), fromZonedTime('2026-03-08T12:00:00', NY), 0) });
    const split = splitOvertime(days, FLSA);
    expect(split.reduce((s, d) => s + d.weeklySec, 0)).toBe(11 * H);
  });

  it('counts the autumn change in elapsed hours: 00:00–12:00 local on 1 November 2026 is 13 h, less a 30-min break', () => {
    expect(workingSec(fromZonedTime('2026-11-01T00:00:00', NY), fromZonedTime('2026-11-01T12:00:00', NY), 1800)).toBe(12.5 * H);
  });
});
