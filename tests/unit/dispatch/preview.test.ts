import { describe, expect, it } from 'vitest';
import { previewMoves } from '../../../src/lib/dispatch/preview.ts';
import type { PlanJobView, PlanRouteView, PlanStopView, PlanView, UnplannedView } from '../../../src/schemas/plans.ts';

const job = (id: number, extra: Partial<PlanJobView> = {}): PlanJobView => ({
  id, horseId: id, horseName: `Horse ${id}`, ownerName: 'Owner', workTypes: ['trim'], minutes: 30, dueOn: '2031-01-06',
  lame: false, pinned: false, pinnedPosition: null, cautions: [], ...extra,
});
const stop = (id: number, barnId: number, jobs: PlanJobView[], position: number): PlanStopView => ({
  id, position, barnId, barnName: `Barn ${barnId}`, lat: 38.2, lon: -84.6, arrival: '2031-01-06T08:00:00-05:00', start: '2031-01-06T08:00:00-05:00',
  departure: '2031-01-06T08:30:00-05:00', legDriveMinutes: 10, legDistance: 4.2, window: null, minutes: 30 * jobs.length, jobs,
  warnings: [{ code: 'past_shift', message: 'Past the end of the shift' }], progress: null,
});
const route = (farrierId: number, stops: PlanStopView[]): PlanRouteView => ({
  id: farrierId, farrierId, farrierName: `Farrier ${farrierId}`, colour: '#000', home: { lat: 38.2, lon: -84.6 }, hasForge: true, qualified: true,
  apprentice: false, start: '', end: '', breakStart: null, driveMinutes: 0, distance: 0, workMinutes: 0, overtimeMinutes: 0,
  horses: stops.reduce((n, s) => n + s.jobs.length, 0), stops, warnings: [], cautions: [],
});
// Farrier 100: barn 10 (jobs 1, 2), barn 20 (job 3). Farrier 200: barn 30 (job 4). Farrier 300: barn 50 (job 7). Unplanned: job 5 at barn 40.
const plan = (): PlanView => {
  const unplanned: UnplannedView[] = [{ jobId: 5, reason: 'no_time', reasonText: 'No time left', job: job(5), barnId: 40, barnName: 'Barn 40' }];
  return {
    id: 1, date: '2031-01-06', state: 'draft', version: 4, publishedAt: null, timeZone: 'America/New_York', units: 'miles',
    routes: [
      route(100, [stop(11, 10, [job(1), job(2)], 1), stop(12, 20, [job(3)], 2)]),
      route(200, [stop(21, 30, [job(4)], 1)]),
      route(300, [stop(31, 50, [job(7)], 1)]),
    ],
    unplanned,
    figures: { driveMinutes: 0, distance: 0, overtimeMinutes: 0, horses: 4, stops: 3, solveSeconds: null, iterations: null } as PlanView['figures'],
  };
};

describe('showing a drop before the server re-times it', () => {
  it('puts a whole stop moved in front of another farrier\'s first stop there, and leaves untouched lanes and unchanged stops as the same objects', () => {
    const p = plan();
    // The board's moves for a whole stop: its jobs taken off, then placed at position 1 of farrier 200.
    const r = previewMoves(p, [{ jobId: 1, toFarrierId: null }, { jobId: 2, toFarrierId: null }, { jobId: 1, toFarrierId: 200, position: 1 }, { jobId: 2, toFarrierId: 200, position: 1 }])!;
    expect(r.touched.sort()).toEqual([100, 200]);
    const [a, b, c] = r.plan.routes;
    expect(b!.stops.map((s) => [s.barnId, s.jobs.map((j) => j.id), s.position])).toEqual([[10, [1, 2], 1], [30, [4], 2]]);
    expect(a!.stops.map((s) => [s.barnId, s.position])).toEqual([[20, 1]]);
    // The moved stop keeps its object (same jobs in the same order); so does the stop that only changed place in name.
    expect(b!.stops[0]).toBe(p.routes[0]!.stops[0]);
    expect(b!.horses).toBe(3);
    expect(c).toBe(p.routes[2]);
    expect(r.plan.version).toBe(4);
  });

  it('gives stops whose jobs changed a provisional negative id and no warnings, since only the server can say what breaks', () => {
    // Job 2 leaves barn 10's stop (jobs 1, 2) for farrier 200: that stop now holds job 1 only, and job 2 is a new last stop.
    const r = previewMoves(plan(), [{ jobId: 2, toFarrierId: 200 }])!;
    expect(r.plan.routes[0]!.stops.map((s) => [s.id, s.jobs.map((j) => j.id)])).toEqual([[-1, [1]], [12, [3]]]);
    expect(r.plan.routes[1]!.stops.map((s) => [s.id, s.jobs.map((j) => j.id)])).toEqual([[21, [4]], [-2, [2]]]);
    expect(r.plan.routes[0]!.stops[0]!.warnings).toEqual([]);
    expect(r.plan.routes[1]!.stops[1]!.barnName).toBe('Barn 10');
    // 30 minutes for the one horse left (the stop held two of 30 each).
    expect(r.plan.routes[0]!.stops[0]!.minutes).toBe(30);
  });

  it('places an unplanned job on a route and takes it off the unplanned list', () => {
    const r = previewMoves(plan(), [{ jobId: 5, toFarrierId: 300, position: 1 }])!;
    expect(r.plan.routes[2]!.stops.map((s) => s.jobs.map((j) => j.id))).toEqual([[5], [7]]);
    expect(r.plan.unplanned).toEqual([]);
  });

  it('shows a pin at once: the pinned job gets a new object with pinned set, so its card re-renders', () => {
    const p = plan();
    const r = previewMoves(p, [{ jobId: 4, toFarrierId: 200, position: 1, pin: true }])!;
    const s = r.plan.routes[1]!.stops[0]!;
    expect(s.jobs[0]!.pinned).toBe(true);
    expect(s).not.toBe(p.routes[1]!.stops[0]);
  });

  it('shows nothing ahead of the server when work is taken off the plan or a farrier is not on it', () => {
    expect(previewMoves(plan(), [{ jobId: 3, toFarrierId: null }])).toBeNull();
    expect(previewMoves(plan(), [{ jobId: 3, toFarrierId: 999 }])).toBeNull();
    expect(previewMoves(plan(), [{ jobId: 42, toFarrierId: 200 }])).toBeNull();
  });
});
