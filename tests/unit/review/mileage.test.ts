import { describe, expect, it } from 'vitest';
import { distanceTenths, mileageCostCents, METRES_PER_MILE } from '../../../src/lib/review/mileage.ts';

describe('mileage cost', () => {
  it('charges 1,234 miles at the IRS 2025 standard rate of 70 cents as $863.80 (IRS Notice 2025-5)', () => {
    // 1,234 × 0.70 = 863.80
    expect(mileageCostCents(12_340, 0.7)).toBe(86_380);
  });

  it('charges 1,234 miles at the 2026 rate of 72.5 cents as $894.65 (IRS Notice 2026-10)', () => {
    // 1,234 × 0.725 = 894.65
    expect(mileageCostCents(12_340, 0.725)).toBe(89_465);
  });

  it('converts metres to tenths of a mile with the international mile of exactly 1,609.344 m', () => {
    // 1,234 mi × 1,609.344 m = 1,985,930.5 m → 12,340 tenths.
    expect(distanceTenths(Math.round(1234 * METRES_PER_MILE), 'miles')).toBe(12_340);
    // 160,934 m = 99.9998 mi → 1,000.0 tenths after rounding to a tenth.
    expect(distanceTenths(160_934, 'miles')).toBe(1000);
  });

  it('uses kilometres when the practice counts in km: 12,345 m at 0.45 per km → 12.3 km, 5.54', () => {
    // 12.3 × 0.45 = 5.535 → rounds half up to 5.54 (integer arithmetic: 123 × 4500 / 1000 = 553.5 → 554).
    expect(distanceTenths(12_345, 'km')).toBe(123);
    expect(mileageCostCents(123, 0.45)).toBe(554);
  });

  it('treats the rate as a setting: a zero rate costs nothing', () => {
    expect(mileageCostCents(12_340, 0)).toBe(0);
  });
});
