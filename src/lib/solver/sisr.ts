import type { Model } from './model';
import type { Rng } from './random';
import type { State } from './state';
import type { RouteEval } from './route-eval';
import { earliestIn } from './model';

/**
 * Slack Induction by String Removals (Christiaens & Vanden Berghe, Transportation Science 2020,
 * recipe from memory): remove a few strings of consecutive jobs from routes near a random seed job,
 * then put the jobs back one by one at their cheapest position, skipping each position with a small
 * "blink" probability. Parameters as in the paper: c̄ = 10 average removed, L_max = 10, blink 0.01.
 */
export interface SisrParams {
  avgRemoved: number;
  maxString: number;
  blinkRate: number;
  splitRate: number;
}

/** The paper's parameter values. */
export const DEFAULT_SISR: SisrParams = { avgRemoved: 10, maxString: 10, blinkRate: 0.01, splitRate: 0.5 };

/** Removes strings of jobs around a random seed job; returns the removed jobs. */
export function ruin(s: State, rng: Rng, p: SisrParams): number[] {
  return ruinAround(s, rng, p).removed;
}

/**
 * The ruin step, also returning the seed job the strings were taken around: a random planned job,
 * or `seedJob` when given. A left-out job as the seed takes no string itself; the routes of its
 * nearest planned jobs are ruined.
 */
export function ruinAround(s: State, rng: Rng, p: SisrParams, seedJob = -1): { removed: number[]; seed: number } {
  const m = s.m;
  let total = 0, used = 0;
  for (const r of s.routes) if (r.length) { total += r.length; used++; }
  if (used === 0) return { removed: [], seed: -1 };
  const avgCard = total / used;
  const lsMax = Math.min(p.maxString, avgCard);
  const ksMax = (4 * p.avgRemoved) / (1 + lsMax) - 1;
  const ks = Math.floor(rng.next() * ksMax) + 1;
  // seed: the given job, else a random assigned one
  let seed = seedJob;
  for (let tries = 0; tries < 50 && seed < 0; tries++) {
    const j = rng.int(m.nJobs);
    if (s.routeOf[j] >= 0) seed = j;
  }
  if (seed < 0) for (let j = 0; j < m.nJobs; j++) if (s.routeOf[j] >= 0) { seed = j; break; }
  const removed: number[] = [];
  const ruined = new Set<number>();
  const visit = (c: number) => {
    const f = s.routeOf[c];
    if (f < 0 || ruined.has(f)) return;
    const r = s.routes[f];
    const lmax = Math.min(r.length, lsMax);
    const l = Math.floor(rng.next() * lmax) + 1;
    const pos = r.indexOf(c);
    if (l >= r.length || rng.next() < p.splitRate) {
      // string: l consecutive jobs containing c
      const startMin = Math.max(0, pos - l + 1), startMax = Math.min(pos, r.length - l);
      const st = startMin + rng.int(startMax - startMin + 1);
      for (let k = st; k < st + l; k++) removed.push(r[k]);
    } else {
      // split string: l + mm consecutive jobs containing c, keep mm in the middle
      let mm = 1;
      while (l + mm < r.length && rng.next() < 0.5) mm++;
      const len = l + mm;
      const startMin = Math.max(0, pos - len + 1), startMax = Math.min(pos, r.length - len);
      const st = startMin + rng.int(startMax - startMin + 1);
      const keepAt = st + rng.int(l + 1);
      for (let k = st; k < st + len; k++) if (k < keepAt || k >= keepAt + mm) removed.push(r[k]);
    }
    ruined.add(f);
  };
  visit(seed);
  const nb = m.neighbours[seed];
  for (let k = 0; k < nb.length && ruined.size < ks; k++) visit(nb[k]);
  s.removeMany(removed);
  return { removed, seed };
}

/** A random left-out job that some farrier could do (not `hopeless`), or −1 when there is none. */
export function randomLeftOut(s: State, rng: Rng, hopeless: Uint8Array): number {
  let count = 0;
  for (const j of s.unassigned) if (!hopeless[j]) count++;
  if (count === 0) return -1;
  let k = rng.int(count);
  for (const j of s.unassigned) if (!hopeless[j] && k-- === 0) return j;
  return -1;
}

/** Up to this many jobs left out counts as a day with few left out (see `leftOutCandidates`). */
export const FEW_LEFT_OUT = 40;

/**
 * The left-out jobs a recreate step should try after putting back the jobs just removed: all of
 * them on a day with few left out, otherwise those near the ruined area and a few random ones.
 * Trying every left-out job each time would make an iteration cost grow with the number left out
 * (hundreds on large days) without helping the search.
 */
export function leftOutCandidates(s: State, rng: Rng, removed: number[], seed: number, hopeless: Uint8Array, extra = 4): number[] {
  const out: number[] = [];
  if (s.unassigned.size === removed.length) return out;
  const inList = new Set(removed);
  if (s.unassigned.size <= FEW_LEFT_OUT) {
    for (const j of s.unassigned) if (!hopeless[j] && !inList.has(j)) out.push(j);
    return out;
  }
  if (seed >= 0) {
    const nb = s.m.neighbours[seed];
    for (let k = 0; k < Math.min(20, nb.length); k++) {
      const j = nb[k];
      if (s.routeOf[j] < 0 && !hopeless[j] && !inList.has(j)) { out.push(j); inList.add(j); }
    }
  }
  const pool = [...s.unassigned].filter((j) => !hopeless[j] && !inList.has(j));
  for (let k = 0; k < extra && pool.length; k++) {
    const i = rng.int(pool.length);
    out.push(pool[i]);
    pool[i] = pool[pool.length - 1];
    pool.pop();
  }
  return out;
}

/**
 * Greedy insertion with blinks, in one of the paper's orders (random, largest demand, farthest from
 * home, closest to home). Jobs whose best insertion costs more than leaving them out stay out.
 * `allowed` restricts the routes that may receive jobs (fleet minimisation keeps empty routes closed).
 */
export function recreate(s: State, rng: Rng, p: SisrParams, allowed?: Uint8Array, only?: number[]): void {
  const m = s.m;
  const jobs = only ? only.slice() : [...s.unassigned];
  const order = rng.next() * 11;
  if (order < 4) rng.shuffle(jobs);
  else if (order < 8) { rng.shuffle(jobs); jobs.sort((a, b) => m.demand[b] - m.demand[a]); }
  else if (order < 10) jobs.sort((a, b) => m.fromHomeTravel[0][b] - m.fromHomeTravel[0][a] || a - b);
  else jobs.sort((a, b) => m.fromHomeTravel[0][a] - m.fromHomeTravel[0][b] || a - b);
  const F = m.nFarriers;
  const routeOrder = Array.from({ length: F }, (_, i) => i);
  for (const j of jobs) {
    let best = m.leaveOutCost[j], bf = -1, bp = -1;
    rng.shuffle(routeOrder);
    let openedEmpty = false;
    for (const f of routeOrder) {
      if (allowed && !allowed[f]) continue;
      if (!m.eligible[f * m.nJobs + j]) continue;
      const n = s.routes[f].length;
      if (n === 0) {
        // identical empty routes are interchangeable: try only one per distinct farrier type
        if (openedEmpty && m.fleetObjective) continue;
        openedEmpty = true;
      }
      const b = s.bestPosition(j, f, p.blinkRate, rng.next, best);
      if (b.delta < best) { best = b.delta; bf = f; bp = b.pos; }
    }
    if (bf >= 0) s.insert(j, bf, bp);
  }
  s.recomputeCost();
}

/**
 * The recreate half of a search step: the jobs the ruin removed go back first (regret-2 or greedy
 * insertion), together with any mandatory job still left out, and the optional left-out candidates
 * only fill the room that remains. Mixed into one pass, a job left out for long often took the
 * place a removed job had and pushed that one out in turn; on days with optional jobs most steps
 * then ended in a worse plan, and the search found the better plans that leave other jobs out far
 * later (figures in docs/solver.md). `placed` sees the plan after each group of jobs went back.
 */
export function putBack(s: State, rng: Rng, p: SisrParams, removed: number[], leftOut: number[], regret: boolean, placed?: (s: State) => void): void {
  const place = (jobs: number[], allowed?: Uint8Array) => {
    if (regret) regretRecreate(s, rng, p, jobs, allowed);
    else recreate(s, rng, p, allowed, jobs);
    placed?.(s);
  };
  // a mandatory job left out (no room for it yet) goes back with the removed jobs: room is its first
  const first = removed.slice(), rest: number[] = [];
  for (const j of leftOut) (s.m.mandatory[j] ? first : rest).push(j);
  place(first);
  // a mandatory job that found no room takes the place of a planned optional job, which then
  // looks for room elsewhere
  const ejected: number[] = [];
  for (const j of first) if (s.routeOf[j] < 0 && s.m.mandatory[j]) {
    const o = ejectFor(s, j);
    if (o >= 0) ejected.push(o);
  }
  if (ejected.length) place(ejected);
  if (!rest.length) return;
  // an optional job left out is offered only the routes this step changed: each other route it was
  // offered, as a rule, in the step that last changed it (or when the job itself went out), and it
  // did not take it then (about 30 % more iterations a second on the invented days, and no worse
  // per iteration)
  const changed = new Uint8Array(s.m.nFarriers);
  for (const f of s.touched) changed[f] = 1;
  place(rest, changed);
}

/**
 * Routes in which a mandatory job could not take any optional job's place, by the route's evaluation
 * (a route's `RouteEval` is replaced whenever the route changes and shared by clones while it does
 * not), so that a job no exchange can place is not re-tried in every step against the same routes.
 */
const noExchange = new WeakMap<Model, Map<number, RouteEval[]>>();
const EXCHANGE: number[] = [0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0];

/**
 * Puts mandatory job j, which has no room of its own, in the place of the planned optional job whose
 * removal plus j's insertion in the same route costs least (the optional job's leave-out cost
 * counted). Returns the optional job taken out, or −1 when no such exchange is feasible.
 */
export function ejectFor(s: State, j: number): number {
  const m = s.m, N = m.nJobs, F = m.nFarriers, P = EXCHANGE;
  let tried = noExchange.get(m);
  if (!tried) noExchange.set(m, (tried = new Map()));
  let seen = tried.get(j);
  if (!seen) tried.set(j, (seen = new Array<RouteEval>(F)));
  let best = Infinity, bo = -1, bf = -1, bq = -1;
  for (let f = 0; f < F; f++) {
    if (!m.eligible[f * N + j] || seen[f] === s.evals[f]) continue;
    const r = s.routes[f], n = r.length, old = s.evals[f].cost;
    let feasible = false;
    for (let k = 0; k < n; k++) {
      const o = r[k];
      if (m.mandatory[o]) continue;
      const keep = m.leaveOutCost[o] - old;
      // j at position q of the route without o (q = 0..n−1), as pieces of the current route
      for (let q = 0; q < n; q++) {
        // before o the route's first q jobs keep their times: once j cannot start after them in any
        // of its windows (even without a break), no later position before o can work either
        if (q <= k && q > 0 && earliestIn(m.windows[j], s.ready[f][q - 1] + m.arcSec[r[q - 1] * N + j]) === Infinity) { q = k; continue; }
        let i = 0;
        if (q <= k) {
          if (q > 0) { P[i++] = f; P[i++] = 0; P[i++] = q; P[i++] = 0; }
          P[i++] = -1; P[i++] = j; P[i++] = 0; P[i++] = 0;
          if (k > q) { P[i++] = f; P[i++] = q; P[i++] = k; P[i++] = 0; }
          if (n > k + 1) { P[i++] = f; P[i++] = k + 1; P[i++] = n; P[i++] = 0; }
        } else {
          if (k > 0) { P[i++] = f; P[i++] = 0; P[i++] = k; P[i++] = 0; }
          P[i++] = f; P[i++] = k + 1; P[i++] = q + 1; P[i++] = 0;
          P[i++] = -1; P[i++] = j; P[i++] = 0; P[i++] = 0;
          if (n > q + 1) { P[i++] = f; P[i++] = q + 1; P[i++] = n; P[i++] = 0; }
        }
        const c = s.costOf(f, P, i);
        if (c === Infinity) continue;
        feasible = true;
        if (c + keep < best) { best = c + keep; bo = o; bf = f; bq = q; }
      }
    }
    if (!feasible) seen[f] = s.evals[f];
  }
  if (bo < 0) return -1;
  s.remove(bo);
  s.insert(j, bf, bq);
  return bo;
}

/**
 * Regret-2 recreate with blinks: of the jobs to put back, repeatedly place the one whose best and
 * second-best options (another farrier, or leaving it out) differ most, so that jobs with few good
 * places get them before greedier jobs fill the day. Only the route that received a job is
 * re-scanned after each placement. Costs about twice a greedy recreate; packs tight days better.
 */
export function regretRecreate(s: State, rng: Rng, p: SisrParams, only: number[], allowed?: Uint8Array): void {
  const m = s.m, F = m.nFarriers, n = only.length;
  const bestIn = new Float64Array(n * F), bestPos = new Int32Array(n * F);
  const scan = (i: number, f: number) => {
    const j = only[i];
    const b = s.bestPosition(j, f, p.blinkRate, rng.next, m.leaveOutCost[j]);
    bestIn[i * F + f] = b.delta;
    bestPos[i * F + f] = b.pos;
  };
  let openedEmpty = -1;
  const skipEmpty = (f: number) => {
    // identical empty routes are interchangeable in fleet mode: scan only the first one
    if (!m.fleetObjective || s.routes[f].length) return false;
    if (openedEmpty < 0) openedEmpty = f;
    return f !== openedEmpty;
  };
  for (let i = 0; i < n; i++) for (let f = 0; f < F; f++) {
    if ((allowed && !allowed[f]) || skipEmpty(f)) { bestIn[i * F + f] = Infinity; continue; }
    scan(i, f);
  }
  const left = new Uint8Array(n).fill(1);
  for (let placed = 0; placed < n; placed++) {
    let pick = -1, pickF = -1, pickScore = -Infinity;
    for (let i = 0; i < n; i++) {
      if (!left[i]) continue;
      const j = only[i];
      let b1 = m.leaveOutCost[j], b2 = m.leaveOutCost[j], f1 = -1;
      for (let f = 0; f < F; f++) {
        const c = bestIn[i * F + f];
        if (c < b1) { b2 = b1; b1 = c; f1 = f; } else if (c < b2) b2 = c;
      }
      if (f1 < 0) continue;
      const score = (b2 - b1) * (1 + 0.2 * rng.next());
      if (score > pickScore) { pickScore = score; pick = i; pickF = f1; }
    }
    if (pick < 0) break;
    const wasEmpty = s.routes[pickF].length === 0;
    s.insert(only[pick], pickF, bestPos[pick * F + pickF]);
    left[pick] = 0;
    if (wasEmpty && pickF === openedEmpty) openedEmpty = -1;
    for (let i = 0; i < n; i++) if (left[i]) {
      scan(i, pickF);
      if (wasEmpty) for (let f = 0; f < F; f++) if (!s.routes[f].length && (!allowed || allowed[f]) && !skipEmpty(f)) scan(i, f);
    }
  }
  s.recomputeCost();
}

/**
 * Regret-2 insertion: repeatedly place the job whose best and second-best routes differ most, so
 * that jobs with few good options are placed first. Used to build the first plan on problems of
 * moderate size; larger ones use cheapest insertion in a fixed order.
 */
export function regretConstruct(s: State, rng: Rng, jobs?: number[]): void {
  const m = s.m, F = m.nFarriers;
  const bestIn = new Float64Array(m.nJobs * F);
  const bestPos = new Int32Array(m.nJobs * F);
  const evalRouteFor = (j: number, f: number) => {
    const b = s.bestPosition(j, f, 0, rng.next);
    bestIn[j * F + f] = b.delta;
    bestPos[j * F + f] = b.pos;
  };
  const open = jobs ?? [...s.unassigned];
  for (const j of open) for (let f = 0; f < F; f++) evalRouteFor(j, f);
  const left = new Set(open);
  while (left.size) {
    let pick = -1, pickF = -1, pickScore = -Infinity;
    for (const j of left) {
      let b1 = Infinity, b2 = Infinity, f1 = -1;
      for (let f = 0; f < F; f++) {
        const c = bestIn[j * F + f];
        if (c < b1) { b2 = b1; b1 = c; f1 = f; } else if (c < b2) b2 = c;
      }
      if (f1 < 0 || b1 >= m.leaveOutCost[j]) continue;
      const regret = (b2 === Infinity ? 1e15 : b2 - b1) + m.leaveOutCost[j] * 1e-6;
      const score = regret - b1 * 1e-9 + rng.next() * 1e-12;
      if (score > pickScore) { pickScore = score; pick = j; pickF = f1; }
    }
    if (pick < 0) break;
    s.insert(pick, pickF, bestPos[pick * F + pickF]);
    left.delete(pick);
    for (const j of left) evalRouteFor(j, pickF);
  }
  s.recomputeCost();
}

/** Cheapest insertion in a fixed order (farthest from home first); linear in routes per job. */
export function greedyConstruct(s: State, rng: Rng, jobs?: number[]): void {
  recreate(s, rng, { ...DEFAULT_SISR, blinkRate: 0 }, undefined, jobs);
}

/**
 * Annealing temperature at `progress` (0..1) through one cycle: geometric from 5 to 0.05 times the
 * cost of a typical short arc, so that the schedule scales with the problem's units (tuned on the
 * invented farrier days and a few Solomon instances).
 */
export function annealTemperature(m: Model, progress: number): number {
  const t0 = 5 * m.typicalArcCost, tf = 0.05 * m.typicalArcCost;
  return t0 * Math.pow(tf / t0, Math.min(1, progress));
}
