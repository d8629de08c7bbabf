/**
 * The farrier's day in day_logs, as the review reads it: started_at (leaving home), ended_at (back
 * home) and distance_m. The day sheet writes it with two marks, "Start the day" and "Back home", each
 * with an optional odometer reading in the practice's units; the distance is the odometer difference
 * when both readings are given, else the published route's planned distance, and distance_source
 * says which. A first stop mark on a day not yet started starts it at the planned departure time.
 * Marks come through the phone's offline queue: the client key makes a replay a no-op, and marks
 * out of order are refused without changing anything (back home before a start, a second start, a
 * second back home). Dispatchers and leads correct a day with a reason, kept in the audit log.
 */
import type { Knex } from 'knex';
import { audit } from '../db/audit.ts';
import {
  dayLogExists, findDayLogByClientKey, getDayLog, insertImpliedStart, insertMarkedStart, lockDayLog, lockDayLogOfDay, recordDayEnd,
  updateDayLogFigures, type DayLogView,
} from '../db/day-logs.ts';
import { getRouteOfDay } from '../db/plans.ts';
import { existsInPractice } from '../db/records-lock.ts';
import { HttpError } from '../server/http.ts';
import type { Units } from '../review/mileage.ts';
import { odometerDistanceM, odometerProblem, MAX_DAY_ODOMETER_UNITS } from './odometer.ts';
import { unitLabel } from '../review/mileage.ts';
import type { MarkActor } from './visits.ts';

export type { DayLogView };
/** Day logs of a date for the practice (or one farrier), for GET /api/day-logs and the day sheet. */
export { listDayLogs as dayLogsOf } from '../db/day-logs.ts';

export interface DayMarkInput {
  clientKey: string;
  kind: 'start' | 'end';
  date: string;
  at: string;
  odometer?: number | null;
  farrierId?: number;
}

/** What the marks need to know of the practice: units for odometer readings, zone for messages. */
export interface DayPractice {
  units: Units;
  timeZone: string;
}

/** A mark or correction refused, with the HTTP status and (for 400) the field it is about. */
export class DayMarkRefused extends Error {
  constructor(
    readonly status: 400 | 404 | 409,
    message: string,
    readonly field?: string,
  ) {
    super(message);
  }
}

/** A refused mark or correction as the API's JSON error (400 names the field). */
export function refusal(e: DayMarkRefused): HttpError {
  const code = e.status === 404 ? 'not_found' : e.status === 409 ? 'conflict' : 'invalid_request';
  return new HttpError(e.status, code, e.message, e.field ? { [e.field]: e.message } : undefined);
}

export interface DayMarkResult {
  replayed: boolean;
  dayLog: DayLogView;
}

/** How far from the planned day a mark's time may be: a time outside it is a wrong clock or wrong day. */
const SLACK_MS = 12 * 3600_000;

function clockText(d: Date | string, timeZone: string): string {
  return new Intl.DateTimeFormat('en-US', { timeZone, hour: 'numeric', minute: '2-digit' }).format(new Date(d)).replace(' AM', 'am').replace(' PM', 'pm');
}

/** The planned distance of the farrier's published route that day, the fallback when no odometer pair exists. */
async function plannedDistanceM(db: Knex | Knex.Transaction, practiceId: number, farrierId: number, date: string): Promise<number | null> {
  const r = await getRouteOfDay(db, practiceId, farrierId, date);
  return r && r.planState === 'published' ? r.distanceM : null;
}

function odometerRefusal(problem: 'backwards' | 'too_far', start: number, units: Units, field: string): DayMarkRefused {
  const u = unitLabel(units);
  return problem === 'backwards'
    ? new DayMarkRefused(400, `The odometer reading is below the start of the day's ${start.toLocaleString('en-US')} ${u}`, field)
    : new DayMarkRefused(400, `More than ${MAX_DAY_ODOMETER_UNITS.toLocaleString('en-US')} ${u} since the start of the day's ${start.toLocaleString('en-US')}: check the digits`, field);
}

/**
 * Records "Start the day" or "Back home". A farrier marks only their own day; a dispatcher or lead
 * names the farrier. The farrier's route that day must be published. Answers the day log as it stands.
 */
export async function recordDayMark(db: Knex, actor: MarkActor, input: DayMarkInput, practice: DayPractice): Promise<DayMarkResult> {
  let farrierId: number;
  if (actor.role === 'farrier') {
    if (!actor.farrierId || (input.farrierId !== undefined && input.farrierId !== actor.farrierId)) throw new DayMarkRefused(404, 'Day sheet not found');
    farrierId = actor.farrierId;
  } else {
    if (input.farrierId === undefined) throw new DayMarkRefused(400, "Say which farrier's day this is", 'farrierId');
    farrierId = input.farrierId;
  }
  return db.transaction(async (trx) => {
    const replay = await findDayLogByClientKey(trx, input.clientKey);
    if (replay) {
      if (replay.practiceId !== actor.practiceId || replay.dayLog.farrierId !== farrierId) throw new DayMarkRefused(409, 'This mark key is already used');
      return { replayed: true, dayLog: replay.dayLog };
    }
    if (!(await existsInPractice(trx, 'farriers', actor.practiceId, farrierId))) throw new DayMarkRefused(404, 'Farrier not found');
    const route = await getRouteOfDay(trx, actor.practiceId, farrierId, input.date);
    if (!route) throw new DayMarkRefused(404, `No day sheet for this farrier on ${input.date}`);
    if (route.planState !== 'published') throw new DayMarkRefused(409, 'This day is not published yet');
    const at = new Date(input.at);
    if (at.getTime() < route.startAt.getTime() - SLACK_MS || at.getTime() > route.endAt.getTime() + SLACK_MS) {
      throw new DayMarkRefused(400, `That time is not on the day of ${input.date}: check the phone's clock`, 'at');
    }
    const log = await lockDayLogOfDay(trx, actor.practiceId, farrierId, input.date);
    const odometer = input.odometer ?? null;

    if (input.kind === 'start') {
      if (log) {
        const how = log.startSource === 'first_stop' ? ' (at the planned departure, when the first stop was marked)' : '';
        throw new DayMarkRefused(409, `The day was already started at ${clockText(log.startedAt, practice.timeZone)}${how}; this start changes nothing`);
      }
      const id = await insertMarkedStart(trx, { practiceId: actor.practiceId, farrierId, date: input.date, startedAt: at, startOdometer: odometer, clientKey: input.clientKey });
      await audit(trx, { practiceId: actor.practiceId, userId: actor.id, action: 'day_log.started', entity: 'day_log', entityId: id, detail: { clientKey: input.clientKey, at: input.at, odometer } });
      return { replayed: false, dayLog: await getDayLog(trx, id) };
    }

    if (!log) throw new DayMarkRefused(409, 'Back home before the day was started: mark Start the day first (or ask the office to correct the day)');
    if (log.endedAt) throw new DayMarkRefused(409, `The day already ended at ${clockText(log.endedAt, practice.timeZone)}; ask the office to correct it`);
    if (at.getTime() <= new Date(log.startedAt).getTime()) {
      throw new DayMarkRefused(409, `Back home at ${clockText(at, practice.timeZone)} is before the day's start at ${clockText(log.startedAt, practice.timeZone)}`);
    }
    const start = log.startOdometer;
    const problem = odometerProblem(start, odometer);
    if (problem) throw odometerRefusal(problem, start!, practice.units, 'odometer');
    const measured = odometerDistanceM(start, odometer, practice.units);
    const distanceM = measured ?? route.distanceM;
    await recordDayEnd(trx, log.id, { endedAt: at, endOdometer: odometer, clientKey: input.clientKey, distanceM, distanceSource: measured != null ? 'odometer' : 'planned' });
    await audit(trx, { practiceId: actor.practiceId, userId: actor.id, action: 'day_log.ended', entity: 'day_log', entityId: log.id, detail: { clientKey: input.clientKey, at: input.at, odometer, distanceM } });
    return { replayed: false, dayLog: await getDayLog(trx, log.id) };
  });
}

/**
 * Starts a farrier's day at the route's planned departure when a stop is marked before "Start the
 * day" (inside the stop mark's transaction). Does nothing when the day already has a log.
 */
export async function startDayImplicitly(
  trx: Knex.Transaction,
  opts: { practiceId: number; farrierId: number; date: string; plannedStartAt: Date; userId: number; stopId: number },
): Promise<void> {
  if (await dayLogExists(trx, opts.farrierId, opts.date)) return;
  const id = await insertImpliedStart(trx, { practiceId: opts.practiceId, farrierId: opts.farrierId, date: opts.date, startedAt: opts.plannedStartAt });
  if (id) await audit(trx, { practiceId: opts.practiceId, userId: opts.userId, action: 'day_log.started', entity: 'day_log', entityId: id, detail: { implied: true, byStopId: opts.stopId } });
}

export interface DayLogCorrection {
  reason: string;
  startedAt?: string;
  endedAt?: string | null;
  startOdometer?: number | null;
  endOdometer?: number | null;
}

/**
 * A dispatcher's or lead's correction of one day log of the practice, with a reason; the audit row
 * holds the reason and the figures before and after. The distance follows the readings: both given →
 * odometer; otherwise the planned route's distance, except that a log whose source was never
 * recorded (older history) keeps its distance; a reopened day (no end) has none.
 */
export async function correctDayLog(db: Knex, actor: MarkActor, id: number, input: DayLogCorrection, practice: DayPractice): Promise<DayLogView> {
  return db.transaction(async (trx) => {
    const log = await lockDayLog(trx, actor.practiceId, id);
    if (!log) throw new DayMarkRefused(404, 'Day log not found');
    const startedAt = input.startedAt !== undefined ? new Date(input.startedAt) : new Date(log.startedAt);
    const endedAt = input.endedAt !== undefined ? (input.endedAt ? new Date(input.endedAt) : null) : log.endedAt ? new Date(log.endedAt) : null;
    const startOdometer = input.startOdometer !== undefined ? input.startOdometer : log.startOdometer;
    const endOdometer = input.endOdometer !== undefined ? input.endOdometer : log.endOdometer;
    if (endedAt && endedAt.getTime() <= startedAt.getTime()) throw new DayMarkRefused(400, 'Back home must be after the start of the day', 'endedAt');
    const problem = odometerProblem(startOdometer, endOdometer);
    if (problem) throw odometerRefusal(problem, startOdometer!, practice.units, 'endOdometer');
    let distanceM: number | null;
    let distanceSource: DayLogView['distanceSource'];
    const measured = odometerDistanceM(startOdometer, endOdometer, practice.units);
    if (!endedAt) [distanceM, distanceSource] = [null, null];
    else if (measured != null) [distanceM, distanceSource] = [measured, 'odometer'];
    else if (log.distanceSource == null && log.distanceM != null) [distanceM, distanceSource] = [log.distanceM, null];
    else {
      distanceM = await plannedDistanceM(trx, actor.practiceId, log.farrierId, log.date);
      distanceSource = distanceM == null ? null : 'planned';
    }
    const figures = { startedAt, endedAt, startOdometer, endOdometer, distanceM, distanceSource };
    await updateDayLogFigures(trx, id, figures);
    const now: DayLogView = { ...log, ...figures, startedAt: startedAt.toISOString(), endedAt: endedAt ? endedAt.toISOString() : null };
    await audit(trx, { practiceId: actor.practiceId, userId: actor.id, action: 'day_log.corrected', entity: 'day_log', entityId: id, detail: { reason: input.reason, before: log, after: now } });
    return now;
  });
}
