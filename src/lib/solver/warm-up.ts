import { createProblem, type Problem, type ProblemInput } from './problem';
import { createRng } from './random';
import { solve } from './solve';

/**
 * A made-up day of the usual kind (4 farriers with breaks and priced overtime, 40 jobs at 28 barns,
 * access hours, a few owner windows, optional jobs), built from a fixed seed. Only for warming up.
 */
export function warmUpProblem(): Problem {
  const rng = createRng(20261202);
  const F = 4, B = 28, H = 3600;
  const x: number[] = [], y: number[] = [];
  for (let i = 0; i < F + B; i++) { x.push(rng.next() * 30000); y.push(rng.next() * 30000); }
  const distanceM = x.map((_, a) => x.map((__, b) => (a === b ? 0 : Math.round(Math.hypot(x[a] - x[b], y[a] - y[b]) * 1.3))));
  const durationSec = distanceM.map((row) => row.map((d) => (d === 0 ? 0 : Math.round(d / 20) + 60)));
  const farriers: ProblemInput['farriers'] = Array.from({ length: F }, (_, f) => ({
    id: `f${f}`, startLocation: f, endLocation: f, shiftStartSec: 7 * H, shiftEndSec: 18 * H,
    breakSec: 1800, breakWindow: { startSec: 11 * H, endSec: 13 * H }, normalWorkSec: 8 * H, maxOvertimeSec: 2 * H,
    costPerDriveSec: 1, costPerMetre: 0.04, costPerOvertimeSec: 2, qualified: f % 2 === 0, hasForge: f !== 3,
  }));
  const barns: ProblemInput['barns'] = Array.from({ length: B }, (_, b) => ({
    id: `b${b}`, location: F + b, setupSec: 300,
    windows: b % 5 === 0 ? [{ startSec: 8 * H, endSec: 12 * H }] : [{ startSec: 7 * H, endSec: 18 * H }],
  }));
  const jobs: ProblemInput['jobs'] = Array.from({ length: 40 }, (_, j) => ({
    id: `j${j}`, barnId: `b${j < B ? j : rng.int(B)}`, durationSec: [1800, 2700, 3600][rng.int(3)],
    needsQualified: j % 9 === 0, needsForge: j % 4 === 0, priority: 1 + rng.int(3), optional: j % 3 === 0, penalty: 5000,
    ...(j % 7 === 0 ? { windows: [{ startSec: 9 * H, endSec: 11 * H }] } : {}),
  }));
  return createProblem({ locations: F + B, durationSec, distanceM, farriers, barns, jobs });
}

/**
 * Runs a short search on the made-up day so that the engine's hot code is compiled and optimised
 * before the first real plan: in a fresh worker the first seconds of a search otherwise run
 * noticeably fewer iterations than later ones. Returns the iterations run.
 */
export function warmUpEngine(iterations = 2000): number {
  return solve(warmUpProblem(), { seed: 1, stop: { maxIterations: iterations } }).statistics.iterations;
}
