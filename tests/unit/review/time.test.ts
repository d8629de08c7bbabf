import { describe, expect, it } from 'vitest';
import { weekOf, monthOf, dayBoundsUtc, isIsoDate, todayIn } from '../../../src/lib/review/time.ts';

describe('calendar helpers of the review', () => {
  it('finds the Monday week of Wednesday 4 March 2026 (week start 1) and the Sunday week (week start 0)', () => {
    expect(weekOf('2026-03-04', 1)).toEqual({ from: '2026-03-02', to: '2026-03-08' });
    expect(weekOf('2026-03-04', 0)).toEqual({ from: '2026-03-01', to: '2026-03-07' });
    // A Sunday under Monday weeks belongs to the week before; under Sunday weeks it opens one.
    expect(weekOf('2026-03-08', 1).from).toBe('2026-03-02');
    expect(weekOf('2026-03-08', 0).from).toBe('2026-03-08');
  });

  it('gives a month its first and last day, February 2028 having 29 (a leap year)', () => {
    expect(monthOf('2028-02-10')).toEqual({ from: '2028-02-01', to: '2028-02-29' });
    expect(monthOf('2026-12-31')).toEqual({ from: '2026-12-01', to: '2026-12-31' });
  });

  it('places the New York days of 8 March and 1 November 2026 at the UTC instants of the tz rules', () => {
    // EST is UTC−5 and EDT UTC−4 (IANA tz database).
    const spring = dayBoundsUtc('2026-03-08', 'America/New_York');
    expect(spring.start.toISOString()).toBe('2026-03-08T05:00:00.000Z');
    expect(spring.end.toISOString()).toBe('2026-03-09T04:00:00.000Z');
    const autumn = dayBoundsUtc('2026-11-01', 'America/New_York');
    expect((autumn.end.getTime() - autumn.start.getTime()) / 3_600_000).toBe(25);
    const london = dayBoundsUtc('2026-03-29', 'Europe/London');
    expect((london.end.getTime() - london.start.getTime()) / 3_600_000).toBe(23);
  });

  it('reads today in the practice zone: 03:30 UTC on 2 March 2026 is still 1 March in New York', () => {
    expect(todayIn('America/New_York', new Date('2026-03-02T03:30:00Z'))).toBe('2026-03-01');
  });

  it('accepts only real calendar dates', () => {
    expect(isIsoDate('2026-02-28')).toBe(true);
    expect(isIsoDate('2026-02-30')).toBe(false);
    expect(isIsoDate('2026-2-3')).toBe(false);
  });
});
