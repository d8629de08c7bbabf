import { createProblem, type Problem, type ProblemInput } from './problem';
import { createRng } from './random';

/**
 * Invented farrier days for the benchmark and the engine's warm-up: homes and barns scattered over a square of countryside,
 * road seconds from straight-line distance × 1.3 circuity at about 45 mph with a little asymmetry,
 * mixed work (trims, shoes, hot fits needing a forge, therapeutic work needing a qualified farrier),
 * a few owner windows and pins. Minutes per job follow common practice (no source); all data is
 * generated from the seed and describes no real practice.
 */
export interface FarrierDayOptions { seed: number; farriers: number; jobs: number; barns: number; sideM: number }

const WORK = [
  { name: 'trim', sec: 25 * 60, share: 0.4, forge: false, qualified: false },
  { name: 'front shoes', sec: 45 * 60, share: 0.25, forge: false, qualified: false },
  { name: 'full set', sec: 70 * 60, share: 0.17, forge: false, qualified: false },
  { name: 'hot fit', sec: 80 * 60, share: 0.12, forge: true, qualified: false },
  { name: 'therapeutic', sec: 100 * 60, share: 0.06, forge: true, qualified: true },
];

export function farrierDay(o: FarrierDayOptions): Problem {
  const rng = createRng(o.seed);
  const nLoc = o.farriers + o.barns;
  const px: number[] = [], py: number[] = [];
  for (let i = 0; i < nLoc; i++) { px.push(rng.next() * o.sideM); py.push(rng.next() * o.sideM); }
  const durationSec: number[][] = [], distanceM: number[][] = [];
  for (let a = 0; a < nLoc; a++) {
    durationSec.push([]); distanceM.push([]);
    for (let b = 0; b < nLoc; b++) {
      const road = a === b ? 0 : Math.hypot(px[a] - px[b], py[a] - py[b]) * 1.3 + 400;
      const skew = a < b ? 1.03 : 0.98;
      distanceM[a].push(Math.round(road));
      durationSec[a].push(a === b ? 0 : Math.round((road / 20) * skew + 60));
    }
  }
  const hour = 3600;
  const farriers: ProblemInput['farriers'] = Array.from({ length: o.farriers }, (_, f) => ({
    id: `farrier-${f + 1}`,
    startLocation: f, endLocation: f,
    shiftStartSec: 7 * hour, shiftEndSec: 17 * hour,
    breakSec: 30 * 60, breakWindow: { startSec: 11.5 * hour, endSec: 13.5 * hour },
    normalWorkSec: 8.5 * hour, maxOvertimeSec: 1.5 * hour,
    costPerDriveSec: 1, costPerMetre: 0.04, costPerOvertimeSec: 2,
    // farrier 1: therapeutic specialist; the last: an apprentice without a forge
    qualified: f === 0 || (f % 5 === 1 && f > 1),
    hasForge: f !== o.farriers - 1 || o.farriers === 1,
  }));
  const barns: ProblemInput['barns'] = Array.from({ length: o.barns }, (_, b) => {
    const r = rng.next();
    const windows = r < 0.7 ? [{ startSec: 7 * hour, endSec: 18 * hour }]
      : r < 0.85 ? [{ startSec: 8 * hour, endSec: 12 * hour }, { startSec: 13 * hour, endSec: 17 * hour }]
      : [{ startSec: 9 * hour, endSec: 15 * hour }];
    return { id: `barn-${b + 1}`, location: o.farriers + b, windows, setupSec: (10 + rng.int(6)) * 60 };
  });
  const jobs: ProblemInput['jobs'] = [];
  for (let j = 0; j < o.jobs; j++) {
    // the first `barns` jobs give every barn one horse; the rest cluster (a few horses per barn)
    const barn = j < o.barns ? j : rng.int(Math.max(1, Math.floor(o.barns / 2)));
    let u = rng.next(), w = WORK[0];
    for (const x of WORK) { if (u < x.share) { w = x; break; } u -= x.share; }
    const overdue = rng.next() < 0.3;
    const job: ProblemInput['jobs'][number] = {
      id: `job-${j + 1}`, barnId: `barn-${barn + 1}`, durationSec: w.sec,
      needsForge: w.forge, needsQualified: w.qualified,
      priority: overdue ? 3 : 1,
      optional: !overdue && rng.next() < 0.5,
      penalty: 6000 + rng.int(6000),
    };
    const k = rng.next();
    if (k < 0.08) job.windows = [{ startSec: 9 * hour, endSec: 11 * hour }];
    else if (k < 0.12) job.windows = [{ startSec: 13 * hour, endSec: 16 * hour }];
    jobs.push(job);
  }
  // a few pins: to a farrier, to first stop, and not before 10:00
  const pinCount = Math.max(1, Math.round(o.jobs / 15));
  for (let k = 0; k < pinCount; k++) {
    const j = jobs[(k * 7 + 3) % jobs.length];
    const f = (k * 2 + 1) % o.farriers;
    const fi = farriers[f];
    if ((j.needsForge && !fi.hasForge) || (j.needsQualified && !fi.qualified)) continue;
    j.pin = { farrierId: fi.id, ...(k === 0 ? { notBeforeSec: 10 * hour } : {}) };
    j.optional = false;
  }
  return createProblem({ locations: nLoc, durationSec, distanceM, farriers, barns, jobs });
}
