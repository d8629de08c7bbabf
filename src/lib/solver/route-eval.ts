import type { Model } from './model';

// Local copies of the window look-ups: this is the hottest code in the engine, and a cross-module
// call goes through a binding getter once transpiled.
function earliestIn(w: Float64Array, t: number): number {
  for (let k = 0; k < w.length; k += 2) if (t <= w[k + 1]) return t < w[k] ? w[k] : t;
  return Infinity;
}

/**
 * Exact timing and cost of one farrier's job sequence in the search model. This is the engine's own
 * evaluator (the checker in checker.ts is a separate re-implementation working from the raw problem).
 *
 * Timing rules (also in docs/solver.md):
 * - The farrier is ready at home at shiftStartSec; arriving at a barn from elsewhere costs the drive
 *   plus the barn's set-up; a job's work starts at the earliest time inside one of its start windows.
 * - The break (if any) is taken in the first gap — at home before leaving, between two jobs, or before
 *   driving home — after which the next job would start at or after the break window opens (or in the
 *   last gap). It starts at max(ready, breakWindow.startSec) and must start by breakWindow.endSec.
 * - The farrier leaves home as late as possible without moving the first job: the day starts at
 *   first work start − set-up − drive (or at the end of a break taken at home).
 * - workSec = day end − day start − break taken during the day; overtime = workSec − normalWorkSec.
 */
export interface RouteEval {
  feasible: boolean;
  cost: number;
  driveSec: number;
  distanceM: number;
  workSec: number;
  overtimeSec: number;
  startSec: number;
  endSec: number;
  load: number;
  /** Work start of each job, when `withTimes`. */
  jobStart?: number[];
  breakStartSec?: number;
  /** Gap index the break falls in: 0 = at home before the first job, k = after the k-th job. */
  breakGap?: number;
}

const INFEASIBLE: RouteEval = Object.freeze({ feasible: false, cost: Infinity, driveSec: 0, distanceM: 0, workSec: 0, overtimeSec: 0, startSec: 0, endSec: 0, load: 0 }) as RouteEval;
const EMPTY: RouteEval = Object.freeze({ feasible: true, cost: 0, driveSec: 0, distanceM: 0, workSec: 0, overtimeSec: 0, startSec: 0, endSec: 0, load: 0 }) as RouteEval;

/**
 * Per-route timing prefix that `evalRoute` fills for `State.refresh`: for each position k, the work
 * start of job k and, after job k, whether the break is behind, the cumulative drive, distance and
 * load. A candidate sequence that keeps a route's first jobs starts from these values; one that ends
 * with the route's own tail stops re-timing as soon as a tail job starts exactly when it used to
 * (with the same break status): everything after it is then unchanged.
 */
export interface RouteCache {
  start: Float64Array;
  breakDone: Uint8Array;
  drive: Float64Array;
  dist: Float64Array;
  load: Float64Array;
  breakStart: number;
  breakAtHome: boolean;
  end: number;
}

/** An empty timing prefix for a route of n jobs (arrays filled by `evalRoute`). */
export function newRouteCache(n: number, shiftStart: number): RouteCache {
  return { start: new Float64Array(n), breakDone: new Uint8Array(n), drive: new Float64Array(n), dist: new Float64Array(n), load: new Float64Array(n), breakStart: 0, breakAtHome: false, end: shiftStart };
}

/**
 * Times and costs farrier f doing `jobs` in order; `feasible: false` (cost Infinity) on the first
 * broken rule. With `cache`, also fills the route's timing prefix (meaningful only when feasible).
 */
export function evalRoute(m: Model, f: number, jobs: ArrayLike<number>, withTimes = false, cache?: RouteCache): RouteEval {
  const n = jobs.length;
  if (n === 0) return EMPTY;
  const N = m.nJobs;
  const far = m.problem.farriers[f];
  const hasBreak = far.breakSec > 0 && far.breakWindow !== null;
  const bwS = hasBreak ? far.breakWindow!.startSec : 0, bwE = hasBreak ? far.breakWindow!.endSec : 0;
  let breakDone = !hasBreak;
  let breakStart = -1, breakGap = -1;
  let ready = m.shiftStart[f];
  let drive = 0, dist = 0, load = 0;
  const cap = m.capacity[f];
  const elig = m.eligible, base = f * N;
  const starts = withTimes ? new Array<number>(n) : undefined;
  let firstStart = 0;
  let prev = -1;
  for (let k = 0; k < n; k++) {
    const j = jobs[k];
    if (!elig[base + j]) return INFEASIBLE;
    load += m.demand[j];
    if (load > cap) return INFEASIBLE;
    const arc = prev < 0 ? m.fromHomeArc[f][j] : m.arcSec[prev * N + j];
    let s = earliestIn(m.windows[j], ready + arc);
    if (!breakDone && (s >= bwS || s === Infinity)) {
      const b = ready > bwS ? ready : bwS;
      if (b > bwE) return INFEASIBLE;
      breakStart = b; breakGap = k; breakDone = true;
      if (cache) { cache.breakStart = b; cache.breakAtHome = k === 0; }
      s = earliestIn(m.windows[j], b + far.breakSec + arc);
    }
    if (s === Infinity) return INFEASIBLE;
    if (k === 0) firstStart = s;
    if (starts) starts[k] = s;
    if (prev < 0) { drive += m.fromHomeTravel[f][j]; dist += m.fromHomeM[f][j]; }
    else { drive += m.travelSec[prev * N + j]; dist += m.arcM[prev * N + j]; }
    if (cache) { cache.start[k] = s; cache.breakDone[k] = breakDone ? 1 : 0; cache.drive[k] = drive; cache.dist[k] = dist; cache.load[k] = load; }
    ready = s + m.serviceSec[j];
    prev = j;
  }
  if (!breakDone) {
    const b = ready > bwS ? ready : bwS;
    if (b > bwE) return INFEASIBLE;
    breakStart = b; breakGap = n; breakDone = true;
    if (cache) cache.breakStart = b;
    ready = b + far.breakSec;
  }
  const end = ready + m.toHomeTravel[f][prev];
  if (cache) cache.end = end;
  drive += m.toHomeTravel[f][prev];
  dist += m.toHomeM[f][prev];
  if (end > m.endLimit[f]) return INFEASIBLE;
  let start: number;
  let breakInDay = hasBreak ? far.breakSec : 0;
  if (hasBreak && breakGap === 0) { start = breakStart + far.breakSec; breakInDay = 0; }
  else start = firstStart - m.fromHomeArc[f][jobs[0]];
  const workSec = end - start - breakInDay;
  const overtime = workSec > far.normalWorkSec ? workSec - far.normalWorkSec : 0;
  if (overtime > far.maxOvertimeSec) return INFEASIBLE;
  for (let k = 0; k < n; k++) {
    const pos = m.pinPosition[jobs[k]];
    if (pos > 0 && stopIndexOf(m, jobs, k) !== pos) return INFEASIBLE;
  }
  const cost = m.fixedCost[f] + m.cDrive[f] * drive + m.cMetre[f] * dist + m.cOvertime[f] * overtime;
  const r: RouteEval = { feasible: true, cost, driveSec: drive, distanceM: dist, workSec, overtimeSec: overtime, startSec: start, endSec: end, load };
  if (withTimes) { r.jobStart = starts; if (hasBreak) { r.breakStartSec = breakStart; r.breakGap = breakGap; } }
  return r;
}

/** 1-based stop index of the k-th job: a stop is a maximal run of consecutive jobs at one barn. */
export function stopIndexOf(m: Model, jobs: ArrayLike<number>, k: number): number {
  let stop = 1;
  for (let i = 1; i <= k; i++) if (m.jobBarn[jobs[i]] !== m.jobBarn[jobs[i - 1]]) stop++;
  return stop;
}
