import type { Knex } from 'knex';
import type { Db } from './connection.ts';

/**
 * Stop marks from the day sheet and what they write: visit_marks keeps every mark as the phone sent it,
 * visit_logs the one result per stop that the board and the review read, visit_log_horses the work and
 * revenue of a done stop, and the jobs and horses the marks move on. Rows below a stop are reached
 * through a stop the caller has already held to the practice, so those go by stop, job or log id alone.
 */

export type VisitState = 'arrived' | 'done' | 'skipped';

/** A stop's result as its marks add up: the state and the times and reason that go with it. */
export interface VisitOutcome {
  state: VisitState;
  arrivedAt: Date | null;
  departedAt: Date | null;
  skipReason: string | null;
}

/** A stop as a mark needs it: who drives it, to which barn, on which day, and whether its plan is published. */
export interface MarkedStop {
  id: number;
  barnId: number;
  farrierId: number;
  routeStartAt: Date;
  planDate: string;
  planState: 'draft' | 'published';
}

/** One stop of a day's published routes with its current mark, as the progress view reads it. */
export interface ProgressRow {
  stopId: number;
  position: number;
  arrivalAt: Date;
  startAt: Date;
  departureAt: Date;
  barnName: string;
  farrierId: number;
  farrierName: string;
  state: VisitState | null;
  arrivedAt: Date | null;
  departedAt: Date | null;
  skipReason: string | null;
}

/**
 * The mark that already holds a client key, in any practice: a key is unique across the table, so the
 * caller tells a replay of its own mark from a key another practice's phone used first.
 */
export async function findVisitMark(
  db: Db,
  clientKey: string,
): Promise<{ practiceId: number; stopId: number; visitLogId: number | null; state: VisitState } | null> {
  const row = await db('visit_marks').where({ client_key: clientKey }).first();
  return row ? { practiceId: row.practice_id, stopId: row.stop_id, visitLogId: row.visit_log_id, state: row.state } : null;
}

/** The stop's newest visit log: the one a new mark rewrites and a replay answers with. */
export async function latestVisitLog(db: Db, stopId: number): Promise<{ id: number; state: VisitState } | null> {
  const row = await db('visit_logs').where({ stop_id: stopId }).orderBy('id', 'desc').first();
  return row ? { id: row.id, state: row.state } : null;
}

/**
 * One of the practice's stops with its route and plan, locked until the transaction ends so that two
 * marks of one stop replay its marks one after the other.
 */
export async function lockStopForMark(trx: Knex.Transaction, practiceId: number, stopId: number): Promise<MarkedStop | null> {
  const row = await trx('stops as s')
    .join('routes as r', 'r.id', 's.route_id')
    .join('plans as p', 'p.id', 'r.plan_id')
    .where({ 's.id': stopId, 's.practice_id': practiceId })
    .select('s.id', 's.barn_id', 'r.farrier_id', 'r.start_at as route_start_at', 'p.plan_date', 'p.state as plan_state')
    .forUpdate()
    .first();
  return row
    ? { id: row.id, barnId: row.barn_id, farrierId: row.farrier_id, routeStartAt: row.route_start_at, planDate: row.plan_date, planState: row.plan_state }
    : null;
}

/** Keeps a mark as the phone made it; the unique client key refuses a second copy. */
export async function insertVisitMark(
  db: Db,
  mark: { practiceId: number; clientKey: string; stopId: number; state: VisitState; markedAt: Date; skipReason: string | null; userId: number },
): Promise<number> {
  const [id] = await db('visit_marks').insert({
    practice_id: mark.practiceId,
    client_key: mark.clientKey,
    stop_id: mark.stopId,
    state: mark.state,
    marked_at: mark.markedAt,
    skip_reason: mark.skipReason,
    user_id: mark.userId,
  });
  return Number(id);
}

/** Every mark of the stop in the order the farrier made them (ties in the order they reached us). */
export async function listStopMarks(db: Db, stopId: number): Promise<{ state: VisitState; markedAt: Date; skipReason: string | null }[]> {
  const rows = await db('visit_marks').where({ stop_id: stopId }).orderBy([{ column: 'marked_at' }, { column: 'id' }]);
  return rows.map((m) => ({ state: m.state, markedAt: m.marked_at, skipReason: m.skip_reason }));
}

/** Records which visit log a mark went into. */
export async function linkMarkToVisitLog(db: Db, markId: number, visitLogId: number): Promise<void> {
  await db('visit_marks').where({ id: markId }).update({ visit_log_id: visitLogId });
}

/** Writes the stop's first visit log; `clientKey` is the key of the mark that opened it. */
export async function insertVisitLog(
  db: Db,
  visit: { practiceId: number; farrierId: number; barnId: number; stopId: number; date: string; clientKey: string } & VisitOutcome,
): Promise<number> {
  const [id] = await db('visit_logs').insert({
    practice_id: visit.practiceId,
    farrier_id: visit.farrierId,
    barn_id: visit.barnId,
    stop_id: visit.stopId,
    visit_date: visit.date,
    client_key: visit.clientKey,
    ...outcomeRow(visit),
  });
  return Number(id);
}

/** Rewrites a visit log with the outcome of all the stop's marks. */
export async function updateVisitLog(db: Db, id: number, outcome: VisitOutcome): Promise<void> {
  await db('visit_logs').where({ id }).update(outcomeRow(outcome));
}

function outcomeRow(o: VisitOutcome) {
  return { state: o.state, arrived_at: o.arrivedAt, departed_at: o.departedAt, skip_reason: o.skipReason };
}

/** The stop's jobs that still count (a cancelled job is not worked), with their horses. */
export async function listStopJobs(db: Db, stopId: number): Promise<{ id: number; horseId: number }[]> {
  const rows = await db('stop_jobs as sj')
    .join('jobs as j', 'j.id', 'sj.job_id')
    .where('sj.stop_id', stopId)
    .whereNot('j.state', 'cancelled')
    .select('j.id', 'j.horse_id');
  return rows.map((j) => ({ id: j.id, horseId: j.horse_id }));
}

/** Moves a stop's jobs on with its mark. */
export async function setVisitJobStates(db: Db, jobIds: number[], state: 'in_progress' | 'done' | 'skipped'): Promise<void> {
  if (jobIds.length === 0) return;
  await db('jobs').whereIn('id', jobIds).update({ state, updated_at: db.fn.now(3) });
}

/** Drops a visit log's horses, so that a stop marked again is not paid twice. */
export async function clearVisitHorses(db: Db, visitLogId: number): Promise<void> {
  await db('visit_log_horses').where({ visit_log_id: visitLogId }).delete();
}

/** The work of each job with its price, to record what a done stop earned. */
export async function listWorkPrices(db: Db, jobIds: number[]): Promise<{ jobId: number; name: string; priceCents: number }[]> {
  const rows = await db('job_work_types as jw').join('work_types as w', 'w.id', 'jw.work_type_id').whereIn('jw.job_id', jobIds).select('jw.job_id', 'w.name', 'w.price_cents');
  return rows.map((w) => ({ jobId: w.job_id, name: w.name, priceCents: Number(w.price_cents) }));
}

/** The horses done at a stop, each with the work and revenue the review counts. */
export async function insertVisitHorses(
  db: Db,
  horses: { visitLogId: number; horseId: number; jobId: number; work: string; revenueCents: number }[],
): Promise<void> {
  await db('visit_log_horses').insert(
    horses.map((h) => ({ visit_log_id: h.visitLogId, horse_id: h.horseId, job_id: h.jobId, work: h.work, revenue_cents: h.revenueCents })),
  );
}

/** Sets the day the horses were last done, from which their next visit falls due. */
export async function setLastVisitOn(db: Db, horseIds: number[], date: string): Promise<void> {
  await db('horses').whereIn('id', horseIds).update({ last_visit_on: date, updated_at: db.fn.now(3) });
}

/**
 * The stops of the practice's published routes of a day (or one farrier's), by farrier name and
 * position, each with its visit log. A stop with more than one log comes once per log.
 */
export async function listDayProgress(db: Db, practiceId: number, date: string, farrierId?: number): Promise<ProgressRow[]> {
  const q = db('stops as s')
    .join('routes as r', 'r.id', 's.route_id')
    .join('plans as p', 'p.id', 'r.plan_id')
    .join('farriers as f', 'f.id', 'r.farrier_id')
    .join('barns as b', 'b.id', 's.barn_id')
    .leftJoin('visit_logs as v', 'v.stop_id', 's.id')
    .where({ 'p.practice_id': practiceId, 'p.plan_date': date, 'p.state': 'published' })
    .select('s.id', 's.position', 's.arrival_at', 's.start_at', 's.departure_at', 'b.name as barn_name', 'r.farrier_id', 'f.name as farrier_name', 'v.state', 'v.arrived_at', 'v.departed_at', 'v.skip_reason')
    .orderBy([{ column: 'f.name' }, { column: 's.position' }]);
  if (farrierId) q.andWhere('r.farrier_id', farrierId);
  const rows = await q;
  return rows.map((r) => ({
    stopId: r.id,
    position: r.position,
    arrivalAt: r.arrival_at,
    startAt: r.start_at,
    departureAt: r.departure_at,
    barnName: r.barn_name,
    farrierId: r.farrier_id,
    farrierName: r.farrier_name,
    state: r.state ?? null,
    arrivedAt: r.arrived_at ?? null,
    departedAt: r.departed_at ?? null,
    skipReason: r.skip_reason ?? null,
  }));
}
