import { describe, expect, it } from 'vitest';
import { dayView } from '../../../src/lib/day-sheet/day-view.ts';
import type { DayLogView } from '../../../src/lib/day-sheet/day-logs.ts';

const base = { plannedStartAt: '2027-03-02T12:00:00.000Z', plannedDistanceM: 42_000, units: 'miles' as const };
const log: DayLogView = {
  id: 1, farrierId: 3, date: '2027-03-02', startedAt: '2027-03-02T11:50:00.000Z', endedAt: null, startOdometer: 1000, endOdometer: null,
  distanceM: null, distanceSource: null, startSource: 'marked',
};

describe('the day as the sheet shows it, confirmed log plus queued marks', () => {
  it('shows nothing started before any mark', () => {
    expect(dayView({ ...base, confirmed: null, queued: [], anyStopMarked: false })).toBeNull();
  });

  it('starts the day implicitly at the planned departure once a stop is marked without Start the day', () => {
    const v = dayView({ ...base, confirmed: null, queued: [], anyStopMarked: true })!;
    expect(v.startImplied).toBe(true);
    expect(new Date(v.startedMs).toISOString()).toBe(base.plannedStartAt);
  });

  it('a queued back home with a reading gives the odometer distance; a second start changes nothing', () => {
    const v = dayView({
      ...base, confirmed: log, anyStopMarked: true,
      queued: [{ kind: 'start', at: '2027-03-02T12:30:00.000Z', odometer: 5 }, { kind: 'end', at: '2027-03-02T19:00:00.000Z', odometer: 1030 }],
    })!;
    expect(v.startOdometer).toBe(1000);
    expect(new Date(v.startedMs).toISOString()).toBe(log.startedAt);
    // 30 mi × 1,609.344 m = 48,280.32 m → 48,280 m.
    expect(v).toMatchObject({ endOdometer: 1030, distanceM: 48_280, distanceSource: 'odometer', waiting: true });
  });

  it('falls back to the planned distance when the end has no reading, and ignores an end before the start', () => {
    const planned = dayView({ ...base, confirmed: log, anyStopMarked: false, queued: [{ kind: 'end', at: '2027-03-02T19:00:00.000Z', odometer: null }] })!;
    expect(planned).toMatchObject({ distanceM: 42_000, distanceSource: 'planned' });
    const early = dayView({ ...base, confirmed: log, anyStopMarked: false, queued: [{ kind: 'end', at: '2027-03-02T11:00:00.000Z', odometer: 1010 }] })!;
    expect(early.endedMs).toBeNull();
  });
});
