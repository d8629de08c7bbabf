import { describe, expect, it } from 'vitest';
import { fromZonedTime } from 'date-fns-tz';
import { computeReview, type ReviewInput } from '../../../src/lib/review/compute.ts';
import { reviewCsv, REVIEW_COLUMNS, formatMinutes } from '../../../src/lib/review/table.ts';
import { addDays } from '../../../src/lib/review/time.ts';

const NY = 'America/New_York';
const at = (date: string, clock: string) => fromZonedTime(`${date}T${clock}:00`, NY);

/** Two farriers over Mon 2 – Sun 8 March 2026 (the spring change falls on the Sunday). */
function input(overrides: Partial<ReviewInput> = {}): ReviewInput {
  const planned: ReviewInput['planned'] = [];
  const actual: ReviewInput['actual'] = [];
  const visits: ReviewInput['visits'] = [];
  for (let i = 0; i < 5; i++) {
    const date = addDays('2026-03-02', i);
    // Farrier 1: planned 07:00–16:00 with a break = 8 h 30 min; actual 07:00–17:30 with the break = 10 h.
    planned.push({ farrierId: 1, date, startAt: at(date, '07:00'), endAt: at(date, '16:00'), driveSec: 5400, distanceM: 80_467, hasBreak: true, stops: 4, horses: 6, revenueCents: 60_000 });
    actual.push({ farrierId: 1, date, startedAt: at(date, '07:00'), endedAt: at(date, '17:30'), distanceM: 88_514 });
    visits.push({ farrierId: 1, date, state: 'done', distanceM: 20_000, horsesDone: 5, revenueCents: 50_000 });
    visits.push({ farrierId: 1, date, state: 'skipped', distanceM: 5_000, horsesDone: 0, revenueCents: 0 });
  }
  // Farrier 2 works one planned day only, without a break.
  planned.push({ farrierId: 2, date: '2026-03-04', startAt: at('2026-03-04', '08:00'), endAt: at('2026-03-04', '12:00'), driveSec: 1800, distanceM: 16_093, hasBreak: false, stops: 2, horses: 3, revenueCents: 30_000 });
  actual.push({ farrierId: 2, date: '2026-03-04', startedAt: at('2026-03-04', '08:00'), endedAt: at('2026-03-04', '12:15'), distanceM: null });
  visits.push({ farrierId: 2, date: '2026-03-04', state: 'done', distanceM: 8_047, horsesDone: 3, revenueCents: 30_000 });
  visits.push({ farrierId: 2, date: '2026-03-04', state: 'done', distanceM: 8_047, horsesDone: 0, revenueCents: 0 });
  return {
    from: '2026-03-02', to: '2026-03-08', units: 'miles', mileageRate: 0.7, currency: 'USD',
    rule: { weeklyMinutes: 2400, weeklyMultiplier: 1.5, dailyMinutes: null, dailyMultiplier: null, dailyDoubleMinutes: null, dailyDoubleMultiplier: null, weekStart: 1 },
    farriers: [
      { id: 1, name: 'Ada Test', colour: '#c2410c', costPerHourCents: 4000, breakMinutes: 30, archived: false },
      { id: 2, name: 'Bram Test', colour: '#1d4ed8', costPerHourCents: 3000, breakMinutes: 30, archived: false },
      { id: 3, name: 'Cora Gone', colour: '#15803d', costPerHourCents: 3000, breakMinutes: 30, archived: true },
    ],
    planned, actual, visits, ...overrides,
  };
}

describe('computing the review of a week', () => {
  it('adds up one farrier’s week: 5 × 10 h actual = 50 h, 10 h over 40 at $40 × 1.5 = $600', () => {
    const r = computeReview(input());
    const ada = r.farriers.find((f) => f.farrierId === 1)!;
    expect(ada.plannedMinutes).toBe(5 * 510); // 5 × (9 h − 30 min)
    expect(ada.actualMinutes).toBe(5 * 600); // 5 × (10 h 30 − 30 min)
    expect(ada.plannedOvertimeMinutes).toBe(150); // 42 h 30 − 40 h
    expect(ada.overtimeMinutes).toBe(600);
    expect(ada.overtimeCost).toBe(600); // 10 h × $40 × 1.5
    expect(ada.plannedOvertimeCost).toBe(150); // 2.5 h × $60
    expect(ada.driveMinutes).toBe(450); // 5 × 90 min
    // 80,467 m = 50.0 mi; 88,514 m = 55.0 mi (÷ 1,609.344).
    expect(ada.plannedDistance).toBe(250);
    expect(ada.actualDistance).toBe(275);
    expect(ada.mileageCost).toBe(192.5); // 275 × 0.70
    expect(ada.stopsSkipped).toBe(5);
    expect(ada.horsesDone).toBe(25);
    expect(ada.revenue).toBe(2500);
    expect(ada.plannedRevenue).toBe(3000);
  });

  it('falls back to the sum of visit distances when the day log has none: 2 × 8,047 m = 10.0 mi', () => {
    const bram = computeReview(input()).farriers.find((f) => f.farrierId === 2)!;
    expect(bram.actualDistance).toBe(10);
    expect(bram.actualMinutes).toBe(255); // no planned break: 4 h 15 min
  });

  it('leaves out an archived farrier without figures and makes totals the sum of the rows', () => {
    const r = computeReview(input());
    expect(r.farriers.map((f) => f.name)).toEqual(['Ada Test', 'Bram Test']);
    for (const c of REVIEW_COLUMNS) {
      const sum = r.farriers.reduce((s, f) => s + f[c.key], 0);
      expect(r.totals[c.key]).toBeCloseTo(sum, 6);
    }
  });

  it('counts weekly overtime over the whole week even when the range is one day of it', () => {
    // Friday 6 March alone: Mon–Thu already hold 40 h, so Friday's 10 h are all overtime.
    const r = computeReview(input({ from: '2026-03-06', to: '2026-03-06' }));
    expect(r.farriers.find((f) => f.farrierId === 1)!.overtimeMinutes).toBe(600);
    expect(r.weeks).toHaveLength(1);
    expect(r.days.map((d) => d.date)).toEqual(['2026-03-06']);
  });

  it('writes the CSV with the same figures as the rows: a header, one line per farrier and a total', () => {
    const r = computeReview(input());
    const lines = reviewCsv(r).trimEnd().split('\r\n');
    expect(lines).toHaveLength(4);
    expect(lines[0]).toContain('Actual hours (h:mm)');
    expect(lines[0]).toContain('Mileage cost (USD)');
    const ada = lines[1]!.split(',');
    expect(ada[0]).toBe('Ada Test');
    expect(ada[1 + REVIEW_COLUMNS.findIndex((c) => c.key === 'actualMinutes')]).toBe('50:00');
    expect(ada[1 + REVIEW_COLUMNS.findIndex((c) => c.key === 'mileageCost')]).toBe('192.50');
    expect(lines[3]!.startsWith('Team total,')).toBe(true);
  });

  it('formats minutes as h:mm: 2,485 min → 41:25, 5 → 0:05', () => {
    expect(formatMinutes(2485)).toBe('41:25');
    expect(formatMinutes(5)).toBe('0:05');
  });
});
