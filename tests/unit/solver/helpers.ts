import { createProblem, type Problem, type ProblemInput } from '../../../src/lib/solver/problem';
import { createRng } from '../../../src/lib/solver/random';
import { checkSolution } from '../../../src/lib/solver/checker';
import { MANDATORY_LEAVE_OUT } from '../../../src/lib/solver/model';

/**
 * Small random farrier days for property and exact tests: homes and barns on a 20 km square, road
 * seconds from distance at ~20 m/s with some asymmetry, random access hours, owner windows, skills,
 * forge needs, breaks, pins, optional jobs and capacities. Invented data, reproducible from the seed.
 */
export function randomProblem(seed: number, o: { jobs: number; farriers: number; barns?: number; breaks?: boolean; pins?: boolean; tight?: boolean }): Problem {
  const rng = createRng(seed);
  const nB = o.barns ?? Math.max(1, Math.ceil(o.jobs * 0.7));
  const nLoc = o.farriers + nB;
  const x: number[] = [], y: number[] = [];
  for (let i = 0; i < nLoc; i++) { x.push(rng.next() * 20000); y.push(rng.next() * 20000); }
  const durationSec: number[][] = [], distanceM: number[][] = [];
  for (let a = 0; a < nLoc; a++) {
    durationSec.push([]); distanceM.push([]);
    for (let b = 0; b < nLoc; b++) {
      const d = a === b ? 0 : Math.round(Math.hypot(x[a] - x[b], y[a] - y[b]) * 1.3 + 200);
      distanceM[a].push(d);
      durationSec[a].push(a === b ? 0 : Math.round(d / 20 * (a < b ? 1.05 : 0.97)) + 30);
    }
  }
  const H = 3600;
  const farriers: ProblemInput['farriers'] = Array.from({ length: o.farriers }, (_, f) => ({
    id: `f${f + 1}`, startLocation: f, endLocation: f,
    shiftStartSec: 7 * H + rng.int(3) * 1800, shiftEndSec: (o.tight ? 13 : 16) * H + rng.int(3) * 1800,
    breakSec: o.breaks && rng.next() < 0.6 ? 1800 : 0,
    breakWindow: o.breaks ? { startSec: 11 * H, endSec: 13 * H } : null,
    normalWorkSec: (o.tight ? 5 : 7) * H, maxOvertimeSec: rng.int(3) * 1800,
    costPerDriveSec: 1, costPerMetre: 0.04, costPerOvertimeSec: 2, fixedCost: rng.int(2) * 2000,
    qualified: rng.next() < 0.5, hasForge: rng.next() < 0.7,
    capacity: rng.next() < 0.3 ? 3 + rng.int(3) : undefined,
  }));
  const barns: ProblemInput['barns'] = Array.from({ length: nB }, (_, b) => {
    const r = rng.next();
    const windows = r < 0.6 ? [{ startSec: 7 * H, endSec: 18 * H }] : r < 0.8 ? [{ startSec: 8 * H, endSec: 11 * H }, { startSec: 13 * H, endSec: 16 * H }] : [{ startSec: (9 + rng.int(4)) * H, endSec: (12 + rng.int(4)) * H }];
    return { id: `b${b + 1}`, location: o.farriers + b, windows, setupSec: 300 + rng.int(4) * 150 };
  });
  const jobs: ProblemInput['jobs'] = Array.from({ length: o.jobs }, (_, j) => {
    const job: ProblemInput['jobs'][number] = {
      id: `j${j + 1}`, barnId: `b${(j < nB ? j : rng.int(nB)) + 1}`,
      durationSec: [1500, 2700, 4200, 4800][rng.int(4)],
      needsQualified: rng.next() < 0.2, needsForge: rng.next() < 0.25,
      priority: 1 + rng.int(3), optional: rng.next() < 0.5, penalty: 2000 + rng.int(8000), demand: 1,
    };
    if (rng.next() < 0.2) { const ws = 8 + rng.int(6); job.windows = [{ startSec: ws * H, endSec: (ws + 2 + rng.int(3)) * H }]; }
    if (o.pins && rng.next() < 0.15) job.pin = { farrierId: `f${1 + rng.int(o.farriers)}`, ...(rng.next() < 0.3 ? { position: 1 } : {}), ...(rng.next() < 0.3 ? { notBeforeSec: 10 * H } : {}) };
    return job;
  });
  return createProblem({ locations: nLoc, durationSec, distanceM, farriers, barns, jobs });
}

/** Leave-out cost of a job in the engine's objective (mandatory jobs use the engine's large constant). */
export function leaveOut(p: Problem, j: number): number {
  const job = p.jobs[j];
  return job.optional ? job.penalty * job.priority : MANDATORY_LEAVE_OUT * Math.max(1, job.priority);
}

/**
 * Best route cost of every (farrier, subset of jobs) by trying every order, each costed by the
 * independent checker. Infinity where no order is feasible.
 */
export function bestRoutes(p: Problem): { cost: Float64Array[]; order: number[][][] } {
  const n = p.jobs.length;
  const cost: Float64Array[] = [], order: number[][][] = [];
  for (let f = 0; f < p.farriers.length; f++) {
    const c = new Float64Array(1 << n).fill(Infinity);
    const o: number[][] = new Array(1 << n);
    c[0] = 0; o[0] = [];
    const seq: number[] = [];
    const used = new Uint8Array(n);
    const rec = (mask: number) => {
      if (seq.length) {
        const r = checkSolution(p, { routes: [{ farrierId: p.farriers[f].id, jobIds: seq.map((j) => p.jobs[j].id) }] });
        // an order that breaks a rule cannot be repaired by appending jobs (times only grow): prune it
        if (!r.feasible) return;
        if (r.costs.routesCents < c[mask]) { c[mask] = r.costs.routesCents; o[mask] = seq.slice(); }
      }
      for (let j = 0; j < n; j++) if (!used[j]) { used[j] = 1; seq.push(j); rec(mask | (1 << j)); seq.pop(); used[j] = 0; }
    };
    rec(0);
    cost.push(c); order.push(o);
  }
  return { cost, order };
}

/**
 * An objective value as a pair: `hard` = priority-weighted count of mandatory jobs left out (the
 * engine's dominant term), `soft` = route costs plus penalties of optional jobs left out, in cents.
 */
export interface Objective { hard: number; soft: number }

/** Optimum over all assignments by dynamic programming over job subsets, farrier by farrier. */
export function enumerateOptimum(p: Problem, routes: { cost: Float64Array[] }): Objective {
  const n = p.jobs.length, full = (1 << n) - 1;
  let dp = new Float64Array(1 << n).fill(Infinity);
  dp[0] = 0;
  for (let f = 0; f < p.farriers.length; f++) {
    const nd = dp.slice();
    for (let mask = 0; mask <= full; mask++) {
      if (dp[mask] === Infinity) continue;
      const rest = full & ~mask;
      for (let s = rest; s > 0; s = (s - 1) & rest) {
        const c = routes.cost[f][s];
        if (c === Infinity) continue;
        if (dp[mask] + c < nd[mask | s]) nd[mask | s] = dp[mask] + c;
      }
    }
    dp = nd;
  }
  let best: Objective = { hard: Infinity, soft: Infinity };
  for (let mask = 0; mask <= full; mask++) {
    if (dp[mask] === Infinity) continue;
    const o = { hard: 0, soft: dp[mask] };
    for (let j = 0; j < n; j++) if (!(mask & (1 << j))) {
      if (p.jobs[j].optional) o.soft += leaveOut(p, j); else o.hard += Math.max(1, p.jobs[j].priority);
    }
    if (o.hard < best.hard || (o.hard === best.hard && o.soft < best.soft)) best = o;
  }
  return best;
}

/** The engine's objective of a result as a pair (see `Objective`). */
export function engineObjective(p: Problem, r: { cost: number; unplanned: { jobId: string }[] }): Objective {
  let hard = 0;
  for (const u of r.unplanned) {
    const job = p.jobs.find((x) => x.id === u.jobId)!;
    if (!job.optional) hard += Math.max(1, job.priority);
  }
  return { hard, soft: r.cost };
}
