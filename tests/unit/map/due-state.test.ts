// How a barn's open jobs colour it on the map.
import { describe, expect, it } from 'vitest';
import { barnDueState } from '../../../src/lib/map/due-state';

describe('barnDueState', () => {
  it('orders overdue before due within a week before booked before later', () => {
    // Today 2026-12-01: a week ahead is 2026-12-08 (inclusive).
    expect(barnDueState('2026-11-30', 3, '2026-12-01')).toBe('overdue');
    expect(barnDueState('2026-12-01', 0, '2026-12-01')).toBe('due_soon');
    expect(barnDueState('2026-12-08', 2, '2026-12-01')).toBe('due_soon');
    expect(barnDueState('2026-12-09', 2, '2026-12-01')).toBe('booked');
    expect(barnDueState('2026-12-09', 0, '2026-12-01')).toBe('later');
    expect(barnDueState(null, 1, '2026-12-01')).toBe('booked');
    expect(barnDueState(null, 0, '2026-12-01')).toBe('later');
  });

  it('counts a week across a month end: 2026-02-25 + 7 days = 2026-03-04', () => {
    expect(barnDueState('2026-03-04', 0, '2026-02-25')).toBe('due_soon');
    expect(barnDueState('2026-03-05', 0, '2026-02-25')).toBe('later');
  });
});
