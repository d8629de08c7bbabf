import type { Problem } from './problem';

/**
 * The search's view of a problem: every job is a node, and the set-up time of a barn is folded
 * into the arc that arrives at it from another barn. Consecutive jobs at one barn then cost no
 * travel and no second set-up, which is exactly "one stop, one set-up". Windows are turned into
 * windows on each job's work start, sorted and merged, so that the search never re-derives them.
 */
export interface Model {
  problem: Problem;
  nJobs: number;
  nFarriers: number;
  /** Job → location index. */
  jobLoc: Int32Array;
  /** Job → barn index. */
  jobBarn: Int32Array;
  serviceSec: Float64Array;
  demand: Float64Array;
  /** Start windows of each job's work, as flat [s0, e0, s1, e1, ...], sorted and disjoint. */
  windows: Float64Array[];
  /** Cost of leaving the job out. */
  leaveOutCost: Float64Array;
  mandatory: Uint8Array;
  /** eligible[f * nJobs + j] = 1 when farrier f may do job j (skills, forge, pin, capacity). */
  eligible: Uint8Array;
  /** Pinned 1-based stop position, 0 when none. */
  pinPosition: Int32Array;
  /** True when some job is pinned to a stop position (piece evaluation then re-times whole sequences). */
  hasPositionPins: boolean;
  /** Job-to-job arc: travel seconds plus set-up when the barns differ. */
  arcSec: Float64Array;
  /** Job-to-job travel seconds (no set-up). */
  travelSec: Float64Array;
  /** Job-to-job metres. */
  arcM: Float64Array;
  /** Per farrier: from home to each job (with set-up), travel only, metres; and from each job home. */
  fromHomeArc: Float64Array[];
  fromHomeTravel: Float64Array[];
  fromHomeM: Float64Array[];
  toHomeTravel: Float64Array[];
  toHomeM: Float64Array[];
  /** Farrier data in search form. */
  shiftStart: Float64Array;
  endLimit: Float64Array;
  capacity: Float64Array;
  cDrive: Float64Array;
  cMetre: Float64Array;
  cOvertime: Float64Array;
  fixedCost: Float64Array;
  /** True when some farrier has a break, a position pin exists or overtime is priced or limited below the shift. */
  needsExact: boolean;
  /** Nearest jobs to each job by arc seconds (for ruin and local search neighbourhoods). */
  neighbours: Int32Array[];
  /** Scale of one typical arc's cost, used for annealing temperatures. */
  typicalArcCost: number;
  fleetObjective: boolean;
}

/** Cost of a mandatory job that could not be placed: far above any route cost, so placing it always wins. */
export const MANDATORY_LEAVE_OUT = 1e13;
/** Vehicle cost under the fleet-then-distance objective: above any total distance a benchmark produces. */
export const FLEET_VEHICLE_COST = 1e11;

function mergeWindows(ws: [number, number][]): Float64Array {
  const s = ws.filter(([a, b]) => b >= a).sort((x, y) => x[0] - y[0] || x[1] - y[1]);
  const out: number[] = [];
  for (const [a, b] of s) {
    const n = out.length;
    if (n && a <= out[n - 1]) out[n - 1] = Math.max(out[n - 1], b);
    else out.push(a, b);
  }
  return Float64Array.from(out);
}

function intersect(a: [number, number][], b: [number, number][]): [number, number][] {
  const out: [number, number][] = [];
  for (const [s1, e1] of a) for (const [s2, e2] of b) {
    const s = Math.max(s1, s2), e = Math.min(e1, e2);
    if (s <= e) out.push([s, e]);
  }
  return out;
}

/**
 * Work-start windows of one job: barn access windows shifted by the set-up (the set-up happens inside
 * the barn's hours) and, in `service-inside` mode, ended early by the job's duration; intersected with
 * the owner's windows and the pin's not-before / not-after times.
 */
export function jobStartWindows(problem: Problem, jobIndex: number): [number, number][] {
  const job = problem.jobs[jobIndex];
  const barn = problem.barns.find((b) => b.id === job.barnId)!;
  const inside = problem.windowMode === 'service-inside';
  let ws: [number, number][] = barn.windows.map((w) => [w.startSec + barn.setupSec, inside ? w.endSec - job.durationSec : w.endSec]);
  ws = ws.filter(([a, b]) => a <= b);
  if (job.windows) ws = intersect(ws, job.windows.map((w) => [w.startSec, w.endSec]));
  if (job.pin && (job.pin.notBeforeSec !== undefined || job.pin.notAfterSec !== undefined)) {
    ws = intersect(ws, [[job.pin.notBeforeSec ?? 0, job.pin.notAfterSec ?? Number.MAX_SAFE_INTEGER]]);
  }
  return ws;
}

/** Whether farrier `f` may do job `j` by skill, forge, pin and capacity (not time). */
export function farrierMayDo(problem: Problem, f: number, j: number): boolean {
  const far = problem.farriers[f];
  const job = problem.jobs[j];
  if (job.needsQualified && !far.qualified) return false;
  if (job.needsForge && !far.hasForge) return false;
  if (job.pin && job.pin.farrierId !== far.id) return false;
  if (far.capacity !== undefined && job.demand > far.capacity) return false;
  return true;
}

/** Compiles a validated problem into the search model (matrices, windows, eligibility, neighbours). */
export function buildModel(problem: Problem): Model {
  const nJobs = problem.jobs.length;
  const nFarriers = problem.farriers.length;
  const barnIndex = new Map(problem.barns.map((b, i) => [b.id, i]));
  const jobLoc = new Int32Array(nJobs);
  const jobBarn = new Int32Array(nJobs);
  const serviceSec = new Float64Array(nJobs);
  const demand = new Float64Array(nJobs);
  const leaveOutCost = new Float64Array(nJobs);
  const mandatory = new Uint8Array(nJobs);
  const pinPosition = new Int32Array(nJobs);
  const windows: Float64Array[] = [];
  const D = problem.durationSec, M = problem.distanceM;
  problem.jobs.forEach((job, j) => {
    const b = barnIndex.get(job.barnId)!;
    jobBarn[j] = b;
    jobLoc[j] = problem.barns[b].location;
    serviceSec[j] = job.durationSec;
    demand[j] = job.demand;
    mandatory[j] = job.optional ? 0 : 1;
    leaveOutCost[j] = job.optional ? job.penalty * job.priority : MANDATORY_LEAVE_OUT * Math.max(1, job.priority);
    pinPosition[j] = job.pin?.position ?? 0;
    windows.push(mergeWindows(jobStartWindows(problem, j)));
  });
  const eligible = new Uint8Array(nFarriers * nJobs);
  for (let f = 0; f < nFarriers; f++) for (let j = 0; j < nJobs; j++) eligible[f * nJobs + j] = farrierMayDo(problem, f, j) ? 1 : 0;

  const arcSec = new Float64Array(nJobs * nJobs);
  const travelSec = new Float64Array(nJobs * nJobs);
  const arcM = new Float64Array(nJobs * nJobs);
  for (let a = 0; a < nJobs; a++) {
    const la = jobLoc[a];
    for (let b = 0; b < nJobs; b++) {
      if (jobBarn[a] === jobBarn[b]) continue; // same barn: same stop, no travel, no set-up
      const lb = jobLoc[b];
      travelSec[a * nJobs + b] = D[la][lb];
      arcSec[a * nJobs + b] = D[la][lb] + problem.barns[jobBarn[b]].setupSec;
      arcM[a * nJobs + b] = M[la][lb];
    }
  }
  const fromHomeArc: Float64Array[] = [], fromHomeTravel: Float64Array[] = [], fromHomeM: Float64Array[] = [];
  const toHomeTravel: Float64Array[] = [], toHomeM: Float64Array[] = [];
  const shiftStart = new Float64Array(nFarriers), endLimit = new Float64Array(nFarriers), capacity = new Float64Array(nFarriers);
  const cDrive = new Float64Array(nFarriers), cMetre = new Float64Array(nFarriers), cOvertime = new Float64Array(nFarriers), fixedCost = new Float64Array(nFarriers);
  const fleet = problem.objective === 'fleet-then-distance';
  let needsExact = false;
  problem.farriers.forEach((f, i) => {
    const fa = new Float64Array(nJobs), ft = new Float64Array(nJobs), fm = new Float64Array(nJobs), tt = new Float64Array(nJobs), tm = new Float64Array(nJobs);
    for (let j = 0; j < nJobs; j++) {
      fa[j] = D[f.startLocation][jobLoc[j]] + problem.barns[jobBarn[j]].setupSec;
      ft[j] = D[f.startLocation][jobLoc[j]];
      fm[j] = M[f.startLocation][jobLoc[j]];
      tt[j] = D[jobLoc[j]][f.endLocation];
      tm[j] = M[jobLoc[j]][f.endLocation];
    }
    fromHomeArc.push(fa); fromHomeTravel.push(ft); fromHomeM.push(fm); toHomeTravel.push(tt); toHomeM.push(tm);
    shiftStart[i] = f.shiftStartSec;
    endLimit[i] = f.shiftEndSec + f.maxOvertimeSec;
    capacity[i] = f.capacity ?? Infinity;
    cDrive[i] = fleet ? 0 : f.costPerDriveSec;
    cMetre[i] = fleet ? 1 : f.costPerMetre;
    cOvertime[i] = fleet ? 0 : f.costPerOvertimeSec;
    fixedCost[i] = fleet ? FLEET_VEHICLE_COST : f.fixedCost;
    if (f.breakSec > 0) needsExact = true;
    const span = f.shiftEndSec + f.maxOvertimeSec - f.shiftStartSec;
    if (f.normalWorkSec + f.maxOvertimeSec < span) needsExact = true;
    if (!fleet && f.costPerOvertimeSec > 0 && f.normalWorkSec < span) needsExact = true;
  });
  const hasPositionPins = pinPosition.some((p) => p > 0);
  if (hasPositionPins) needsExact = true;

  const K = Math.min(nJobs - 1, 40);
  const neighbours: Int32Array[] = [];
  const idx = Array.from({ length: nJobs }, (_, i) => i);
  for (let a = 0; a < nJobs; a++) {
    const others = idx.filter((b) => b !== a);
    others.sort((x, y) => (arcSec[a * nJobs + x] + arcSec[x * nJobs + a]) - (arcSec[a * nJobs + y] + arcSec[y * nJobs + a]) || x - y);
    neighbours.push(Int32Array.from(others.slice(0, Math.max(0, K))));
  }
  let sum = 0, cnt = 0;
  for (let a = 0; a < nJobs; a++) {
    const nb = neighbours[a];
    for (let k = 0; k < Math.min(5, nb.length); k++) {
      const b = nb[k];
      sum += (fleet ? 0 : cDrive[0] ?? 0) * travelSec[a * nJobs + b] + (fleet ? 1 : cMetre[0] ?? 0) * arcM[a * nJobs + b];
      cnt++;
    }
  }
  const typicalArcCost = cnt && sum > 0 ? sum / cnt : 1;
  return {
    problem, nJobs, nFarriers, jobLoc, jobBarn, serviceSec, demand, windows, leaveOutCost, mandatory, eligible, pinPosition, hasPositionPins,
    arcSec, travelSec, arcM, fromHomeArc, fromHomeTravel, fromHomeM, toHomeTravel, toHomeM,
    shiftStart, endLimit, capacity, cDrive, cMetre, cOvertime, fixedCost, needsExact, neighbours, typicalArcCost, fleetObjective: fleet,
  };
}

/**
 * The same day with every optional job's leave-out cost multiplied by `k` (mandatory jobs keep
 * theirs). Everything else is shared with `m`, so plans of the two models compare route by route.
 */
export function scaleOptionalLeaveOut(m: Model, k: number): Model {
  const leaveOutCost = new Float64Array(m.leaveOutCost);
  for (let j = 0; j < m.nJobs; j++) if (!m.mandatory[j]) leaveOutCost[j] *= k;
  return { ...m, leaveOutCost };
}

/** Earliest time ≥ t inside one of the windows, or Infinity. */
export function earliestIn(w: Float64Array, t: number): number {
  for (let k = 0; k < w.length; k += 2) {
    if (t <= w[k + 1]) return t < w[k] ? w[k] : t;
  }
  return Infinity;
}

/** Latest time ≤ t inside one of the windows, or -Infinity. */
export function latestIn(w: Float64Array, t: number): number {
  for (let k = w.length - 2; k >= 0; k -= 2) {
    if (t >= w[k]) return t > w[k + 1] ? w[k + 1] : t;
  }
  return -Infinity;
}
