/**
 * The farrier's day as the day sheet shows it before the server has answered: the confirmed day log
 * with the phone's queued Start the day / Back home marks laid over it by the same rules the server
 * applies (src/lib/day-sheet/day-logs.ts). Pure, so the sheet and its tests share it.
 */
import type { DayLogView } from './day-logs.ts';
import type { Units } from '../review/mileage.ts';
import { odometerDistanceM } from './odometer.ts';

/** The day as the sheet shows it: the confirmed log with the phone's queued marks laid over it. */
export interface DayView {
  startedMs: number;
  startImplied: boolean;
  startOdometer: number | null;
  endedMs: number | null;
  endOdometer: number | null;
  distanceM: number | null;
  distanceSource: 'odometer' | 'planned' | null;
  waiting: boolean;
}

/**
 * Lays the queued marks over the confirmed log the way the server will apply them: a start only on a
 * day not yet started, the implied start at the planned departure once a stop is marked, an end only
 * on a started, open day, after its start.
 */
export function dayView(p: {
  confirmed: DayLogView | null;
  queued: { kind: 'start' | 'end'; at: string; odometer?: number | null }[];
  anyStopMarked: boolean;
  plannedStartAt: string;
  plannedDistanceM: number;
  units: Units;
}): DayView | null {
  const c = p.confirmed;
  let v: DayView | null = c
    ? {
        startedMs: Date.parse(c.startedAt), startImplied: c.startSource === 'first_stop', startOdometer: c.startOdometer,
        endedMs: c.endedAt ? Date.parse(c.endedAt) : null, endOdometer: c.endOdometer, distanceM: c.distanceM, distanceSource: c.distanceSource, waiting: false,
      }
    : null;
  const queued = [...p.queued].sort((a, b) => a.at.localeCompare(b.at));
  for (const q of queued) {
    if (q.kind === 'start' && !v) v = { startedMs: Date.parse(q.at), startImplied: false, startOdometer: q.odometer ?? null, endedMs: null, endOdometer: null, distanceM: null, distanceSource: null, waiting: true };
  }
  if (!v && p.anyStopMarked) v = { startedMs: Date.parse(p.plannedStartAt), startImplied: true, startOdometer: null, endedMs: null, endOdometer: null, distanceM: null, distanceSource: null, waiting: false };
  for (const q of queued) {
    if (q.kind !== 'end' || !v || v.endedMs != null || Date.parse(q.at) <= v.startedMs) continue;
    const measured = odometerDistanceM(v.startOdometer, q.odometer, p.units);
    v = { ...v, endedMs: Date.parse(q.at), endOdometer: q.odometer ?? null, distanceM: measured ?? p.plannedDistanceM, distanceSource: measured != null ? 'odometer' : 'planned', waiting: true };
  }
  return v;
}

