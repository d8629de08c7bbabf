import type { Model } from './model';
import { evalRoute, newRouteCache, type RouteCache, type RouteEval } from './route-eval';

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
 * A route piece list for `State.costOf`: groups of four numbers `[source, a, b, reversed]`, where a
 * source ≥ 0 means positions a..b−1 of that farrier's current route (reversed when the fourth number
 * is 1) and source −1 means the single job `a`.
 */
export type Pieces = ArrayLike<number>;

/** The job sequence a piece list describes on the current routes. */
export function materialize(routes: number[][], P: Pieces, len = P.length): number[] {
  const out: number[] = [];
  for (let i = 0; i < len; i += 4) {
    const src = P[i], a = P[i + 1], b = P[i + 2];
    if (src < 0) { out.push(a); continue; }
    const r = routes[src];
    if (P[i + 3]) for (let k = b - 1; k >= a; k--) out.push(r[k]);
    else for (let k = a; k < b; k++) out.push(r[k]);
  }
  return out;
}

/**
 * Piece list of one insertion, reused (the engine is single-threaded and `costOf` does not recurse).
 * A plain array of small integers, like the piece lists of local search, so that `costOf` sees one
 * kind of array.
 */
const SCRATCH: number[] = [0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0];

/** Remembered cheapest insertions: per job × farrier, the route version scanned and its answer. */
interface InsertionMemo {
  ev: (RouteEval | undefined)[];
  delta: Float64Array;
  pos: Int32Array;
  /** The bound the scan ran under: with no position found, none is cheaper than this. */
  bound: Float64Array;
}

function newInsertionMemo(size: number): InsertionMemo {
  return { ev: new Array<RouteEval | undefined>(size).fill(undefined), delta: new Float64Array(size), pos: new Int32Array(size), bound: new Float64Array(size) };
}

const NONE = Object.freeze({ delta: Infinity, pos: -1 });

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
  /** Timing prefix of each feasible route (null for an infeasible one). */
  caches: (RouteCache | null)[];
  /** Each route's timing-prefix arrays, kept for reuse also while `caches` holds null for an infeasible route. */
  private buffers: RouteCache[];
  /**
   * own[f] = 1 when this state's arrays for route f (ready, latest, timing prefix) are its alone and
   * may be overwritten in place. A clone shares them with its source until either refreshes the
   * route; a search step then allocates once per route it changes, not once per refresh.
   */
  private own: Uint8Array;
  /** Cheapest insertions found so far, by job and route version; shared by clones (`bestPosition`). */
  private memo: InsertionMemo;
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
    this.buffers = this.routes.map((_, f) => newRouteCache(0, m.shiftStart[f]));
    this.caches = this.buffers.slice();
    this.own = new Uint8Array(m.nFarriers);
    this.memo = newInsertionMemo(m.nJobs * m.nFarriers);
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
    s.caches = this.caches.slice();
    s.buffers = this.buffers.slice();
    s.own = new Uint8Array(this.own.length);
    s.memo = this.memo;
    this.own.fill(0);
    s.unassigned = new Set(this.unassigned);
    s.cost = this.cost;
    s.touched = new Set();
    return s;
  }

  /**
   * A copy of this plan priced under `m`, a model of the same day that differs only in leave-out
   * costs (`scaleOptionalLeaveOut`): routes and their evaluations carry over unchanged. Under its
   * own model it is a plain `clone`.
   */
  rebase(m: Model): State {
    if (m === this.m) return this.clone();
    if (m.nJobs !== this.m.nJobs || m.nFarriers !== this.m.nFarriers || m.arcSec !== this.m.arcSec) throw new Error('rebase: not the same day');
    const s = this.clone();
    (s as { m: Model }).m = m;
    s.recomputeCost();
    return s;
  }

  recomputeCost(): number {
    this.cost = this.priceUnder(this.m);
    return this.cost;
  }

  /** This plan's cost under `m`, a model of the same day that may price leaving jobs out differently. */
  costUnder(m: Model): number {
    return m === this.m ? this.cost : this.priceUnder(m);
  }

  /**
   * Routes plus leave-out costs under `m`. The mandatory jobs left out (1e13 each, whole numbers, so
   * summed exactly) are added last, to the rest summed on its own: added among the other terms, the
   * order in which jobs went out moved the total by a few thousandths of a cent at that size, and two
   * equal plans could then differ, which made nearly every accepted step on such a day a "new best".
   */
  private priceUnder(m: Model): number {
    let c = 0, mandatoryOut = 0;
    for (const e of this.evals) c += e.cost;
    for (const j of this.unassigned) {
      if (m.mandatory[j]) mandatoryOut += m.leaveOutCost[j];
      else c += m.leaveOutCost[j];
    }
    return c + mandatoryOut;
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
    let ready = this.ready[f], latest = this.latest[f], cache = this.buffers[f];
    if (!this.own[f] || ready.length < n) {
      // room for a few more jobs, so that the insertions of one search step reuse the arrays
      const room = n + 8;
      ready = new Float64Array(room);
      latest = new Float64Array(room + 1);
      cache = newRouteCache(room, m.shiftStart[f]);
      this.ready[f] = ready;
      this.latest[f] = latest;
      this.buffers[f] = cache;
      this.own[f] = 1;
    }
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
    cache.breakStart = 0; cache.breakAtHome = false; cache.end = m.shiftStart[f];
    this.evals[f] = evalRoute(m, f, r, false, cache);
    this.caches[f] = this.evals[f].feasible ? cache : null;
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
   * Exact cost of farrier f doing the sequence the pieces describe (Infinity when a rule breaks),
   * without building it: the same rules as `evalRoute`, re-using the route's timing prefix when the
   * pieces start with its first jobs and stopping early once its own tail is back on its old times.
   * Only the first `len` numbers of P are read.
   */
  costOf(f: number, P: Pieces, len = P.length): number {
    const m = this.m, N = m.nJobs;
    if (m.hasPositionPins) {
      const e = evalRoute(m, f, materialize(this.routes, P, len));
      return e.feasible ? e.cost : Infinity;
    }
    const np = len >> 2;
    let total = 0;
    for (let i = 0; i < np; i++) total += P[4 * i] < 0 ? 1 : P[4 * i + 2] - P[4 * i + 1];
    if (total === 0) return 0;
    const far = m.problem.farriers[f];
    const hasBreak = far.breakSec > 0 && far.breakWindow !== null;
    const bwS = hasBreak ? far.breakWindow!.startSec : 0, bwE = hasBreak ? far.breakWindow!.endSec : 0, bSec = far.breakSec;
    const own = this.routes[f], n0 = own.length, c = this.caches[f];
    const cap = m.capacity[f], elig = m.eligible, base = f * N;
    const fromArc = m.fromHomeArc[f], fromT = m.fromHomeTravel[f], fromM = m.fromHomeM[f];
    let ready: number, breakDone: boolean, atHome = false, breakStart = 0;
    let drive = 0, dist = 0, load = 0, firstStart = 0, firstJob = -1, prev = -1;
    let pi = 0;
    if (c && P[0] === f && P[3] === 0 && P[1] === 0 && P[2] > 0) {
      const L = P[2] - 1;
      prev = own[L];
      ready = c.start[L] + m.serviceSec[prev];
      breakDone = !hasBreak || c.breakDone[L] === 1;
      if (hasBreak && c.breakDone[L]) { breakStart = c.breakStart; atHome = c.breakAtHome; }
      drive = c.drive[L]; dist = c.dist[L]; load = c.load[L];
      firstStart = c.start[0]; firstJob = own[0];
      pi = 1;
    } else {
      ready = m.shiftStart[f];
      breakDone = !hasBreak;
    }
    const last = np - 1;
    const mergeOk = c !== null && last >= pi && P[4 * last] === f && P[4 * last + 3] === 0 && P[4 * last + 2] === n0;
    let end = -1;
    outer: for (; pi < np; pi++) {
      const src = P[4 * pi], a = P[4 * pi + 1], b = P[4 * pi + 2], rev = P[4 * pi + 3];
      const len = src < 0 ? 1 : b - a;
      const merging = mergeOk && pi === last;
      const r = src < 0 ? own : this.routes[src];
      for (let t = 0; t < len; t++) {
        const pos = rev ? b - 1 - t : a + t;
        const j = src < 0 ? a : r[pos];
        if (!elig[base + j]) return Infinity;
        load += m.demand[j];
        if (load > cap) return Infinity;
        const arc = prev < 0 ? fromArc[j] : m.arcSec[prev * N + j];
        const w = m.windows[j];
        let st = earliestIn(w, ready + arc);
        if (!breakDone && (st >= bwS || st === Infinity)) {
          const bb = ready > bwS ? ready : bwS;
          if (bb > bwE) return Infinity;
          breakStart = bb; breakDone = true; atHome = prev < 0;
          st = earliestIn(w, bb + bSec + arc);
        }
        if (st === Infinity) return Infinity;
        if (prev < 0) { firstStart = st; firstJob = j; drive += fromT[j]; dist += fromM[j]; }
        else { drive += m.travelSec[prev * N + j]; dist += m.arcM[prev * N + j]; }
        ready = st + m.serviceSec[j];
        prev = j;
        if (merging && st === c!.start[pos] && (breakDone ? 1 : 0) === c!.breakDone[pos]) {
          // the rest of the route is timed exactly as before
          const lastPos = n0 - 1;
          drive += c!.drive[lastPos] - c!.drive[pos] + m.toHomeTravel[f][own[lastPos]];
          dist += c!.dist[lastPos] - c!.dist[pos] + m.toHomeM[f][own[lastPos]];
          load += c!.load[lastPos] - c!.load[pos];
          if (load > cap) return Infinity;
          end = c!.end;
          break outer;
        }
      }
    }
    if (end < 0) {
      if (!breakDone) {
        const bb = ready > bwS ? ready : bwS;
        if (bb > bwE) return Infinity;
        breakStart = bb; breakDone = true;
        ready = bb + bSec;
      }
      end = ready + m.toHomeTravel[f][prev];
      drive += m.toHomeTravel[f][prev];
      dist += m.toHomeM[f][prev];
    }
    if (end > m.endLimit[f]) return Infinity;
    const start = atHome ? breakStart + bSec : firstStart - fromArc[firstJob];
    const workSec = end - start - (hasBreak && !atHome ? bSec : 0);
    const overtime = workSec > far.normalWorkSec ? workSec - far.normalWorkSec : 0;
    if (overtime > far.maxOvertimeSec) return Infinity;
    return m.fixedCost[f] + m.cDrive[f] * drive + m.cMetre[f] * dist + m.cOvertime[f] * overtime;
  }

  /**
   * Cheapest position for job j in route f, skipping each position with probability `blink`, or
   * delta Infinity when none beats `bound`. A route's evaluation object is replaced whenever the route
   * changes and shared by clones while it does not, so the blink-free answer is remembered per job
   * and route version: a search step puts its removed jobs back into mostly the same untouched
   * routes as the steps before it. Blinks are then drawn on the answer: with probability `blink`
   * its position is skipped and the rest are scanned with blinks, which is the same distribution as
   * skipping every position independently.
   */
  bestPosition(j: number, f: number, blink: number, rnd: () => number, bound = Infinity): { delta: number; pos: number } {
    const ev = this.evals[f], memo = this.memo, k = j * this.m.nFarriers + f;
    let delta: number, pos: number;
    if (ev.feasible && memo.ev[k] === ev && (memo.pos[k] >= 0 || bound <= memo.bound[k])) {
      delta = memo.delta[k]; pos = memo.pos[k];
      if (pos < 0 || delta >= bound) return NONE;
    } else {
      const b = this.scanPositions(j, f, 0, rnd, bound, -1);
      delta = b.delta; pos = b.pos;
      if (ev.feasible) { memo.ev[k] = ev; memo.delta[k] = delta; memo.pos[k] = pos; memo.bound[k] = bound; }
      if (pos < 0) return NONE;
    }
    if (blink > 0 && rnd() < blink) return this.scanPositions(j, f, blink, rnd, bound, pos);
    return { delta, pos };
  }

  /**
   * The scan behind `bestPosition`. Each position is first priced by its change in drive and distance
   * alone, in constant time: one that cannot beat the best so far (or `bound`) is skipped before any
   * timing check, since overtime and breaks almost never make an insertion cheaper than its added
   * driving. The rest are checked against the route's time slack (Savelsbergh: ready times forward,
   * latest starts backward) and, when the model needs exact checks, re-timed by `costOf`. The scan
   * stops once the farrier is free only after j's last window has closed: ready times never decrease
   * along a route, so no later position can work. Position `skip` is not considered.
   */
  private scanPositions(j: number, f: number, blink: number, rnd: () => number, bound: number, skip: number): { delta: number; pos: number } {
    const m = this.m, N = m.nJobs;
    let best = bound, pos = -1;
    const ev = this.evals[f];
    if (!m.eligible[f * N + j] || ev.load + m.demand[j] > m.capacity[f]) return NONE;
    const w = m.windows[j];
    if (w.length === 0) return NONE;
    const lastEnd = w[w.length - 1];
    const r = this.routes[f], n = r.length, ready = this.ready[f], latest = this.latest[f];
    const arcSec = m.arcSec, travelSec = m.travelSec, arcM = m.arcM, windows = m.windows;
    const fromArc = m.fromHomeArc[f], fromT = m.fromHomeTravel[f], fromM = m.fromHomeM[f], toT = m.toHomeTravel[f], toM = m.toHomeM[f];
    const cD = m.cDrive[f], cM = m.cMetre[f], fixed = n === 0 ? m.fixedCost[f] : 0, svc = m.serviceSec[j], jN = j * N;
    const exact = m.needsExact, P = SCRATCH;
    for (let p = 0; p <= n; p++) {
      if (p > 0 && ready[p - 1] > lastEnd) break;
      if (p === skip || (blink > 0 && rnd() < blink)) continue;
      const prev = p > 0 ? r[p - 1] : -1, next = p < n ? r[p] : -1;
      let dT: number, dM: number;
      if (next >= 0) {
        if (prev < 0) {
          dT = fromT[j] + travelSec[jN + next] - fromT[next];
          dM = fromM[j] + arcM[jN + next] - fromM[next];
        } else {
          dT = travelSec[prev * N + j] + travelSec[jN + next] - travelSec[prev * N + next];
          dM = arcM[prev * N + j] + arcM[jN + next] - arcM[prev * N + next];
        }
      } else if (prev < 0) {
        dT = fromT[j] + toT[j];
        dM = fromM[j] + toM[j];
      } else {
        dT = travelSec[prev * N + j] + toT[j] - toT[prev];
        dM = arcM[prev * N + j] + toM[j] - toM[prev];
      }
      let d = cD * dT + cM * dM + fixed;
      if (d >= best) continue;
      const s = earliestIn(w, (p > 0 ? ready[p - 1] : m.shiftStart[f]) + (prev < 0 ? fromArc[j] : arcSec[prev * N + j]));
      if (s === Infinity) continue;
      const rj = s + svc;
      if (next >= 0 ? earliestIn(windows[next], rj + arcSec[jN + next]) > latest[p] : rj + toT[j] > latest[n]) continue;
      if (exact) {
        P[0] = f; P[1] = 0; P[2] = p; P[3] = 0;
        P[4] = -1; P[5] = j; P[6] = 0; P[7] = 0;
        P[8] = f; P[9] = p; P[10] = n; P[11] = 0;
        const c = this.costOf(f, P);
        if (c === Infinity) continue;
        d = c - ev.cost;
      }
      if (d < best) { best = d; pos = p; }
    }
    return pos < 0 ? NONE : { delta: best, pos };
  }
}
