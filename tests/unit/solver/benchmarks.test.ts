import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { solve } from '../../../src/lib/solver/solve';
import { solveTsp } from '../../../src/lib/solver/tsp';
import { checkSolution } from '../../../src/lib/solver/checker';
import { checkTour, parseTsplib, tsplibMatrix } from '../../../bench/lib/tsplib';
import { checkSolomon, parseSolomon, solomonProblem } from '../../../bench/lib/solomon';
import { judgeFarrierDay } from '../../../bench/lib/suite';

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

describe('farrier-day benchmark verdict', () => {
  // a mandatory job left out is listed, not priced, so a plan that leaves one out can cost less
  // than one that plans it; the verdict must go by the mandatory jobs first
  it('counts a short run that plans more mandatory jobs as the better plan, whatever its cost', () => {
    const v = judgeFarrierDay({ gapPct: 2.3, extraMandatoryOut: -1 }, '3-s', '60-s');
    expect(v).toMatchObject({ within: true, worse: false });
    expect(v.text).toContain('plans 1 more mandatory job(s)');
  });
  it('counts a short run that leaves more mandatory jobs out as a miss, whatever its cost', () => {
    const v = judgeFarrierDay({ gapPct: -4, extraMandatoryOut: 1 }, '3-s', '60-s');
    expect(v).toMatchObject({ within: false, worse: true });
    expect(v.text).toContain('leaves 1 more mandatory job(s) out');
  });
  it('judges runs that leave the same mandatory jobs out by the 1 % cost gap', () => {
    expect(judgeFarrierDay({ gapPct: 0.99, extraMandatoryOut: 0 }, '3-s', '60-s')).toMatchObject({ within: true, worse: false });
    expect(judgeFarrierDay({ gapPct: 1.01, extraMandatoryOut: 0 }, '3-s', '60-s')).toMatchObject({ within: false, worse: false });
  });
});
