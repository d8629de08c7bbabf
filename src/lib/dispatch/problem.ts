import type { ProblemInput } from '../solver/index.ts';
import type { DayBarn, DayFarrier, DayJob } from '../db/plans.ts';
import { isoWeekday } from './time.ts';

/**
 * Turns a practice's day (farriers working, open jobs, barns, the drive matrix) into the plan engine's
 * problem. Pure: the database reads and the matrix happen before, so tests can feed it by hand.
 */

const METRES_PER_UNIT = { miles: 1609.344, km: 1000 } as const;

/** Engine ids: numbers from the database prefixed by kind, so they can never collide. */
export const farrierKey = (id: number) => `f${id}`;
export const barnKey = (id: number) => `b${id}`;
export const jobKey = (id: number) => `j${id}`;
export const idOf = (key: string) => Number(key.slice(1));

export interface DayPlaces {
  /** Farrier homes first (in farrier order), then barns (in barn order). */
  points: { lat: number; lon: number }[];
  homeIndex: Map<number, number>;
  barnIndex: Map<number, number>;
}

/** The places of a day in matrix order. */
export function dayPlaces(farriers: readonly DayFarrier[], barns: readonly DayBarn[]): DayPlaces {
  const points: { lat: number; lon: number }[] = [];
  const homeIndex = new Map<number, number>();
  const barnIndex = new Map<number, number>();
  for (const f of farriers) {
    homeIndex.set(f.id, points.length);
    points.push({ lat: f.homeLat, lon: f.homeLon });
  }
  for (const b of barns) {
    barnIndex.set(b.id, points.length);
    points.push({ lat: b.lat, lon: b.lon });
  }
  return { points, homeIndex, barnIndex };
}

/** A barn's access spans on a weekday in seconds; a closed day is one empty span, which nothing fits. */
export function barnWindowsSec(barn: DayBarn, weekday: number): { startSec: number; endSec: number }[] {
  const spans = barn.accessHours[weekday - 1] ?? [];
  const windows = spans.filter((s) => Array.isArray(s) && s.length === 2 && s[1] > s[0]).map(([a, b]) => ({ startSec: a * 60, endSec: b * 60 }));
  return windows.length ? windows : [{ startSec: 0, endSec: 0 }];
}

export function barnClosedOn(barn: DayBarn, weekday: number): boolean {
  return barnWindowsSec(barn, weekday)[0]!.endSec === 0;
}

/**
 * How much leaving a job out weighs. Overdue horses first and lame horses before all (the product's
 * rule); a job due later in the horizon may be pulled forward when there is room. Every job but a
 * pinned one is optional to the engine so that a full day never forces overtime: the weight decides.
 * - priority 1 for a job due after the plan date; 3 + one per full week overdue (at most 9) otherwise;
 *   lame adds 5.
 * - penalty in cents per priority point: 2 000 + 20 per minute of work (a 60-min job: 2 000 + 1 200 = 3 200).
 */
export function jobWeight(job: Pick<DayJob, 'dueOn' | 'lame' | 'minutes'>, date: string): { priority: number; penalty: number } {
  const daysOverdue = Math.round((Date.parse(`${date}T00:00:00Z`) - Date.parse(`${job.dueOn}T00:00:00Z`)) / 86400000);
  let priority = daysOverdue < 0 ? 1 : 3 + Math.min(6, Math.floor(daysOverdue / 7));
  if (job.lame) priority += 5;
  return { priority, penalty: 2000 + 20 * job.minutes };
}

export interface DayProblemInput {
  date: string;
  practice: { units: 'miles' | 'km'; mileageRate: number; overtimeWeeklyMultiplier: number };
  farriers: readonly DayFarrier[];
  jobs: readonly DayJob[];
  barns: readonly DayBarn[];
  places: DayPlaces;
  matrix: { durationSec: number[][]; distanceM: number[][] };
}

/** The engine's problem for the day. Farriers are those given (the caller keeps those working that day). */
export function buildDayProblem(input: DayProblemInput): ProblemInput {
  const weekday = isoWeekday(input.date);
  const { homeIndex, barnIndex } = input.places;
  const metres = METRES_PER_UNIT[input.practice.units];
  const usedBarns = new Set(input.jobs.map((j) => j.barnId));
  return {
    locations: input.places.points.length,
    durationSec: input.matrix.durationSec,
    distanceM: input.matrix.distanceM,
    farriers: input.farriers.map((f) => {
      const perSec = f.costPerHourCents / 3600;
      return {
        id: farrierKey(f.id),
        startLocation: homeIndex.get(f.id)!,
        endLocation: homeIndex.get(f.id)!,
        shiftStartSec: f.shiftStartMinute * 60,
        shiftEndSec: f.shiftEndMinute * 60,
        breakSec: f.breakMinutes * 60,
        breakWindow: f.breakMinutes > 0 ? { startSec: f.breakWindowStartMinute * 60, endSec: f.breakWindowEndMinute * 60 } : null,
        normalWorkSec: f.normalWorkMinutes * 60,
        maxOvertimeSec: f.maxOvertimeMinutes * 60,
        costPerDriveSec: perSec,
        // Overtime weighs twice its pay in planning, so that a day does not drift into it for work due later.
        costPerOvertimeSec: perSec * input.practice.overtimeWeeklyMultiplier * 2,
        costPerMetre: (input.practice.mileageRate * 100) / metres,
        qualified: f.qualified && !f.apprentice,
        hasForge: f.hasForge,
      };
    }),
    barns: input.barns
      .filter((b) => usedBarns.has(b.id))
      .map((b) => ({ id: barnKey(b.id), location: barnIndex.get(b.id)!, windows: barnWindowsSec(b, weekday), setupSec: b.setupMinutes * 60 })),
    jobs: input.jobs.map((j) => {
      const { priority, penalty } = jobWeight(j, input.date);
      const hasWindow = j.ownerWindowStartMinute != null && j.ownerWindowEndMinute != null && j.ownerWindowEndMinute >= j.ownerWindowStartMinute;
      return {
        id: jobKey(j.id),
        barnId: barnKey(j.barnId),
        durationSec: j.minutes * 60,
        needsQualified: j.workTypes.some((w) => w.needsQualified),
        needsForge: j.workTypes.some((w) => w.needsForge),
        priority,
        // A pinned job is the dispatcher's decision: the engine must place it (or say why it cannot),
        // never trade it away against driving or overtime.
        optional: j.pinnedFarrierId == null,
        penalty,
        ...(hasWindow ? { windows: [{ startSec: j.ownerWindowStartMinute! * 60, endSec: j.ownerWindowEndMinute! * 60 }] } : {}),
        ...(j.pinnedFarrierId != null
          ? { pin: { farrierId: farrierKey(j.pinnedFarrierId), ...(j.pinnedPosition != null ? { position: j.pinnedPosition } : {}) } }
          : {}),
      };
    }),
  };
}
