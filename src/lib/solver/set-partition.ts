import solver from 'javascript-lp-solver';
import type { Model } from './model';
import { evalRoute } from './route-eval';
import type { State } from './state';

/**
 * Set partitioning over routes the search has met: every route of an accepted plan goes into a
 * pool (the cheapest order per set of jobs), and from time to time a small integer programme picks
 * the cheapest set of pooled routes that does every job exactly once with no more routes than the
 * incumbent. The incumbent's own routes are always columns, so the programme can always return it;
 * a result is adopted only when it is checked feasible and strictly cheaper, so this step never
 * worsens the plan. Used where farriers are interchangeable (the fleet-then-distance benchmarks).
 */
export class RoutePool {
  private readonly byKey = new Map<string, { seq: number[]; cost: number }>();
  constructor(readonly maxSize = 20000) {}

  get size(): number { return this.byKey.size; }

  /** Adds a route (its cost excludes the per-route fixed cost); keeps the cheaper order of one job set. */
  add(seq: number[], cost: number): void {
    if (!seq.length || !Number.isFinite(cost)) return;
    const key = seq.slice().sort((a, b) => a - b).join(',');
    const old = this.byKey.get(key);
    if (old) { if (cost < old.cost) { old.seq = seq.slice(); old.cost = cost; } return; }
    if (this.byKey.size >= this.maxSize) return;
    this.byKey.set(key, { seq: seq.slice(), cost });
  }

  /** The pooled routes, cheapest per job first. */
  columns(): { seq: number[]; cost: number }[] {
    return [...this.byKey.values()].sort((a, b) => a.cost / a.seq.length - b.cost / b.seq.length || a.cost - b.cost);
  }
}

/** True when every farrier is interchangeable with the first (same places, shift, limits, costs and abilities). */
export function interchangeableFleet(m: Model): boolean {
  const fs = m.problem.farriers;
  const a = fs[0];
  if (!a) return false;
  return fs.every((f, i) => f.startLocation === a.startLocation && f.endLocation === a.endLocation && f.shiftStartSec === a.shiftStartSec
    && f.shiftEndSec === a.shiftEndSec && f.maxOvertimeSec === a.maxOvertimeSec && f.normalWorkSec === a.normalWorkSec && f.breakSec === a.breakSec
    && f.qualified === a.qualified && f.hasForge === a.hasForge && f.capacity === a.capacity && m.cDrive[i] === m.cDrive[0]
    && m.cMetre[i] === m.cMetre[0] && m.cOvertime[i] === m.cOvertime[0] && m.fixedCost[i] === m.fixedCost[0])
    && !m.problem.jobs.some((j) => j.pin);
}

/**
 * Picks the cheapest exact cover of the incumbent's planned jobs from the pool (at most `maxColumns`
 * routes besides the incumbent's, cheapest per job first) with at most as many routes, by
 * javascript-lp-solver's branch and bound under `timeoutMs`. Returns the new routes (farrier order
 * as in the incumbent's used routes) when they are feasible and cheaper than the incumbent, else null.
 */
export function recombine(s: State, pool: RoutePool, maxColumns = 600, timeoutMs = 1000): number[][] | null {
  const m = s.m;
  const used = s.routes.map((r, f) => ({ r, f })).filter((x) => x.r.length);
  if (used.length < 2) return null;
  const planned = new Set<number>();
  for (const { r } of used) for (const j of r) planned.add(j);
  const cols: number[][] = used.map((x) => x.r.slice());
  const seen = new Set(cols.map((c) => c.slice().sort((a, b) => a - b).join(',')));
  for (const c of pool.columns()) {
    if (cols.length >= maxColumns + used.length) break;
    if (!c.seq.every((j) => planned.has(j))) continue;
    const key = c.seq.slice().sort((a, b) => a - b).join(',');
    if (seen.has(key)) continue;
    seen.add(key);
    cols.push(c.seq);
  }
  if (cols.length === used.length) return null;
  const f0 = used[0].f;
  const costs = cols.map((c) => evalRoute(m, f0, c));
  const variables: Record<string, Record<string, number>> = {};
  const ints: Record<string, 1> = {};
  cols.forEach((c, i) => {
    if (!costs[i].feasible) return;
    const v: Record<string, number> = { cost: costs[i].cost - m.fixedCost[f0], routes: 1 };
    for (const j of c) v[`j${j}`] = 1;
    variables[`r${i}`] = v;
    ints[`r${i}`] = 1;
  });
  const constraints: Record<string, { equal?: number; max?: number }> = { routes: { max: used.length } };
  for (const j of planned) constraints[`j${j}`] = { equal: 1 };
  const res = solver.Solve({ optimize: 'cost', opType: 'min', constraints, variables, ints, options: { timeout: timeoutMs } }) as { feasible?: boolean; [k: string]: unknown };
  if (!res || !res.feasible) return null;
  const chosen: number[][] = [];
  for (let i = 0; i < cols.length; i++) {
    const x = res[`r${i}`];
    if (typeof x !== 'number' || x < 0.5) continue;
    if (Math.abs(x - 1) > 1e-6) return null; // not an integral answer (time limit): ignore it
    chosen.push(cols[i]);
  }
  // verify: every planned job exactly once, each route feasible, total strictly cheaper
  const count = new Map<number, number>();
  for (const c of chosen) for (const j of c) count.set(j, (count.get(j) ?? 0) + 1);
  if (count.size !== planned.size || [...count.values()].some((k) => k !== 1) || chosen.length > used.length) return null;
  let newCost = 0, oldCost = 0;
  for (let k = 0; k < chosen.length; k++) {
    const e = evalRoute(m, used[k].f, chosen[k]);
    if (!e.feasible) return null;
    newCost += e.cost;
  }
  for (const { f } of used) oldCost += s.evals[f].cost;
  if (!(newCost < oldCost - 1e-9 * Math.max(1, Math.abs(oldCost)))) return null;
  const routes = s.routes.map(() => [] as number[]);
  chosen.forEach((c, k) => { routes[used[k].f] = c.slice(); });
  return routes;
}
