import type { Problem } from './problem';

/**
 * Independent checker: re-simulates every route from the raw problem (no search model, no caches)
 * and lists every rule a plan breaks. It is the referee for the engine in tests and benchmarks, and
 * the re-timing behind `evaluateRoutes` when a dispatcher moves jobs by hand.
 */
export type ViolationCode =
  | 'unknown_farrier'
  | 'farrier_twice'
  | 'unknown_job'
  | 'job_repeated'
  | 'job_missing'
  | 'stop_barn_mismatch'
  | 'not_qualified'
  | 'no_forge'
  | 'pinned_elsewhere'
  | 'pin_position'
  | 'window_missed'
  | 'capacity_exceeded'
  | 'break_missed'
  | 'shift_end_exceeded'
  | 'overtime_exceeded'
  | 'times_differ';

/** One broken rule: a stable `code` for screens and tests and a plain-words `message` for people. */
export interface Violation {
  code: ViolationCode;
  message: string;
  farrierId?: string;
  jobId?: string;
}

/** Input routes: either plain job lists or the engine's routes with stops. */
export interface RouteInput {
  farrierId: string;
  jobIds?: string[];
  stops?: { barnId: string; jobIds: string[]; arrivalSec?: number; startSec?: number; departureSec?: number }[];
  startSec?: number;
  endSec?: number;
}

/** A stop as the checker re-timed it. */
export interface CheckedStop {
  barnId: string;
  location: number;
  arrivalSec: number;
  startSec: number;
  departureSec: number;
  jobIds: string[];
  jobs: { jobId: string; startSec: number; endSec: number }[];
}

/** A route as the checker re-timed and costed it (same shape as the engine's routes). */
/** A route's timing and totals, shared by the engine's plan and the checker's re-simulation of it. */
export interface RouteTotals {
  farrierId: string;
  breakStartSec?: number;
  startSec: number;
  endSec: number;
  driveSec: number;
  distanceM: number;
  workSec: number;
  overtimeSec: number;
  costCents: number;
}

export interface CheckedRoute extends RouteTotals {
  stops: CheckedStop[];
}

/** Verdict of a check: feasible only when `violations` is empty; `costs` as re-derived from scratch. */
export interface CheckResult {
  feasible: boolean;
  violations: Violation[];
  routes: CheckedRoute[];
  costs: { routesCents: number; leftOutPenaltyCents: number; totalCents: number; driveSec: number; distanceM: number; overtimeSec: number; farriersUsed: number };
}

const fmt = (s: number) => {
  const h = Math.floor(s / 3600), mi = Math.floor((s % 3600) / 60);
  return `${String(h).padStart(2, '0')}:${String(mi).padStart(2, '0')}`;
};

/** Whether work on `job` may start at `s` under the problem's window rules. */
function startAllowed(p: Problem, jobIdx: number, s: number): boolean {
  const job = p.jobs[jobIdx];
  const barn = p.barns.find((b) => b.id === job.barnId)!;
  const barnOk = barn.windows.some((w) => s >= w.startSec + barn.setupSec && (p.windowMode === 'service-inside' ? s + job.durationSec <= w.endSec : s <= w.endSec));
  if (!barnOk) return false;
  if (job.windows && !job.windows.some((w) => s >= w.startSec && s <= w.endSec)) return false;
  if (job.pin?.notBeforeSec !== undefined && s < job.pin.notBeforeSec) return false;
  if (job.pin?.notAfterSec !== undefined && s > job.pin.notAfterSec) return false;
  return true;
}

/** Earliest allowed work start at or after t, or null. Candidates are t and every window's lower bound. */
function earliestStart(p: Problem, jobIdx: number, t: number): number | null {
  const job = p.jobs[jobIdx];
  const barn = p.barns.find((b) => b.id === job.barnId)!;
  const cands = [t, ...barn.windows.map((w) => w.startSec + barn.setupSec), ...(job.windows ?? []).map((w) => w.startSec)];
  if (job.pin?.notBeforeSec !== undefined) cands.push(job.pin.notBeforeSec);
  let best: number | null = null;
  for (const c of cands) if (c >= t && startAllowed(p, jobIdx, c) && (best === null || c < best)) best = c;
  return best;
}

function simulate(p: Problem, r: { farrierId: string; jobIds: string[] }, fIdx: number, violations: Violation[]): CheckedRoute {
  const far = p.farriers[fIdx];
  const v = (code: ViolationCode, message: string, jobId?: string) => violations.push({ code, message, farrierId: far.id, ...(jobId ? { jobId } : {}) });
  const jobIndex = new Map(p.jobs.map((j, i) => [j.id, i]));
  const idx = r.jobIds.map((id) => jobIndex.get(id)!).filter((i) => i !== undefined);
  const stops: CheckedStop[] = [];
  if (!idx.length) return { farrierId: far.id, stops, startSec: far.shiftStartSec, endSec: far.shiftStartSec, driveSec: 0, distanceM: 0, workSec: 0, overtimeSec: 0, costCents: 0 };
  const hasBreak = far.breakSec > 0 && far.breakWindow !== null;
  let breakStart: number | undefined;
  let breakAtHome = false;
  let t = far.shiftStartSec;
  let loc = far.startLocation;
  let drive = 0, dist = 0, load = 0;
  let prevBarn: string | null = null;
  for (let k = 0; k < idx.length; k++) {
    const job = p.jobs[idx[k]];
    const barn = p.barns.find((b) => b.id === job.barnId)!;
    if (job.needsQualified && !far.qualified) v('not_qualified', `${job.id} needs a farrier qualified for therapeutic work; ${far.id} is not`, job.id);
    if (job.needsForge && !far.hasForge) v('no_forge', `${job.id} needs a forge; ${far.id}'s truck has none`, job.id);
    if (job.pin && job.pin.farrierId !== far.id) v('pinned_elsewhere', `${job.id} is pinned to ${job.pin.farrierId}`, job.id);
    load += job.demand;
    const sameStop = prevBarn === barn.id;
    const travel = sameStop ? 0 : p.durationSec[loc][barn.location];
    const metres = sameStop ? 0 : p.distanceM[loc][barn.location];
    const setup = sameStop ? 0 : barn.setupSec;
    let leave = t;
    let s = earliestStart(p, idx[k], leave + travel + setup);
    if (hasBreak && breakStart === undefined && (s === null || s >= far.breakWindow!.startSec)) {
      breakStart = Math.max(t, far.breakWindow!.startSec);
      if (k === 0) breakAtHome = true;
      leave = breakStart + far.breakSec;
      s = earliestStart(p, idx[k], leave + travel + setup);
    }
    if (s === null) {
      v('window_missed', `${job.id} cannot start at ${barn.id} inside its hours or the owner's window (ready ${fmt(leave + travel + setup)})`, job.id);
      s = leave + travel + setup;
    }
    drive += travel; dist += metres;
    if (!sameStop) stops.push({ barnId: barn.id, location: barn.location, arrivalSec: leave + travel, startSec: s - setup, departureSec: s + job.durationSec, jobIds: [], jobs: [] });
    const st = stops[stops.length - 1];
    st.jobIds.push(job.id);
    st.jobs.push({ jobId: job.id, startSec: s, endSec: s + job.durationSec });
    st.departureSec = s + job.durationSec;
    t = s + job.durationSec;
    loc = barn.location;
    prevBarn = barn.id;
  }
  if (hasBreak && breakStart === undefined) {
    breakStart = Math.max(t, far.breakWindow!.startSec);
    t = breakStart + far.breakSec;
  }
  if (hasBreak && breakStart! > far.breakWindow!.endSec) v('break_missed', `${far.id}'s break cannot start by ${fmt(far.breakWindow!.endSec)}`);
  drive += p.durationSec[loc][far.endLocation];
  dist += p.distanceM[loc][far.endLocation];
  const end = t + p.durationSec[loc][far.endLocation];
  const first = stops[0];
  const start = breakAtHome ? breakStart! + far.breakSec : first.startSec - p.durationSec[far.startLocation][first.location];
  // the farrier leaves home as late as the first stop allows, so arrives just as set-up begins
  if (!breakAtHome) first.arrivalSec = first.startSec;
  const workSec = end - start - (hasBreak && !breakAtHome ? far.breakSec : 0);
  const overtime = Math.max(0, workSec - far.normalWorkSec);
  if (end > far.shiftEndSec + far.maxOvertimeSec) v('shift_end_exceeded', `${far.id} gets home at ${fmt(end)}, after the shift end plus allowed overtime (${fmt(far.shiftEndSec + far.maxOvertimeSec)})`);
  if (overtime > far.maxOvertimeSec) v('overtime_exceeded', `${far.id} would work ${Math.round(overtime / 60)} min overtime; the limit is ${Math.round(far.maxOvertimeSec / 60)} min`);
  if (far.capacity !== undefined && load > far.capacity) v('capacity_exceeded', `${far.id} carries ${load}, capacity ${far.capacity}`);
  idx.forEach((ji) => {
    const job = p.jobs[ji];
    if (job.pin?.position !== undefined) {
      const pos = stops.findIndex((s) => s.jobIds.includes(job.id)) + 1;
      if (pos !== job.pin.position) v('pin_position', `${job.id} is pinned to stop ${job.pin.position} but is at stop ${pos}`, job.id);
    }
  });
  const fleet = p.objective === 'fleet-then-distance';
  const cost = fleet ? dist : far.fixedCost + far.costPerDriveSec * drive + far.costPerMetre * dist + far.costPerOvertimeSec * overtime;
  const out: CheckedRoute = { farrierId: far.id, stops, startSec: start, endSec: end, driveSec: drive, distanceM: dist, workSec, overtimeSec: overtime, costCents: cost };
  if (breakStart !== undefined) out.breakStartSec = breakStart;
  return out;
}

/**
 * Re-times routes from scratch and lists every violation with a machine code and a plain message.
 * With `complete` set, every job must appear in a route or in `unplanned`.
 */
export function checkSolution(
  problem: Problem,
  solution: { routes: RouteInput[]; unplanned?: { jobId: string }[] },
  options: { complete?: boolean; compareTimes?: boolean } = {},
): CheckResult {
  const p = problem;
  const violations: Violation[] = [];
  const fIndex = new Map(p.farriers.map((f, i) => [f.id, i]));
  const jobIds = new Set(p.jobs.map((j) => j.id));
  const seen = new Map<string, string>();
  const seenFarrier = new Set<string>();
  const routes: CheckedRoute[] = [];
  for (const r of solution.routes) {
    const fi = fIndex.get(r.farrierId);
    if (fi === undefined) { violations.push({ code: 'unknown_farrier', message: `no farrier ${r.farrierId} works this day`, farrierId: r.farrierId }); continue; }
    if (seenFarrier.has(r.farrierId)) violations.push({ code: 'farrier_twice', message: `${r.farrierId} has two routes`, farrierId: r.farrierId });
    seenFarrier.add(r.farrierId);
    const ids = r.jobIds ?? (r.stops ?? []).flatMap((s) => s.jobIds);
    const known: string[] = [];
    for (const id of ids) {
      if (!jobIds.has(id)) { violations.push({ code: 'unknown_job', message: `no job ${id}`, farrierId: r.farrierId, jobId: id }); continue; }
      if (seen.has(id)) { violations.push({ code: 'job_repeated', message: `${id} is planned twice (${seen.get(id)} and ${r.farrierId})`, farrierId: r.farrierId, jobId: id }); continue; }
      seen.set(id, r.farrierId);
      known.push(id);
    }
    if (r.stops) for (const s of r.stops) for (const id of s.jobIds) {
      const job = p.jobs.find((j) => j.id === id);
      if (job && job.barnId !== s.barnId) violations.push({ code: 'stop_barn_mismatch', message: `${id} is at ${job.barnId}, not ${s.barnId}`, farrierId: r.farrierId, jobId: id });
    }
    const checked = simulate(p, { farrierId: r.farrierId, jobIds: known }, fi, violations);
    routes.push(checked);
    if (options.compareTimes && r.stops) {
      const same = r.stops.length === checked.stops.length && r.stops.every((s, i) => {
        const c = checked.stops[i];
        return s.barnId === c.barnId && (s.arrivalSec === undefined || Math.abs(s.arrivalSec - c.arrivalSec) < 1e-6) && (s.startSec === undefined || Math.abs(s.startSec - c.startSec) < 1e-6) && (s.departureSec === undefined || Math.abs(s.departureSec - c.departureSec) < 1e-6);
      });
      if (!same) violations.push({ code: 'times_differ', message: `${r.farrierId}'s reported stop times differ from a fresh re-timing`, farrierId: r.farrierId });
    }
  }
  const unplannedIds = new Set((solution.unplanned ?? []).map((u) => u.jobId));
  for (const id of unplannedIds) if (seen.has(id)) violations.push({ code: 'job_repeated', message: `${id} is both planned and unplanned`, jobId: id });
  let leftOut = 0;
  for (const job of p.jobs) {
    if (seen.has(job.id)) continue;
    if (options.complete && !unplannedIds.has(job.id)) violations.push({ code: 'job_missing', message: `${job.id} is neither planned nor listed as unplanned`, jobId: job.id });
    if (job.optional) leftOut += job.penalty * job.priority;
  }
  const routesCents = routes.reduce((a, r) => a + r.costCents, 0);
  return {
    feasible: violations.length === 0,
    violations,
    routes,
    costs: {
      routesCents, leftOutPenaltyCents: leftOut, totalCents: routesCents + leftOut,
      driveSec: routes.reduce((a, r) => a + r.driveSec, 0), distanceM: routes.reduce((a, r) => a + r.distanceM, 0),
      overtimeSec: routes.reduce((a, r) => a + r.overtimeSec, 0), farriersUsed: routes.filter((r) => r.stops.length).length,
    },
  };
}

/**
 * Re-times routes a dispatcher has edited and reports what breaks, without repairing anything.
 * Each violation carries a stable `code` for the screen and a plain-words `message`.
 */
export function evaluateRoutes(problem: Problem, routes: { farrierId: string; jobIds: string[] }[]): CheckResult {
  return checkSolution(problem, { routes });
}
