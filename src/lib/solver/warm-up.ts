import { farrierDay } from './invented-day';
import type { Problem } from './problem';
import { solve } from './solve';

/**
 * A made-up day of the usual kind (4 farriers with breaks and priced overtime, 40 jobs at 28 barns,
 * access hours, a few owner windows and pins, optional jobs). Only for warming up.
 */
export function warmUpProblem(): Problem {
  return farrierDay({ seed: 20261202, farriers: 4, jobs: 40, barns: 28, sideM: 30000 });
}

/**
 * Runs a short search on the made-up day so that the engine's hot code is compiled and optimised
 * before the first real plan: in a fresh worker the first seconds of a search otherwise run
 * noticeably fewer iterations than later ones. Returns the iterations run.
 */
export function warmUpEngine(iterations = 2000): number {
  return solve(warmUpProblem(), { seed: 1, stop: { maxIterations: iterations } }).statistics.iterations;
}
