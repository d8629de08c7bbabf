import type { Model } from './model';
import { evalRoute, type RouteEval } from './route-eval';

// Local copies of the window look-ups: this is the hottest code in the engine, and a cross-module
// call goes through a binding getter once transpiled.
function earliestIn(w: Float64Array, t: number): number {
  for (let k = 0; k < w.length; k += 2) if (t <= w[k + 1]) return t < w[k] ? w[k] : t;
  return Infinity;
}
function latestIn(w: Float64Array, t: number): number {
  for (let k = w.length - 2; k >= 0; k -= 2) if (t >= w[k]) return t > w[k + 1] ? w[k + 1] : t;
  return -Infinity;
}

/**
 * A plan under search: one job sequence per farrier plus the left-out jobs. Each route keeps
 * forward ready times and backward latest starts (Savelsbergh's time slack), so that inserting a
 * job anywhere is checked in constant time; the exact evaluator then confirms the move when breaks,
 * overtime or position pins make the constant-time check only a necessary condition.
 */
export class State {
  routes: number[][];
  evals: RouteEval[];
  /** ready[r][k]: time the farrier is free after job k (no break); latest[r][k]: latest feasible work start of job k; latest[r][n]: latest arrival home. */
  ready: Float64Array[];
  latest: Float64Array[];
  routeOf: Int32Array;
  unassigned: Set<number>;
  cost = 0;
  /** Routes refreshed since this state was cloned (the part a search step changed). */
  touched = new Set<number>();

  constructor(readonly m: Model) {
    this.routes = Array.from({ length: m.nFarriers }, () => []);
    this.evals = this.routes.map((r, f) => evalRoute(m, f, r));
    this.ready = this.routes.map(() => new Float64Array(0));
    this.latest = this.routes.map((_, f) => Float64Array.of(m.endLimit[f]));
    this.routeOf = new Int32Array(m.nJobs).fill(-1);
    this.unassigned = new Set(Array.from({ length: m.nJobs }, (_, j) => j));
    this.recomputeCost();
  }

  clone(): State {
    const s = Object.create(State.prototype) as State;
    (s as { m: Model }).m = this.m;
    s.routes = this.routes.map((r) => r.slice());
    s.evals = this.evals.slice();
    s.ready = this.ready.slice();
    s.latest = this.latest.slice();
    s.routeOf = this.routeOf.slice();
    s.unassigned = new Set(this.unassigned);
    s.cost = this.cost;
    s.touched = new Set();
    return s;
  }

  recomputeCost(): number {
    let c = 0;
    for (const e of this.evals) c += e.cost;
    for (const j of this.unassigned) c += this.m.leaveOutCost[j];
    this.cost = c;
    return c;
  }

  usedRoutes(): number {
    let k = 0;
    for (const r of this.routes) if (r.length) k++;
    return k;
  }

  /** Rebuilds route f's caches and exact evaluation after its sequence changed. */
  refresh(f: number): void {
    const m = this.m, N = m.nJobs, r = this.routes[f];
    const n = r.length;
    const ready = new Float64Array(n), latest = new Float64Array(n + 1);
    let t = m.shiftStart[f], prev = -1;
    for (let k = 0; k < n; k++) {
      const j = r[k];
      const s = earliestIn(m.windows[j], t + (prev < 0 ? m.fromHomeArc[f][j] : m.arcSec[prev * N + j]));
      t = s + m.serviceSec[j];
      ready[k] = t;
      prev = j;
      this.routeOf[j] = f;
    }
    latest[n] = m.endLimit[f];
    for (let k = n - 1; k >= 0; k--) {
      const j = r[k];
      const back = k === n - 1 ? m.toHomeTravel[f][j] : m.arcSec[j * N + r[k + 1]];
      latest[k] = latestIn(m.windows[j], latest[k + 1] - back - m.serviceSec[j]);
    }
    this.ready[f] = ready;
    this.latest[f] = latest;
    this.evals[f] = evalRoute(m, f, r);
    this.touched.add(f);
  }

  refreshAll(): void {
    this.routeOf.fill(-1);
    for (let f = 0; f < this.routes.length; f++) this.refresh(f);
    this.unassigned = new Set();
    for (let j = 0; j < this.m.nJobs; j++) if (this.routeOf[j] < 0) this.unassigned.add(j);
    this.recomputeCost();
  }

  /** Removes job j from wherever it is; it becomes unassigned. Caches of its route are refreshed. */
  remove(j: number): void {
    const f = this.routeOf[j];
    if (f < 0) return;
    const r = this.routes[f];
    r.splice(r.indexOf(j), 1);
    this.routeOf[j] = -1;
    this.unassigned.add(j);
    this.refresh(f);
  }

  /** Removes several jobs, refreshing each touched route once. */
  removeMany(jobs: number[]): void {
    const touched = new Set<number>();
    for (const j of jobs) {
      const f = this.routeOf[j];
      if (f < 0) continue;
      const r = this.routes[f];
      r.splice(r.indexOf(j), 1);
      this.routeOf[j] = -1;
      this.unassigned.add(j);
      touched.add(f);
    }
    for (const f of touched) this.refresh(f);
    this.recomputeCost();
  }

  insert(j: number, f: number, p: number): void {
    this.routes[f].splice(p, 0, j);
    this.unassigned.delete(j);
    this.refresh(f);
  }

  /**
   * Cheapest position for job j in route f (skipping each position with probability `blink`), or
   * delta Infinity. Stops scanning once the farrier is free only after j's last window has closed:
   * ready times never decrease along a route, so no later position can work.
   */
  bestPosition(j: number, f: number, blink: number, rnd: () => number, bound = Infinity): { delta: number; pos: number } {
    const m = this.m;
    let best = bound, pos = -1;
    if (!m.eligible[f * m.nJobs + j] || this.evals[f].load + m.demand[j] > m.capacity[f]) return { delta: best, pos };
    const w = m.windows[j];
    if (w.length === 0) return { delta: best, pos };
    const lastEnd = w[w.length - 1];
    const r = this.routes[f], ready = this.ready[f];
    for (let p = 0; p <= r.length; p++) {
      if (p > 0 && ready[p - 1] > lastEnd) break;
      if (blink > 0 && rnd() < blink) continue;
      const d = this.insertionDelta(j, f, p, best);
      if (d < best) { best = d; pos = p; }
    }
    return pos < 0 ? { delta: Infinity, pos } : { delta: best, pos };
  }

  /**
   * Cost change of inserting job j into route f at position p, or Infinity when infeasible.
   * Constant time from the caches; when the model needs exact checks the candidate is re-evaluated,
   * unless its drive-and-distance change alone already reaches `bound` (the best found so far):
   * overtime and breaks almost never make an insertion cheaper than its added driving.
   */
  insertionDelta(j: number, f: number, p: number, bound = Infinity): number {
    const m = this.m, N = m.nJobs;
    if (!m.eligible[f * N + j]) return Infinity;
    const r = this.routes[f], n = r.length;
    const ev = this.evals[f];
    if (ev.load + m.demand[j] > m.capacity[f]) return Infinity;
    const prev = p > 0 ? r[p - 1] : -1;
    const readyPrev = p > 0 ? this.ready[f][p - 1] : m.shiftStart[f];
    const s = earliestIn(m.windows[j], readyPrev + (prev < 0 ? m.fromHomeArc[f][j] : m.arcSec[prev * N + j]));
    if (s === Infinity) return Infinity;
    const rj = s + m.serviceSec[j];
    let dT: number, dM: number;
    if (p < n) {
      const next = r[p];
      const sn = earliestIn(m.windows[next], rj + m.arcSec[j * N + next]);
      if (sn > this.latest[f][p]) return Infinity;
      if (prev < 0) {
        dT = m.fromHomeTravel[f][j] + m.travelSec[j * N + next] - m.fromHomeTravel[f][next];
        dM = m.fromHomeM[f][j] + m.arcM[j * N + next] - m.fromHomeM[f][next];
      } else {
        dT = m.travelSec[prev * N + j] + m.travelSec[j * N + next] - m.travelSec[prev * N + next];
        dM = m.arcM[prev * N + j] + m.arcM[j * N + next] - m.arcM[prev * N + next];
      }
    } else {
      if (rj + m.toHomeTravel[f][j] > this.latest[f][n]) return Infinity;
      if (prev < 0) {
        dT = m.fromHomeTravel[f][j] + m.toHomeTravel[f][j];
        dM = m.fromHomeM[f][j] + m.toHomeM[f][j];
      } else {
        dT = m.travelSec[prev * N + j] + m.toHomeTravel[f][j] - m.toHomeTravel[f][prev];
        dM = m.arcM[prev * N + j] + m.toHomeM[f][j] - m.toHomeM[f][prev];
      }
    }
    if (m.needsExact) {
      if (m.cDrive[f] * dT + m.cMetre[f] * dM + (n === 0 ? m.fixedCost[f] : 0) >= bound) return Infinity;
      const seq = r.slice();
      seq.splice(p, 0, j);
      const e = evalRoute(m, f, seq);
      return e.feasible ? e.cost - ev.cost : Infinity;
    }
    return m.cDrive[f] * dT + m.cMetre[f] * dM + (n === 0 ? m.fixedCost[f] : 0);
  }
}
