import type { Knex } from 'knex';
import { addDays, dueBucket, DUE_THIS_WEEK_DAYS, type DueBucket } from '../records/due.ts';
import { likePattern } from '../records/list-query.ts';
import type { DueListQuery, JobBatch } from '../../schemas/jobs.ts';

/** One line of the due list: a horse, when it is due, and its open job if it has one. */
export interface DueHorse {
  horseId: number;
  horseName: string;
  ownerName: string;
  barnId: number;
  barnName: string;
  cycleWeeks: number;
  lastVisitOn: string | null;
  nextDueOn: string | null;
  bucket: DueBucket;
  lastFarrierId: number | null;
  lastFarrierName: string | null;
  work: string[];
  minutes: number;
  needsSecondPerson: boolean;
  openJob: { id: number; state: string; dueOn: string } | null;
}

/** Counts per group for the tabs, over the same filters. */
export type DueCounts = Record<DueBucket | 'all', number>;

// Who did the horse's most recent visit: the due list's "farrier" filter reads it.
const LAST_FARRIER = `(SELECT v.farrier_id FROM visit_log_horses vh JOIN visit_logs v ON v.id = vh.visit_log_id
  WHERE vh.horse_id = h.id AND v.state = 'done' ORDER BY v.visit_date DESC, v.id DESC LIMIT 1)`;

const dateText = (v: unknown): string | null => (v == null ? null : v instanceof Date ? v.toISOString().slice(0, 10) : String(v).slice(0, 10));

interface DueFilters { barnId?: number; farrierId?: number; workTypeId?: number; q?: string }

function filtered(db: Knex | Knex.Transaction, practiceId: number, f: DueFilters): Knex.QueryBuilder {
  const q = db('horses as h').where('h.practice_id', practiceId).whereNull('h.archived_at');
  if (f.barnId) q.where('h.barn_id', f.barnId);
  if (f.workTypeId) q.whereExists(db('horse_work_types as hw').whereRaw('hw.horse_id = h.id').where('hw.work_type_id', f.workTypeId).select(db.raw('1')));
  if (f.farrierId) q.whereRaw(`${LAST_FARRIER} = ?`, [f.farrierId]);
  if (f.q) {
    const p = likePattern(f.q);
    q.where((w) => w.where('h.name', 'like', p).orWhereIn('h.barn_id', db('barns').where('practice_id', practiceId).where('name', 'like', p).select('id')).orWhereIn('h.owner_id', db('owners').where('practice_id', practiceId).where('name', 'like', p).select('id')));
  }
  return q;
}

function bucketWhere(q: Knex.QueryBuilder, bucket: DueBucket | 'all', today: string) {
  const weekEnd = addDays(today, DUE_THIS_WEEK_DAYS);
  if (bucket === 'overdue') q.where('h.next_due_on', '<', today);
  if (bucket === 'this_week') q.where((w) => w.whereBetween('h.next_due_on', [today, weekEnd]).orWhereNull('h.next_due_on'));
  if (bucket === 'later') q.where('h.next_due_on', '>', weekEnd);
  return q;
}

/**
 * The due list for a practice on its local day `today`: horses ordered by next due date (never-visited
 * first, as they are due now), one page of them, and the count of each group under the same filters.
 */
export async function listDue(db: Knex, practiceId: number, today: string, query: DueListQuery): Promise<{ items: DueHorse[]; counts: DueCounts; total: number; page: number; pageSize: number }> {
  const weekEnd = addDays(today, DUE_THIS_WEEK_DAYS);
  const [c] = await filtered(db, practiceId, query).select(
    db.raw('COUNT(*) AS all_n'),
    db.raw('SUM(h.next_due_on < ?) AS overdue_n', [today]),
    db.raw('SUM(h.next_due_on IS NULL OR h.next_due_on BETWEEN ? AND ?) AS week_n', [today, weekEnd]),
    db.raw('SUM(h.next_due_on > ?) AS later_n', [weekEnd]),
  );
  const counts: DueCounts = { all: Number(c?.all_n ?? 0), overdue: Number(c?.overdue_n ?? 0), this_week: Number(c?.week_n ?? 0), later: Number(c?.later_n ?? 0) };
  const rows = await bucketWhere(filtered(db, practiceId, query), query.bucket, today)
    .join('owners as o', 'o.id', 'h.owner_id')
    .join('barns as b', 'b.id', 'h.barn_id')
    .leftJoin('jobs as j', 'j.open_horse_id', 'h.id')
    .select('h.id', 'h.name', 'h.cycle_weeks', 'h.last_visit_on', 'h.next_due_on', 'h.barn_id', 'h.needs_second_person', 'o.name as owner_name', 'b.name as barn_name', 'j.id as job_id', 'j.state as job_state', 'j.due_on as job_due_on', db.raw(`${LAST_FARRIER} AS last_farrier_id`))
    .orderByRaw('h.next_due_on IS NOT NULL, h.next_due_on, h.id')
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize);
  const ids = rows.map((r: any) => r.id as number);
  const work = ids.length
    ? await db('horse_work_types as hw').join('work_types as w', 'w.id', 'hw.work_type_id').whereIn('hw.horse_id', ids).orderBy('w.name').select('hw.horse_id', 'w.name', 'w.minutes_per_horse')
    : [];
  const farrierIds = [...new Set(rows.map((r: any) => r.last_farrier_id).filter((x: unknown) => x != null))] as number[];
  const farriers = new Map<number, string>(
    farrierIds.length ? (await db('farriers').whereIn('id', farrierIds).select('id', 'name')).map((f) => [f.id, f.name]) : [],
  );
  const items = rows.map((r: any): DueHorse => {
    const mine = work.filter((w) => w.horse_id === r.id);
    const nextDue = dateText(r.next_due_on);
    return {
      horseId: r.id, horseName: r.name, ownerName: r.owner_name, barnId: r.barn_id, barnName: r.barn_name, cycleWeeks: r.cycle_weeks,
      lastVisitOn: dateText(r.last_visit_on), nextDueOn: nextDue, bucket: dueBucket(nextDue, today),
      lastFarrierId: r.last_farrier_id ?? null, lastFarrierName: r.last_farrier_id ? farriers.get(r.last_farrier_id) ?? null : null,
      work: mine.map((w) => w.name), minutes: mine.reduce((s, w) => s + w.minutes_per_horse, 0), needsSecondPerson: Boolean(r.needs_second_person),
      openJob: r.job_id ? { id: r.job_id, state: r.job_state, dueOn: dateText(r.job_due_on)! } : null,
    };
  });
  const total = query.bucket === 'all' ? counts.all : counts[query.bucket];
  return { items, counts, total, page: query.page, pageSize: query.pageSize };
}

/** Days before and after the due date that a job may be planned in (common practice; no source). */
export const JOB_WINDOW = { beforeDays: 7, afterDays: 10 };

function isDuplicate(error: unknown): boolean {
  return (error as { code?: string })?.code === 'ER_DUP_ENTRY';
}

/**
 * Inserts one job for a horse with minutes summed from its usual work types. Returns null when the
 * horse already has an open job: the unique generated column jobs.open_horse_id refuses a second one,
 * even when two people create jobs at the same moment.
 */
async function insertJob(trx: Knex.Transaction, practiceId: number, horseId: number, dueOn: string): Promise<number | null | 'no_work'> {
  const work = await trx('horse_work_types as hw').join('work_types as w', 'w.id', 'hw.work_type_id').where('hw.horse_id', horseId).select('w.id', 'w.minutes_per_horse');
  const minutes = work.reduce((s, w) => s + w.minutes_per_horse, 0);
  if (minutes === 0) return 'no_work';
  try {
    const [id] = await trx('jobs').insert({
      practice_id: practiceId, horse_id: horseId, minutes, due_on: dueOn, state: 'due',
      earliest_on: addDays(dueOn, -JOB_WINDOW.beforeDays), latest_on: addDays(dueOn, JOB_WINDOW.afterDays),
    });
    await trx('job_work_types').insert(work.map((w) => ({ job_id: Number(id), work_type_id: w.id })));
    return Number(id);
  } catch (error) {
    // InnoDB rolls back only the failed statement; the transaction goes on with the next horse.
    if (isDuplicate(error)) return null;
    throw error;
  }
}

/** Creates the job of one horse; 'open' when it already has an open job, 'no_work' without usual work. */
export async function createJob(trx: Knex.Transaction, practiceId: number, horseId: number, dueOn: string): Promise<{ id: number } | 'open' | 'no_work'> {
  const r = await insertJob(trx, practiceId, horseId, dueOn);
  if (r === null) return 'open';
  if (r === 'no_work') return 'no_work';
  return { id: r };
}

/** The outcome of creating jobs for a date range. */
export interface BatchResult {
  created: number;
  alreadyOpen: number;
  withoutWork: number;
  jobIds: number[];
}

/**
 * Jobs for every current horse due in [from, to] (and overdue or never-visited ones when asked) that
 * has no open job yet. Never-visited horses are due today. Runs inside the caller's transaction.
 */
export async function createJobsForRange(trx: Knex.Transaction, practiceId: number, today: string, batch: JobBatch): Promise<BatchResult> {
  const q = filtered(trx, practiceId, batch).leftJoin('jobs as j', 'j.open_horse_id', 'h.id');
  q.where((w) => {
    w.whereBetween('h.next_due_on', [batch.from, batch.to]);
    if (batch.includeOverdue) w.orWhere('h.next_due_on', '<', batch.from).orWhereNull('h.next_due_on');
  });
  const candidates: { id: number; next_due_on: unknown; job_id: number | null }[] = await q.select('h.id', 'h.next_due_on', 'j.id as job_id').orderBy('h.id');
  const result: BatchResult = { created: 0, alreadyOpen: 0, withoutWork: 0, jobIds: [] };
  const fresh = candidates.filter((c) => {
    if (c.job_id) result.alreadyOpen += 1;
    return !c.job_id;
  });
  // In chunks: one query for the chunk's usual work, one multi-row insert of its jobs, one of their work.
  for (let i = 0; i < fresh.length; i += BATCH_ROWS) {
    const chunk = fresh.slice(i, i + BATCH_ROWS);
    const work: { horse_id: number; id: number; minutes_per_horse: number }[] = await trx('horse_work_types as hw')
      .join('work_types as w', 'w.id', 'hw.work_type_id')
      .whereIn('hw.horse_id', chunk.map((c) => c.id))
      .select('hw.horse_id', 'w.id', 'w.minutes_per_horse');
    const byHorse = new Map<number, { id: number; minutes_per_horse: number }[]>();
    for (const w of work) byHorse.set(w.horse_id, [...(byHorse.get(w.horse_id) ?? []), w]);
    const rows: Record<string, unknown>[] = [];
    for (const c of chunk) {
      const minutes = (byHorse.get(c.id) ?? []).reduce((sum, w) => sum + w.minutes_per_horse, 0);
      if (minutes === 0) {
        result.withoutWork += 1;
        continue;
      }
      const dueOn = dateText(c.next_due_on) ?? today;
      rows.push({
        practice_id: practiceId, horse_id: c.id, minutes, due_on: dueOn, state: 'due',
        earliest_on: addDays(dueOn, -JOB_WINDOW.beforeDays), latest_on: addDays(dueOn, JOB_WINDOW.afterDays),
      });
    }
    if (rows.length === 0) continue;
    // A horse that got an open job meanwhile (another request) is refused by the unique open_horse_id
    // and skipped by IGNORE; RETURNING lists only the jobs really inserted, each with its horse.
    const { sql, bindings } = trx('jobs').insert(rows).toSQL().toNative();
    const [inserted] = (await trx.raw(`${sql.replace(/^insert into/i, 'insert ignore into')} returning id, horse_id`, bindings)) as [{ id: number; horse_id: number }[]];
    result.alreadyOpen += rows.length - inserted.length;
    const jobWork = inserted.flatMap((j) => (byHorse.get(j.horse_id) ?? []).map((w) => ({ job_id: j.id, work_type_id: w.id })));
    if (jobWork.length) await trx('job_work_types').insert(jobWork);
    const order = new Map(inserted.map((j) => [j.horse_id, j.id]));
    for (const c of chunk) {
      const id = order.get(c.id);
      if (id !== undefined) result.jobIds.push(id);
    }
    result.created += inserted.length;
  }
  return result;
}

/** Horses per insert statement when creating jobs for a range (keeps each statement's size bounded). */
const BATCH_ROWS = 500;

/** A job of the practice, for cancelling. */
export async function getJob(db: Knex | Knex.Transaction, practiceId: number, id: number): Promise<{ id: number; horseId: number; state: string } | null> {
  const row = await db('jobs').where({ practice_id: practiceId, id }).first('id', 'horse_id', 'state');
  return row ? { id: row.id, horseId: row.horse_id, state: row.state } : null;
}

export async function cancelJob(db: Knex | Knex.Transaction, practiceId: number, id: number): Promise<void> {
  await db('jobs').where({ practice_id: practiceId, id }).update({ state: 'cancelled', updated_at: new Date() });
}
