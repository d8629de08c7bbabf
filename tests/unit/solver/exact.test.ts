import solver from 'javascript-lp-solver';
import { describe, expect, it } from 'vitest';
import { solve } from '../../../src/lib/solver/solve';
import { checkSolution } from '../../../src/lib/solver/checker';
import { bestRoutes, engineObjective, enumerateOptimum, leaveOut, randomProblem, type Objective } from './helpers';
import type { Problem } from '../../../src/lib/solver/problem';

/**
 * Set-partitioning model over every feasible (farrier, job set) column, solved by javascript-lp-solver
 * (a general-purpose MIP library from npm, independent of the engine). Mandatory jobs left out are
 * charged 1e7 here instead of the engine's 1e13 to keep the simplex numerically sound; both exceed any
 * route cost of these small instances, so the optimal plan is the same.
 */
function lpOptimum(p: Problem, routes: { cost: Float64Array[] }): Objective {
  const n = p.jobs.length;
  const constraints: Record<string, { equal?: number; max?: number }> = {};
  const variables: Record<string, Record<string, number>> = {};
  const ints: Record<string, 1> = {};
  for (let j = 0; j < n; j++) constraints[`j${j}`] = { equal: 1 };
  p.farriers.forEach((_, f) => { constraints[`f${f}`] = { max: 1 }; });
  const lpLeaveOut = (j: number) => (p.jobs[j].optional ? leaveOut(p, j) : 1e7);
  for (let j = 0; j < n; j++) { variables[`y${j}`] = { cost: lpLeaveOut(j), [`j${j}`]: 1 }; ints[`y${j}`] = 1; }
  routes.cost.forEach((c, f) => {
    for (let s = 1; s < 1 << n; s++) {
      if (c[s] === Infinity) continue;
      const v: Record<string, number> = { cost: c[s], [`f${f}`]: 1 };
      for (let j = 0; j < n; j++) if (s & (1 << j)) v[`j${j}`] = 1;
      variables[`x${f}_${s}`] = v;
      ints[`x${f}_${s}`] = 1;
    }
  });
  const res = solver.Solve({ optimize: 'cost', opType: 'min', constraints, variables, ints }) as { feasible: boolean; [k: string]: number | boolean };
  expect(res.feasible).toBe(true);
  // recompute the objective of the chosen columns with the engine's leave-out charges
  const total: Objective = { hard: 0, soft: 0 };
  for (const [k, v] of Object.entries(res)) {
    if (typeof v !== 'number' || v < 0.5) continue;
    const mx = /^x(\d+)_(\d+)$/.exec(k), my = /^y(\d+)$/.exec(k);
    if (mx) total.soft += routes.cost[Number(mx[1])][Number(mx[2])];
    if (my) {
      const job = p.jobs[Number(my[1])];
      if (job.optional) total.soft += leaveOut(p, Number(my[1])); else total.hard += Math.max(1, job.priority);
    }
  }
  return total;
}

describe('exact optimum on small random instances', () => {
  const cases = [
    { seed: 11, jobs: 5, farriers: 2 },
    { seed: 12, jobs: 6, farriers: 2, breaks: true },
    { seed: 13, jobs: 6, farriers: 2, pins: true },
    { seed: 14, jobs: 7, farriers: 2, tight: true },
    { seed: 15, jobs: 7, farriers: 1, breaks: true },
    { seed: 16, jobs: 8, farriers: 1, tight: true },
    { seed: 17, jobs: 8, farriers: 2, breaks: true, pins: true },
    { seed: 18, jobs: 8, farriers: 2, barns: 3 },
    { seed: 19, jobs: 7, farriers: 3, breaks: true },
    { seed: 20, jobs: 8, farriers: 3, tight: true, pins: true },
    { seed: 21, jobs: 6, farriers: 2, barns: 2, breaks: true },
    { seed: 22, jobs: 8, farriers: 2, tight: true, breaks: true },
  ];
  for (const c of cases) {
    it(`engine plan equals the enumerated and the MIP optimum (seed ${c.seed}, ${c.jobs} jobs, ${c.farriers} farriers)`, () => {
      const p = randomProblem(c.seed, c);
      const routes = bestRoutes(p);
      const byEnumeration = enumerateOptimum(p, routes);
      const byLp = lpOptimum(p, routes);
      expect(byLp.hard).toBe(byEnumeration.hard);
      expect(byLp.soft).toBeCloseTo(byEnumeration.soft, 6);
      const r = solve(p, { seed: 1, stop: { maxIterations: 1500 } });
      expect(checkSolution(p, r, { complete: true }).feasible).toBe(true);
      const ours = engineObjective(p, r);
      // the instance must be non-trivial: something planned
      expect(r.routes.some((x) => x.stops.length > 0)).toBe(true);
      expect(ours.hard).toBe(byEnumeration.hard);
      expect(ours.soft).toBeCloseTo(byEnumeration.soft, 6);
    });
  }
});
