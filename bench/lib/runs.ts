import { basename } from 'node:path';
import { solve } from '../../src/lib/solver/solve';
import { solveTsp } from '../../src/lib/solver/tsp';
import { checkSolomon, parseSolomon, solomonProblem } from './solomon';
import { checkTour, parseTsplib, tsplibMatrix } from './tsplib';

/** Solves one Solomon file under the hierarchical objective and re-checks the routes in doubles. */
export function runSolomon(file: string, seconds: number, seed: number) {
  const inst = parseSolomon(file);
  const problem = solomonProblem(inst);
  const t0 = performance.now();
  const result = solve(problem, { seed, stop: { maxSeconds: seconds } });
  const secondsUsed = (performance.now() - t0) / 1000;
  const routes = result.routes.filter((r) => r.stops.length).map((r) => r.stops.flatMap((s) => s.jobIds.map(Number)));
  const check = checkSolomon(inst, routes);
  if (result.unplanned.length) check.errors.push(`${result.unplanned.length} customers unplanned`);
  check.feasible = check.errors.length === 0;
  return { instance: inst.name || basename(file), vehicles: check.vehicles, distance: check.distance, seconds: secondsUsed, routes, check, result };
}

/** Solves one TSPLIB EUC_2D file and re-checks the tour with TSPLIB's rounding. */
export function runTsplib(file: string, seconds: number, seed: number) {
  const inst = parseTsplib(file);
  const r = solveTsp(tsplibMatrix(inst), inst.ids.length, { seed, maxSeconds: seconds });
  const tour = r.tour.map((i) => inst.ids[i]);
  const check = checkTour(inst, tour);
  return { instance: inst.name || basename(file), length: check.length, seconds: r.seconds, tour, check, iterations: r.iterations };
}
