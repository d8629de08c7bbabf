import { describe, expect, it } from 'vitest';
import { createProblem } from '../../../src/lib/solver/problem';
import { solve } from '../../../src/lib/solver/solve';
import { checkSolution } from '../../../src/lib/solver/checker';

/*
 * Hand-checkable day. Locations: 0 home, 1 barn A, 2 barn B. Drive seconds (asymmetric):
 *   0→1 600, 1→2 900, 2→0 1200, 0→2 1500, 2→1 900, 1→0 600. Metres = seconds × 10.
 * Farrier: shift 08:00 (28 800) – 17:00, no break, 1 ¢ per drive second and 0.1 ¢ per metre.
 * Barn A (set-up 300) open all day: jobs A1 (1 800 s) and A2 (1 200 s).
 * Barn B (set-up 600) opens 10:00 (36 000): job B1 (2 400 s).
 * Order A, B: leave 28 800, arrive A 29 400, set-up to 29 700, A1 29 700–31 500, A2 31 500–32 700;
 *   drive 900 → arrive B 33 600; set-up must start at opening: 36 000–36 600; B1 36 600–39 000;
 *   drive home 1 200 → 40 200. Drive 600 + 900 + 1 200 = 2 700 s, 27 000 m:
 *   cost 2 700 × 1 + 27 000 × 0.1 = 5 400 ¢. Work 40 200 − 28 800 = 11 400 s.
 * Order B, A: drive 1 500 + 900 + 600 = 3 000 s → 6 000 ¢, dearer. Splitting barn A's jobs only adds
 * drives and a second set-up. So the optimum is one stop at A (both jobs) then B, at 5 400 ¢.
 */
const tiny = () => createProblem({
  locations: 3,
  durationSec: [[0, 600, 1500], [600, 0, 900], [1200, 900, 0]],
  distanceM: [[0, 6000, 15000], [6000, 0, 9000], [12000, 9000, 0]],
  farriers: [{ id: 'ann', startLocation: 0, endLocation: 0, shiftStartSec: 28800, shiftEndSec: 61200, normalWorkSec: 28800, costPerDriveSec: 1, costPerMetre: 0.1, qualified: true, hasForge: true }],
  barns: [
    { id: 'A', location: 1, windows: [{ startSec: 0, endSec: 86399 }], setupSec: 300 },
    { id: 'B', location: 2, windows: [{ startSec: 36000, endSec: 61200 }], setupSec: 600 },
  ],
  jobs: [
    { id: 'A1', barnId: 'A', durationSec: 1800 },
    { id: 'A2', barnId: 'A', durationSec: 1200 },
    { id: 'B1', barnId: 'B', durationSec: 2400 },
  ],
});

describe('tiny hand-checked day', () => {
  it('plans one stop per barn with the times and cost worked out by hand', () => {
    const p = tiny();
    const r = solve(p, { seed: 3, stop: { maxIterations: 200 } });
    expect(r.unplanned).toEqual([]);
    const route = r.routes[0];
    expect(route.stops.map((s) => s.barnId)).toEqual(['A', 'B']);
    expect(route.stops[0].jobIds.slice().sort()).toEqual(['A1', 'A2']);
    expect(route.stops[0]).toMatchObject({ arrivalSec: 29400, startSec: 29400, departureSec: 32700 });
    expect(route.stops[1]).toMatchObject({ arrivalSec: 33600, startSec: 36000, departureSec: 39000 });
    expect(route).toMatchObject({ startSec: 28800, endSec: 40200, driveSec: 2700, distanceM: 27000, workSec: 11400, overtimeSec: 0 });
    expect(r.cost).toBeCloseTo(5400, 9);
    const c = checkSolution(p, r, { complete: true, compareTimes: true });
    expect(c.violations).toEqual([]);
    expect(c.costs.totalCents).toBeCloseTo(5400, 9);
  });

  it('reports the hand-computed window miss when B is visited too late (barn B closes at 10:30 in this variant)', () => {
    const base = tiny();
    const p = createProblem({ ...base, barns: [base.barns[0], { ...base.barns[1], windows: [{ startSec: 36000, endSec: 37800 }] }] });
    // B1 needs set-up from 36 000 and 2 400 s of work: it would end at 39 000 > 37 800, so no start fits.
    const r = solve(p, { seed: 3, stop: { maxIterations: 50 } });
    expect(r.unplanned).toEqual([{ jobId: 'B1', reason: 'no_common_window' }]);
  });
});
