import { buildModel, scaleOptionalLeaveOut, type Model } from './model';
import { impossibleReason, type UnplannedReason } from './diagnose';
import { localSearch } from './moves';
import { createRng, type Rng } from './random';
import { evalRoute } from './route-eval';
import { annealTemperature, DEFAULT_SISR, FEW_LEFT_OUT, greedyConstruct, leftOutCandidates, putBack, randomLeftOut, recreate, regretConstruct, ruin, ruinAround } from './sisr';
import { State } from './state';
import { interchangeableFleet, recombine, RoutePool } from './set-partition';
import { DayRoutePool, endRouteLog, markPublished } from './day-pool';
import type { Problem } from './problem';
import type { RouteTotals } from './checker';

/**
 * Share of recreate steps that use regret insertion instead of greedy insertion, on problems of up
 * to 400 jobs (as for construction; on a 1,000-job day it lost to greedy insertion within 30 s).
 */
const REGRET_SHARE = 0.5;
/**
 * Share of search steps whose ruin is taken around a random left-out job instead of a planned one;
 * that job then goes back together with the jobs removed around it, so it competes for their room
 * instead of getting only what they leave (figures in docs/solver.md). Only on a day with few left
 * out: on an overbooked day with hundreds out, most have no room near them, and the steps went to
 * waste (one run of the 1,000-job day ended 2 % dearer after 2,000 iterations).
 */
const LEFT_OUT_SEED_SHARE = 0.25;
/** Days of up to this many jobs pool their routes for packing (`DayRoutePool`). */
const DAY_POOL_MAX_JOBS = 400;
/** The pool is emptied after a packing once it holds this many routes. */
const DAY_POOL_KEEP = 60000;
/**
 * Leave-out cost scales of optional jobs, one per annealing cycle in turn, on a day whose routes are
 * packed: every other cycle searches as if leaving an optional job out cost a fifth less, so it
 * passes through plans with one optional job more out and several days repacked around the gap.
 * New best plans are judged at full cost, and the pool keeps those cycles' routes for packing at
 * full cost. Without packing this gained nothing; with it the short run came closer to the long one
 * (figures in docs/solver.md).
 */
const LEAVE_OUT_SCALES = [1, 0.8];
/** Longest wait, under an iteration limit, for the routes of the searches beside this one. */
const EXCHANGE_WAIT_MS = 60000;

/** When to stop. At least one limit applies; with none given the engine stops after 10 seconds. */
export interface StopRule {
  maxIterations?: number;
  maxSeconds?: number;
  /** Stop after this many iterations without a new best plan (default 400 per job, at least 20,000). */
  noImprovementIterations?: number;
}

/** What the search reports while it runs (at most every 0.1 s, and at phase changes and each annealing cycle's end). */
export interface Progress {
  iterations: number;
  seconds: number;
  bestCost: number;
  unplanned: number;
  /** Mandatory jobs among the unplanned ones; `bestCost` leaves their cost out, so compare plans by this first. */
  mandatoryUnplanned: number;
  farriersUsed: number;
  phase: 'construct' | 'fleet' | 'improve';
}

/** How to run `solve`; `seed` makes the run reproducible. */
export interface SolveOptions {
  seed: number;
  stop: StopRule;
  onProgress?: (p: Progress) => void;
  /** Polled between iterations; returning true ends the search with the best plan so far (used for cancellation). */
  shouldStop?: () => boolean;
  /** Share of the budget spent removing whole routes under the fleet-then-distance objective (default 0.5). */
  fleetShare?: number;
  /**
   * Route exchange between side-by-side searches (`solveInWorker`): a search with `publish` writes
   * the routes it met there when it ends, instead of packing them itself; a search with `collect`
   * waits for the others' routes before its last packing and packs them all together. With `share`,
   * the searches also pack each other's routes at every annealing cycle end (`RouteShare`).
   */
  routeExchange?: { publish?: SharedArrayBuffer; collect?: SharedArrayBuffer[]; share?: RouteShare };
}

/**
 * Route sharing during the run between side-by-side searches: at each annealing cycle end a search
 * logs the routes it met in `mine` and packs them together with those the others logged in theirs
 * (`routeLogBuffer`), so each search's plan can take routes the other search found.
 */
export interface RouteShare { mine: SharedArrayBuffer; others: SharedArrayBuffer[] }

/** One job's work inside a stop. */
export interface PlannedJob { jobId: string; startSec: number; endSec: number }
/** One farrier's visit to one barn. */
export interface PlannedStop {
  barnId: string;
  location: number;
  /** Arrival at the barn. */
  arrivalSec: number;
  /** Set-up begins (after any wait for the barn or the owner). */
  startSec: number;
  departureSec: number;
  jobIds: string[];
  jobs: PlannedJob[];
}
/** One farrier's day: stops in order, times, drive, overtime and cost in cents. */
export interface PlannedRoute extends RouteTotals {
  stops: PlannedStop[];
}
/** The plan `solve` returns: routes, unplanned jobs with reasons, cost and run statistics. */
export interface SolveResult {
  /** One route per farrier, in the problem's order; an idle farrier has no stops and zero cost. */
  routes: PlannedRoute[];
  unplanned: { jobId: string; reason: UnplannedReason }[];
  /** Route costs plus penalties of left-out optional jobs, in cents (mandatory jobs left out are listed, not priced). */
  cost: number;
  statistics: {
    iterations: number;
    seconds: number;
    firstFeasibleSeconds: number;
    improvements: number;
    farriersUsed: number;
    stopReason: 'iterations' | 'seconds' | 'no_improvement' | 'cancelled' | 'nothing_to_do';
    /** The seed of the search that found this plan. */
    seed: number;
    /** Searches run side by side by `solveInWorker` (iterations are their total); absent for one `solve`. */
    searches?: number;
  };
}

/** A plain-sequence plan: the job indices each farrier does, in order. */
export type Sequences = number[][];

const now = () => performance.now() / 1000;

/**
 * Builds a day plan: regret insertion, a first local search, then string-removal ruin and blink
 * recreate under simulated annealing (restarted from the best plan in cycles counted in iterations,
 * the last one ending with the run), with local search on every new best plan. Under the
 * fleet-then-distance objective a route-removal phase first tries to empty whole routes.
 * Deterministic for a seed and an iteration limit; a seconds limit decides when to stop and, from
 * the pace so far, how long the last cycle is.
 */
export function solve(problem: Problem, opts: SolveOptions): SolveResult {
  const t0 = now();
  const m = buildModel(problem);
  const rng = createRng(opts.seed);
  const stop = opts.stop ?? {};
  const maxIt = stop.maxIterations ?? Infinity;
  const maxSec = stop.maxSeconds ?? (stop.maxIterations === undefined && stop.noImprovementIterations === undefined ? 10 : Infinity);
  // stop early when the search stalls: by default after 400 iterations per job (at least 20,000) without a new best plan
  const noImp = stop.noImprovementIterations ?? Math.max(20000, 400 * m.nJobs);
  let iterations = 0, improvements = 0;
  let stopReason: SolveResult['statistics']['stopReason'] = 'iterations';
  let lastProgress = -1;
  const progress = (phase: Progress['phase'], best: State, force = false) => {
    if (!opts.onProgress) return;
    const t = now() - t0;
    if (!force && t - lastProgress < 0.1) return;
    lastProgress = t;
    let mandatoryUnplanned = 0;
    for (const j of best.unassigned) mandatoryUnplanned += m.mandatory[j];
    opts.onProgress({ iterations, seconds: t, bestCost: reportedCost(m, best), unplanned: best.unassigned.size, mandatoryUnplanned, farriersUsed: best.usedRoutes(), phase });
  };
  let timeChecks = 0;
  const outOfTime = (limitSec = maxSec) => {
    if (opts.shouldStop && (timeChecks & 7) === 0 && opts.shouldStop()) { stopReason = 'cancelled'; return true; }
    if (limitSec === Infinity) { timeChecks++; return false; }
    if ((timeChecks++ & 7) !== 0) return false;
    if (now() - t0 >= limitSec) { stopReason = 'seconds'; return true; }
    return false;
  };

  // jobs no farrier could do even alone are never offered to the search again
  const hopeless = new Uint8Array(m.nJobs);
  const reasons = new Map<number, UnplannedReason>();
  for (let j = 0; j < m.nJobs; j++) {
    const why = impossibleReason(m, j);
    if (why) { hopeless[j] = 1; reasons.set(j, why); }
  }
  let best = new State(m);
  const open = [...best.unassigned].filter((j) => !hopeless[j]);
  if (m.nJobs <= 400) regretConstruct(best, rng, open); else greedyConstruct(best, rng, open);
  const firstFeasibleSeconds = now() - t0;
  localSearch(best, rng);
  progress('construct', best, true);

  let published = false;
  if (m.nJobs === 0 || m.nFarriers === 0) stopReason = 'nothing_to_do';
  else {
    if (m.fleetObjective) {
      const share = opts.fleetShare ?? 0.5;
      const r = fleetPhase(m, best, rng, Math.min(maxIt, Math.floor(maxIt * share)), maxSec === Infinity ? Infinity : maxSec * share, noImp, outOfTime, () => progress('fleet', best), t0);
      best = r.best;
      iterations += r.iterations;
    }
    let cur = best.clone();
    // annealing restarts from the best plan at the end of each cycle; cycles start short (10
    // iterations per job) and double up to 200 per job, so a short run still reaches low
    // temperatures and a long one anneals slowly; the last cycle ends with the run (`nextCycle`)
    const maxCycle = Math.max(4000, 200 * m.nJobs);
    const loopStart = now(), loopIterations = iterations;
    // farriers who differ: the routes the search meets are packed into a plan at each cycle end and
    // once more after the last step, for which a timed run keeps a tenth of its time (at most 0.25 s)
    const dayPool = packsRoutes(problem) ? new DayRoutePool(m) : null;
    const loopSec = dayPool && maxSec !== Infinity ? maxSec - Math.min(0.25, 0.1 * maxSec) : maxSec;
    // iterations still to come: exact under an iteration limit, estimated from the pace so far
    // under a time limit (the clock then only shapes the last cycle of a run it already ends)
    const iterationsLeft = () => {
      const done = iterations - loopIterations, t = now();
      if (loopSec === Infinity || done === 0 || t <= loopStart) return maxIt - iterations;
      return Math.min(maxIt - iterations, Math.floor(((loopSec - (t - t0)) * done) / (t - loopStart)));
    };
    let cycle = fitCycle(Math.min(maxCycle, Math.max(500, 10 * m.nJobs)), iterationsLeft());
    let cycleStart = 0;
    let sinceBest = 0;
    const eps = 1e-9 * Math.max(1, m.typicalArcCost);
    // the model each cycle searches under (`LEAVE_OUT_SCALES`); `best` is always priced under `m`
    const cycleModels = dayPool && m.mandatory.some((x) => x === 0)
      ? LEAVE_OUT_SCALES.map((k) => (k === 1 ? m : scaleOptionalLeaveOut(m, k)))
      : [m];
    let cycleNo = 0;
    const share = opts.routeExchange?.share;
    if (share) dayPool?.logRoutes();
    let shareCycle = 0;
    // interchangeable farriers (the benchmark fleets): recombine pooled routes at every cycle end
    const pool = m.fleetObjective && interchangeableFleet(m) ? new RoutePool() : null;
    if (pool) best.routes.forEach((r, f) => pool.add(r, best.evals[f].cost - m.fixedCost[f]));
    // every route a step passes through is a column: the ruined routes and those after each group
    // of jobs went back, not only the step's result (on invented day 5 that made the difference
    // between no gain and the long run's plan)
    const poolTouched = dayPool ? (s: State) => { for (const f of s.touched) if (s.evals[f].feasible) dayPool.add(f, s.routes[f], s.evals[f].cost); } : undefined;
    const packDay = () => {
      if (!dayPool) return;
      const routes = dayPool.recombine(best, maxSec === Infinity ? {} : { deadlineMs: (t0 + maxSec) * 1000 });
      if (dayPool.size >= DAY_POOL_KEEP) dayPool.clear();
      if (!routes) return;
      const next = best.clone();
      next.routes = routes;
      next.refreshAll();
      let planned = 0;
      for (const r of routes) planned += r.length;
      if (planned + next.unassigned.size !== m.nJobs || next.evals.some((e) => !e.feasible)) return;
      localSearch(next, rng);
      if (next.cost < best.cost - eps) { best = next; improvements++; sinceBest = 0; }
    };
    while ((stopReason as string) !== 'cancelled') {
      if (iterations >= maxIt) { stopReason = 'iterations'; break; }
      if (sinceBest >= noImp) { stopReason = 'no_improvement'; break; }
      if (outOfTime(loopSec)) break;
      if (iterations - cycleStart >= cycle) {
        cycleStart = iterations;
        cycle = nextCycle(cycle, maxCycle, iterationsLeft());
        if (dayPool && share) {
          dayPool.shareTo(share.mine, shareCycle);
          dayPool.takeFrom(share.others, shareCycle, maxSec === Infinity ? EXCHANGE_WAIT_MS : 0);
          shareCycle++;
        }
        packDay();
        if (pool) {
          const routes = recombine(best, pool);
          if (routes) {
            const next = best.clone();
            next.routes = routes;
            next.refreshAll();
            localSearch(next, rng);
            if (next.cost < best.cost - eps) { best = next; improvements++; sinceBest = 0; }
          }
        }
        progress('improve', best, true);
        const cm = cycleModels[++cycleNo % cycleModels.length];
        cur = best.rebase(cm);
      }
      const T = annealTemperature(m, (iterations - cycleStart) / cycle);
      const cand = cur.clone();
      const few = cand.unassigned.size > 0 && cand.unassigned.size <= FEW_LEFT_OUT;
      const around = few && rng.next() < LEFT_OUT_SEED_SHARE ? randomLeftOut(cand, rng, hopeless) : -1;
      const { removed, seed } = ruinAround(cand, rng, DEFAULT_SISR, around);
      if (around >= 0) removed.push(around);
      poolTouched?.(cand);
      const leftOut = leftOutCandidates(cand, rng, removed, seed, hopeless);
      putBack(cand, rng, DEFAULT_SISR, removed, leftOut, m.nJobs <= 400 && rng.next() < REGRET_SHARE, poolTouched);
      iterations++;
      sinceBest++;
      if (pool) for (const f of cand.touched) if (cand.routes[f].length) pool.add(cand.routes[f], cand.evals[f].cost - m.fixedCost[f]);
      if (cand.cost < cur.cost - T * Math.log(1 - rng.next() + 1e-300)) {
        cur = cand;
        if (cand.costUnder(m) < best.cost - eps) {
          const focus = new Set(cand.touched);
          const polished = cand.rebase(m);
          localSearch(polished, rng, 15, 50, focus);
          best = polished;
          const back = polished.rebase(cur.m);
          if (back.cost < cur.cost) cur = back;
          improvements++;
          sinceBest = 0;
        }
      }
      progress('improve', best);
    }
    // before any wait for the other search's routes below, so that it never waits for this one's next cycle
    if (share) endRouteLog(share.mine);
    const exchange = opts.routeExchange;
    if (exchange?.publish) {
      if (dayPool) { dayPool.publish(exchange.publish); published = true; }
    } else if ((stopReason as string) !== 'cancelled') {
      if (dayPool && exchange?.collect) {
        // the other searches stop at the same time; under an iteration limit they may be slower
        const waitMs = maxSec === Infinity ? EXCHANGE_WAIT_MS : Math.max(1, (t0 + maxSec) * 1000 - performance.now());
        for (const buf of exchange.collect) dayPool.collect(buf, waitMs);
      }
      packDay();
    }
  }
  // a search with no routes to give still tells the others not to wait
  if (opts.routeExchange?.publish && !published) markPublished(opts.routeExchange.publish, 0);
  // also when the search never reached its annealing loop
  if (opts.routeExchange?.share) endRouteLog(opts.routeExchange.share.mine);
  progress('improve', best, true);
  return buildResult(m, best, reasons, {
    iterations, seconds: now() - t0, firstFeasibleSeconds, improvements, farriersUsed: best.usedRoutes(), stopReason, seed: opts.seed,
  });
}

/** Whether a search on this problem pools and packs its routes (farriers who differ, 2 or more, up to 400 jobs). */
export function packsRoutes(problem: Problem): boolean {
  return problem.objective !== 'fleet-then-distance' && problem.farriers.length > 1 && problem.jobs.length <= DAY_POOL_MAX_JOBS;
}

/**
 * Length of the next annealing cycle: twice the last one, at most `maxCycle`, but no longer than the
 * iterations the run has left, so that its last cycle cools all the way down instead of being cut
 * off while still hot (study in docs/solver.md, "The last annealing cycle ends with the run").
 */
export function nextCycle(last: number, maxCycle: number, left: number): number {
  return fitCycle(Math.min(maxCycle, last * 2), left);
}

/** A cycle of `length` iterations, cut to the `left` the run still has (at least one). */
function fitCycle(length: number, left: number): number {
  return left < length ? Math.max(1, left) : length;
}

function fleetPhase(
  m: Model, start: State, rng: Rng, maxIt: number, maxSec: number, noImp: number,
  outOfTime: (limit?: number) => boolean, progress: () => void, _t0: number,
): { best: State; iterations: number } {
  let best = start;
  let iterations = 0;
  const absence = new Float64Array(m.nJobs);
  let totalDemand = 0;
  for (let j = 0; j < m.nJobs; j++) totalDemand += m.demand[j];
  const cap = m.capacity[0];
  const lb = Number.isFinite(cap) && cap > 0 ? Math.ceil(totalDemand / cap) : 1;
  const hopeless = new Set<number>();
  for (let j = 0; j < m.nJobs; j++) if (best.routeOf[j] < 0) hopeless.add(j);
  const openCount = (s: State) => { let c = 0; for (const j of s.unassigned) if (!hopeless.has(j)) c++; return c; };
  const absSum = (s: State) => { let a = 0; for (const j of s.unassigned) if (!hopeless.has(j)) a += absence[j]; return a; };
  const perAttempt = noImp === Infinity ? Infinity : noImp;
  while (best.usedRoutes() > lb) {
    // remove the route with the fewest jobs; its jobs must fit into the others
    let fMin = -1;
    for (let f = 0; f < m.nFarriers; f++) if (best.routes[f].length && (fMin < 0 || best.routes[f].length < best.routes[fMin].length)) fMin = f;
    let cur = best.clone();
    cur.removeMany(cur.routes[fMin].slice());
    const allowed = new Uint8Array(m.nFarriers);
    for (let f = 0; f < m.nFarriers; f++) if (cur.routes[f].length) allowed[f] = 1;
    let found = false, since = 0;
    while (iterations < maxIt && since < perAttempt && !outOfTime(maxSec)) {
      const cand = cur.clone();
      ruin(cand, rng, DEFAULT_SISR);
      recreate(cand, rng, DEFAULT_SISR, allowed);
      iterations++; since++;
      for (const j of cand.unassigned) if (!hopeless.has(j)) absence[j]++;
      const oc = openCount(cand), ocur = openCount(cur);
      if (oc < ocur || (oc === ocur ? absSum(cand) <= absSum(cur) : absSum(cand) < absSum(cur))) {
        if (oc < ocur) since = 0;
        cur = cand;
      }
      if (openCount(cur) === 0) { found = true; break; }
      progress();
    }
    if (!found) break;
    localSearch(cur, rng);
    best = cur;
  }
  return { best, iterations };
}

/**
 * How many mandatory jobs a plan leaves out. Its cost lists them but does not price them, so two
 * plans compare by cost only when they leave the same number out.
 */
export function mandatoryLeftOut(problem: Problem, result: SolveResult): number {
  const optional = new Set(problem.jobs.filter((j) => j.optional).map((j) => j.id));
  return result.unplanned.filter((u) => !optional.has(u.jobId)).length;
}

/** Whether a plan with `mandatoryA` mandatory jobs left out at `costA` beats one with `mandatoryB` at `costB`: fewer mandatory jobs left out first, then lower cost. */
export function betterPlan(mandatoryA: number, costA: number, mandatoryB: number, costB: number): boolean {
  return mandatoryA < mandatoryB || (mandatoryA === mandatoryB && costA < costB);
}

/**
 * The better of several plans for one problem: fewest mandatory jobs left out, then lowest cost;
 * ties go to the earlier plan. Used to pick among side-by-side searches.
 */
export function bestOf(problem: Problem, results: SolveResult[]): SolveResult {
  let best = results[0];
  for (const r of results.slice(1)) {
    if (betterPlan(mandatoryLeftOut(problem, r), r.cost, mandatoryLeftOut(problem, best), best.cost)) best = r;
  }
  return best;
}

function reportedCost(m: Model, s: State): number {
  let c = 0;
  for (const e of s.evals) c += e.cost;
  for (const j of s.unassigned) if (!m.mandatory[j]) c += m.leaveOutCost[j];
  return c;
}

/** Turns a search state into the public result, with stop times re-derived by the exact evaluator. */
export function buildResult(m: Model, s: State, reasons: Map<number, UnplannedReason>, statistics: SolveResult['statistics']): SolveResult {
  const p = m.problem;
  const routes: PlannedRoute[] = s.routes.map((seq, f) => routeDetails(m, f, seq));
  const unplanned = [...s.unassigned].sort((a, b) => a - b).map((j) => ({ jobId: p.jobs[j].id, reason: reasons.get(j) ?? ('no_room' as const) }));
  return { routes, unplanned, cost: reportedCost(m, s), statistics };
}

/** Public timing of one route (stops grouped from consecutive jobs at one barn). */
export function routeDetails(m: Model, f: number, seq: number[]): PlannedRoute {
  const p = m.problem, far = p.farriers[f];
  const e = evalRoute(m, f, seq, true);
  const stops: PlannedStop[] = [];
  if (!seq.length) return { farrierId: far.id, stops, startSec: far.shiftStartSec, endSec: far.shiftStartSec, driveSec: 0, distanceM: 0, workSec: 0, overtimeSec: 0, costCents: 0 };
  let prevDeparture = e.startSec;
  for (let k = 0; k < seq.length; k++) {
    const j = seq[k], job = p.jobs[j], barn = p.barns[m.jobBarn[j]];
    const start = e.jobStart![k];
    const newStop = k === 0 || m.jobBarn[seq[k - 1]] !== m.jobBarn[j];
    if (newStop) {
      let leave = prevDeparture;
      if (e.breakGap === k && k > 0) leave = e.breakStartSec! + far.breakSec;
      const travel = k === 0 ? m.fromHomeTravel[f][j] : m.travelSec[seq[k - 1] * m.nJobs + j];
      stops.push({ barnId: barn.id, location: barn.location, arrivalSec: leave + travel, startSec: start - barn.setupSec, departureSec: start + job.durationSec, jobIds: [], jobs: [] });
    }
    const st = stops[stops.length - 1];
    st.jobIds.push(job.id);
    st.jobs.push({ jobId: job.id, startSec: start, endSec: start + job.durationSec });
    st.departureSec = start + job.durationSec;
    prevDeparture = st.departureSec;
  }
  const r: PlannedRoute = { farrierId: far.id, stops, startSec: e.startSec, endSec: e.endSec, driveSec: e.driveSec, distanceM: e.distanceM, workSec: e.workSec, overtimeSec: e.overtimeSec, costCents: e.cost };
  if (e.breakStartSec !== undefined) r.breakStartSec = e.breakStartSec;
  return r;
}
