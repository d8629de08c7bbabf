import type { CheckedRoute, Violation } from '../solver/index.ts';
import type { PlanWarning } from '../../schemas/plans.ts';
import type { DayBarn, DayFarrier, DayJob, RouteWrite } from '../db/plans.ts';
import { stopArrivalWindow, type WindowSettings } from './arrival-window.ts';
import { barnWindowsSec, idOf } from './problem.ts';
import { isoWeekday, localSecToDate } from './time.ts';
import { warningFor } from './words.ts';

/**
 * From the engine's timed routes to rows, and from the checker's violations to the board's words.
 * Shared by planning and by hand edits so both store routes the same way.
 */

const hhmm = (sec: number) => `${String(Math.floor(sec / 3600)).padStart(2, '0')}:${String(Math.floor((sec % 3600) / 60)).padStart(2, '0')}`;

/** A timed route (the engine's or the checker's) as rows to write, with each stop's arrival window. */
export function routeWrite(
  r: Pick<CheckedRoute, 'farrierId' | 'stops' | 'startSec' | 'endSec' | 'driveSec' | 'distanceM' | 'workSec' | 'overtimeSec' | 'breakStartSec'>,
  ctx: { date: string; timeZone: string; farrier: DayFarrier; homeLocation: number; durationSec: number[][]; distanceM: number[][]; windows: WindowSettings },
): RouteWrite {
  const at = (sec: number) => localSecToDate(ctx.date, sec, ctx.timeZone);
  const shiftStartSec = ctx.farrier.shiftStartMinute * 60;
  let prev = ctx.homeLocation;
  const stops = r.stops.map((s, i) => {
    const window = stopArrivalWindow(at(s.arrivalSec), i + 1, ctx.windows);
    const leg = { legDriveSeconds: ctx.durationSec[prev]![s.location]!, legDistanceM: ctx.distanceM[prev]![s.location]! };
    prev = s.location;
    return {
      position: i + 1,
      barnId: idOf(s.barnId),
      arrivalAt: at(s.arrivalSec),
      startAt: at(s.startSec),
      departureAt: at(s.departureSec),
      ...leg,
      windowStartAt: window.startAt,
      windowEndAt: window.endAt,
      jobIds: s.jobIds.map(idOf),
    };
  });
  const empty = r.stops.length === 0;
  return {
    farrierId: ctx.farrier.id,
    startAt: at(empty ? shiftStartSec : r.startSec),
    endAt: at(empty ? shiftStartSec : r.endSec),
    driveSeconds: Math.round(r.driveSec),
    distanceM: Math.round(r.distanceM),
    workSeconds: Math.max(0, Math.round(r.workSec)),
    overtimeSeconds: Math.max(0, Math.round(r.overtimeSec)),
    breakStartAt: r.breakStartSec !== undefined && !empty ? at(r.breakStartSec) : null,
    stops,
  };
}

/** The checker's violations for one farrier's route, in words with names, times and hours. */
export function warningsFor(
  violations: readonly Violation[],
  route: CheckedRoute,
  ctx: { date: string; farrier: DayFarrier; jobs: Map<number, DayJob>; barns: Map<number, DayBarn> },
): PlanWarning[] {
  const weekday = isoWeekday(ctx.date);
  const f = ctx.farrier;
  return violations
    .filter((v) => v.farrierId === route.farrierId)
    .map((v) => {
      const jobId = v.jobId ? idOf(v.jobId) : undefined;
      const job = jobId !== undefined ? ctx.jobs.get(jobId) : undefined;
      const barn = job ? ctx.barns.get(job.barnId) : undefined;
      const stop = v.jobId ? route.stops.find((s) => s.jobIds.includes(v.jobId!)) : undefined;
      const jobStart = stop?.jobs.find((j) => j.jobId === v.jobId)?.startSec;
      let ownerMissed = false;
      let barnHours = '';
      if (barn && job) {
        const windows = barnWindowsSec(barn, weekday).filter((w) => w.endSec > 0);
        barnHours = windows.map((w) => `${hhmm(w.startSec)}–${hhmm(w.endSec)}`).join(', ');
        // Re-check which rule the start broke: the barn's hours (with set-up and the work inside) or the owner's window.
        if (jobStart !== undefined && job.ownerWindowStartMinute != null && job.ownerWindowEndMinute != null) {
          const inBarn = windows.some((w) => jobStart >= w.startSec + barn.setupMinutes * 60 && jobStart + job.minutes * 60 <= w.endSec);
          ownerMissed = inBarn;
        }
      }
      return warningFor(v.code, {
        farrierName: f.name,
        horseName: job?.horseName,
        barnName: barn?.name,
        barnHours,
        ownerWindow: job && job.ownerWindowStartMinute != null ? `${hhmm(job.ownerWindowStartMinute * 60)}–${hhmm(job.ownerWindowEndMinute! * 60)}` : undefined,
        arrival: stop ? hhmm(stop.arrivalSec) : undefined,
        home: hhmm(route.endSec),
        shiftEnd: hhmm(f.shiftEndMinute * 60),
        overtimeMinutes: Math.round(route.overtimeSec / 60),
        maxOvertimeMinutes: f.maxOvertimeMinutes,
        breakBy: hhmm(f.breakWindowEndMinute * 60),
      }, jobId, ownerMissed);
    });
}
