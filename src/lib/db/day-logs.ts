import type { Knex } from 'knex';
import type { Db } from './connection.ts';

/**
 * day_logs: one row per farrier and working day, written by the day sheet's "Start the day" and "Back
 * home" marks (or a first stop mark) and by the office's corrections, read by the sheet and the review.
 */

/** A day log as the API and the day sheet show it. */
export interface DayLogView {
  id: number;
  farrierId: number;
  date: string;
  startedAt: string;
  endedAt: string | null;
  startOdometer: number | null;
  endOdometer: number | null;
  distanceM: number | null;
  /** 'odometer' measured, 'planned' the published route's distance, null not recorded (older logs). */
  distanceSource: 'odometer' | 'planned' | null;
  /** 'marked' by Start the day, 'first_stop' implied by the first stop mark, null for older logs. */
  startSource: 'marked' | 'first_stop' | null;
}

/** The figures a correction rewrites; the distance is worked out by the caller from the readings. */
export interface DayLogFigures {
  startedAt: Date;
  endedAt: Date | null;
  startOdometer: number | null;
  endOdometer: number | null;
  distanceM: number | null;
  distanceSource: DayLogView['distanceSource'];
}

const iso = (d: Date | string | null): string | null => (d ? new Date(d).toISOString() : null);

function viewOf(row: Record<string, unknown>): DayLogView {
  return {
    id: Number(row.id),
    farrierId: Number(row.farrier_id),
    date: String(row.work_date),
    startedAt: iso(row.started_at as Date)!,
    endedAt: iso(row.ended_at as Date | null),
    startOdometer: row.start_odometer == null ? null : Number(row.start_odometer),
    endOdometer: row.end_odometer == null ? null : Number(row.end_odometer),
    distanceM: row.distance_m == null ? null : Number(row.distance_m),
    distanceSource: (row.distance_source as DayLogView['distanceSource']) ?? null,
    startSource: (row.start_source as DayLogView['startSource']) ?? null,
  };
}

/**
 * The log that already holds a mark's client key, in any practice: a key is unique across the table,
 * so the caller tells a replay of its own mark from a key another practice's phone used first.
 */
export async function findDayLogByClientKey(db: Db, clientKey: string): Promise<{ practiceId: number; dayLog: DayLogView } | null> {
  const row = await db('day_logs').where({ start_client_key: clientKey }).orWhere({ end_client_key: clientKey }).first();
  return row ? { practiceId: row.practice_id, dayLog: viewOf(row) } : null;
}

/** The farrier's log of a date, locked until the transaction ends so two marks of one day queue up. */
export async function lockDayLogOfDay(trx: Knex.Transaction, practiceId: number, farrierId: number, date: string): Promise<DayLogView | null> {
  const row = await trx('day_logs').where({ practice_id: practiceId, farrier_id: farrierId, work_date: date }).forUpdate().first();
  return row ? viewOf(row) : null;
}

/** One log of the practice, locked for a correction so the figures before it cannot go stale. */
export async function lockDayLog(trx: Knex.Transaction, practiceId: number, id: number): Promise<DayLogView | null> {
  const row = await trx('day_logs').where({ id, practice_id: practiceId }).forUpdate().first();
  return row ? viewOf(row) : null;
}

/** A log by the id a write in the same transaction just used, to answer with it as stored. */
export async function getDayLog(db: Db, id: number): Promise<DayLogView> {
  return viewOf(await db('day_logs').where({ id }).first());
}

/** Writes the log of a day started with "Start the day"; the unique client key refuses a second copy. */
export async function insertMarkedStart(
  db: Db,
  start: { practiceId: number; farrierId: number; date: string; startedAt: Date; startOdometer: number | null; clientKey: string },
): Promise<number> {
  const [id] = await db('day_logs').insert({
    practice_id: start.practiceId, farrier_id: start.farrierId, work_date: start.date,
    started_at: start.startedAt, start_odometer: start.startOdometer, start_source: 'marked', start_client_key: start.clientKey,
  });
  return Number(id);
}

/** Whether the farrier's day already has a log, so a stop mark need not start it. */
export async function dayLogExists(db: Db, farrierId: number, date: string): Promise<boolean> {
  return Boolean(await db('day_logs').where({ farrier_id: farrierId, work_date: date }).first('id'));
}

/**
 * Writes the log of a day started by its first stop mark. A log written meanwhile by another mark wins
 * (the unique farrier and date skip this one): answers the new id, or null when nothing was written.
 */
export async function insertImpliedStart(db: Db, start: { practiceId: number; farrierId: number; date: string; startedAt: Date }): Promise<number | null> {
  const [id] = await db('day_logs')
    .insert({ practice_id: start.practiceId, farrier_id: start.farrierId, work_date: start.date, started_at: start.startedAt, start_source: 'first_stop' })
    .onConflict(['farrier_id', 'work_date'])
    .ignore();
  return id ? Number(id) : null;
}

/** Closes a day with "Back home": the end, its reading and key, and the distance the caller chose. */
export async function recordDayEnd(
  db: Db,
  id: number,
  end: { endedAt: Date; endOdometer: number | null; clientKey: string; distanceM: number; distanceSource: 'odometer' | 'planned' },
): Promise<void> {
  await db('day_logs').where({ id }).update({
    ended_at: end.endedAt, end_odometer: end.endOdometer, end_client_key: end.clientKey,
    distance_m: end.distanceM, distance_source: end.distanceSource,
  });
}

/** Rewrites a log's times, readings and distance for an office correction (the log was locked first). */
export async function updateDayLogFigures(db: Db, id: number, figures: DayLogFigures): Promise<void> {
  await db('day_logs').where({ id }).update({
    started_at: figures.startedAt, ended_at: figures.endedAt, start_odometer: figures.startOdometer, end_odometer: figures.endOdometer,
    distance_m: figures.distanceM, distance_source: figures.distanceSource,
  });
}

/** The practice's logs of a date (or one farrier's), in farrier order. */
export async function listDayLogs(db: Db, practiceId: number, date: string, farrierId?: number): Promise<DayLogView[]> {
  const q = db('day_logs').where({ practice_id: practiceId, work_date: date }).orderBy('farrier_id');
  if (farrierId !== undefined) q.andWhere({ farrier_id: farrierId });
  return (await q).map(viewOf);
}
