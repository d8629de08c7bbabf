import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { solve } from '../../../src/lib/solver/solve';
import { solveTsp } from '../../../src/lib/solver/tsp';
import { checkSolution } from '../../../src/lib/solver/checker';
import { checkTour, parseTsplib, tsplibMatrix } from '../../../bench/lib/tsplib';
import { checkSolomon, parseSolomon, solomonProblem } from '../../../bench/lib/solomon';

const fixtures = join(process.cwd(), 'tests', 'fixtures', 'solver');

describe('published instances', () => {
  // Optimal tour lengths from the TSPLIB 95 list (Reinelt 1991, ORSA J. Computing 3(4)): eil51 426, berlin52 7542.
  it.each([['eil51', 426], ['berlin52', 7542]])('finds a %s tour within 1 %% of the TSPLIB optimum %i', (name, optimum) => {
    const inst = parseTsplib(join(fixtures, `${name}.tsp`));
    const r = solveTsp(tsplibMatrix(inst), inst.ids.length, { seed: 1, maxIterations: 1500 });
    const check = checkTour(inst, r.tour.map((i) => inst.ids[i]));
    expect(check.feasible).toBe(true);
    expect(check.length).toBe(r.length);
    expect(check.length).toBeLessThanOrEqual(optimum * 1.01);
    expect(check.length).toBeGreaterThanOrEqual(optimum); // a shorter tour would mean a broken distance rule
  });

  // Best known for C101: 10 vehicles, 828.94 (SINTEF TOP Solomon-100 best-known table; unrounded Euclidean distances).
  it('solves Solomon C101 with the best-known 10 vehicles and distance within 1 % of 828.94', () => {
    const inst = parseSolomon(join(fixtures, 'c101.txt'));
    const p = solomonProblem(inst);
    const r = solve(p, { seed: 1, stop: { maxIterations: 2500 } });
    const routes = r.routes.filter((x) => x.stops.length).map((x) => x.stops.flatMap((s) => s.jobIds.map(Number)));
    const check = checkSolomon(inst, routes);
    expect(check.errors).toEqual([]);
    expect(r.unplanned).toEqual([]);
    expect(check.vehicles).toBe(10);
    expect(check.distance).toBeLessThanOrEqual(828.94 * 1.01);
    expect(check.distance).toBeGreaterThanOrEqual(828.93);
    // the engine's own checker agrees on its scaled-integer version of the instance
    expect(checkSolution(p, r, { complete: true, compareTimes: true }).violations).toEqual([]);
  });
});
