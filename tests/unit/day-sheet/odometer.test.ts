import { describe, expect, it } from 'vitest';
import { odometerDistanceM, odometerProblem, MAX_DAY_ODOMETER_UNITS } from '../../../src/lib/day-sheet/odometer.ts';

describe('odometer readings to metres', () => {
  it('one mile of odometer is exactly 1,609.344 m (international yard and pound agreement, 1959: 1 yd = 0.9144 m, 1 mi = 1,760 yd)', () => {
    // 1,760 × 0.9144 = 1,609.344 m.
    expect(odometerDistanceM(100, 101, 'miles')).toBe(1609);
    // 52 mi: 52 × 1,609.344 = 83,685.888 m → 83,686 m.
    expect(odometerDistanceM(45_210, 45_262, 'miles')).toBe(83_686);
    // 1,000 mi = 1,609,344 m exactly, no rounding needed.
    expect(odometerDistanceM(0, 1000, 'miles')).toBe(1_609_344);
  });

  it('one kilometre of odometer is 1,000 m (SI)', () => {
    expect(odometerDistanceM(73_400, 73_487, 'km')).toBe(87_000);
  });

  it('gives no distance when either reading is missing, so the caller falls back to the planned distance', () => {
    expect(odometerDistanceM(null, 45_262, 'miles')).toBeNull();
    expect(odometerDistanceM(45_210, undefined, 'miles')).toBeNull();
  });

  it('refuses an end reading below the start and a jump larger than a day of driving', () => {
    expect(odometerProblem(45_210, 45_209)).toBe('backwards');
    expect(odometerProblem(45_210, 45_210)).toBeNull();
    expect(odometerProblem(45_210, 45_210 + MAX_DAY_ODOMETER_UNITS)).toBeNull();
    // An extra digit typed: 45,262 → 452,620 is 407,410 more, far beyond a day.
    expect(odometerProblem(45_210, 452_620)).toBe('too_far');
    expect(odometerProblem(null, 452_620)).toBeNull();
  });
});
