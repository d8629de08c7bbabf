import { describe, expect, it } from 'vitest';
import { applyMoves, type EditRoutes } from '../../../src/lib/dispatch/edits.ts';
import { jobWeight } from '../../../src/lib/dispatch/problem.ts';
import { dateToLocalSec, isoLocal, localSecToDate } from '../../../src/lib/dispatch/time.ts';

const barnOf: Record<number, number> = { 1: 10, 2: 10, 3: 20, 4: 30, 5: 40, 6: 20 };
const routes = (): EditRoutes => new Map([
  [100, [{ barnId: 10, jobIds: [1, 2] }, { barnId: 20, jobIds: [3] }]],
  [200, [{ barnId: 30, jobIds: [4] }]],
]);

describe('applying hand moves to job order', () => {
  it('places a job in front of the stop at the given position in another route and touches only the two routes', () => {
    const r = applyMoves(routes(), [{ jobId: 3, toFarrierId: 200, position: 1 }], (j) => barnOf[j]!);
    expect(r.routes.get(200)).toEqual([{ barnId: 20, jobIds: [3] }, { barnId: 30, jobIds: [4] }]);
    expect(r.routes.get(100)).toEqual([{ barnId: 10, jobIds: [1, 2] }]);
    expect([...r.touched].sort()).toEqual([100, 200]);
  });

  it('joins the stop at the same barn when no position is given, so one set-up serves both horses', () => {
    const r = applyMoves(routes(), [{ jobId: 6, toFarrierId: 100 }], (j) => barnOf[j]!);
    expect(r.routes.get(100)![1]).toEqual({ barnId: 20, jobIds: [3, 6] });
    expect([...r.added]).toEqual([6]);
  });

  it('moves a whole stop exactly like arrayMove when its jobs are taken off first, then placed', () => {
    const r = applyMoves(routes(), [{ jobId: 1, toFarrierId: null }, { jobId: 2, toFarrierId: null }, { jobId: 1, toFarrierId: 100, position: 2 }, { jobId: 2, toFarrierId: 100, position: 2 }], (j) => barnOf[j]!);
    expect(r.routes.get(100)).toEqual([{ barnId: 20, jobIds: [3] }, { barnId: 10, jobIds: [1, 2] }]);
    expect(r.removed.size).toBe(0);
  });

  it('takes a job off the plan with toFarrierId null and merges the neighbours left at one barn', () => {
    const start: EditRoutes = new Map([[100, [{ barnId: 10, jobIds: [1] }, { barnId: 20, jobIds: [3] }, { barnId: 10, jobIds: [2] }]]]);
    const r = applyMoves(start, [{ jobId: 3, toFarrierId: null }], (j) => barnOf[j]!);
    expect(r.routes.get(100)).toEqual([{ barnId: 10, jobIds: [1, 2] }]);
    expect([...r.removed]).toEqual([3]);
  });
});

describe('job weights', () => {
  it('puts overdue and lame horses first: priority 1 due later, 3 + weeks overdue, +5 lame; penalty 2000 + 20/min', () => {
    expect(jobWeight({ dueOn: '2026-12-05', lame: false, minutes: 30 }, '2026-12-02')).toEqual({ priority: 1, penalty: 2600 }); // 2000 + 20 × 30
    expect(jobWeight({ dueOn: '2026-12-02', lame: false, minutes: 60 }, '2026-12-02')).toEqual({ priority: 3, penalty: 3200 });
    expect(jobWeight({ dueOn: '2026-11-18', lame: false, minutes: 60 }, '2026-12-02').priority).toBe(5); // 14 days = 2 weeks → 3 + 2
    expect(jobWeight({ dueOn: '2026-11-18', lame: true, minutes: 60 }, '2026-12-02').priority).toBe(10);
  });
});

describe('plan-day clock', () => {
  // IANA tz rules (reference values): New York changes 2026-03-08 02:00 EST → 03:00 EDT, and 2026-11-01 back.
  it('turns wall-clock seconds into instants with the right offset on both sides of a clock change', () => {
    expect(isoLocal(localSecToDate('2026-03-07', 8 * 3600, 'America/New_York'), 'America/New_York')).toBe('2026-03-07T08:00:00-05:00');
    expect(isoLocal(localSecToDate('2026-03-08', 8 * 3600, 'America/New_York'), 'America/New_York')).toBe('2026-03-08T08:00:00-04:00');
    expect(localSecToDate('2026-03-08', 8 * 3600, 'America/New_York').toISOString()).toBe('2026-03-08T12:00:00.000Z');
    expect(isoLocal(localSecToDate('2026-11-01', 17 * 3600 + 30 * 60, 'America/New_York'), 'America/New_York')).toBe('2026-11-01T17:30:00-05:00');
  });

  it('reads an instant back as the same wall-clock seconds (round trip)', () => {
    for (const sec of [0, 27000, 45296, 70200]) expect(dateToLocalSec('2026-12-02', localSecToDate('2026-12-02', sec, 'America/New_York'), 'America/New_York')).toBe(sec);
  });
});
