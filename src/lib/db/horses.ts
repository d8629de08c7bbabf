import type { Knex } from 'knex';
import type { z } from 'zod';
import { likePattern, type Page } from '../records/list-query.ts';
import { isoOrNull, pageOf } from '../records/paging.ts';
import type { HorseCreate, HorsePatch, horseListQuery } from '../../schemas/horses.ts';

type HorseListQuery = z.infer<typeof horseListQuery>;

/** A horse as the API and screens see it; nextDueOn is last visit + cycle weeks (null if never seen). */
export interface Horse {
  id: number;
  name: string;
  ownerId: number;
  ownerName: string;
  barnId: number;
  barnName: string;
  cycleWeeks: number;
  lastVisitOn: string | null;
  nextDueOn: string | null;
  shoeSize: string | null;
  notes: string | null;
  needsSecondPerson: boolean;
  archivedAt: string | null;
  workTypes: { id: number; name: string }[];
}

const SORTS: Record<HorseListQuery['sort'], string> = {
  name: 'h.name', owner: 'o.name', barn: 'b.name', cycleWeeks: 'h.cycle_weeks', lastVisitOn: 'h.last_visit_on', nextDueOn: 'h.next_due_on',
};

const NULLABLE_SORTS = new Set<HorseListQuery['sort']>(['lastVisitOn', 'nextDueOn']);

const dateText = (v: unknown): string | null => (v == null ? null : v instanceof Date ? v.toISOString().slice(0, 10) : String(v).slice(0, 10));

function fromRow(r: any, work: Map<number, { id: number; name: string }[]>): Horse {
  return {
    id: r.id,
    name: r.name,
    ownerId: r.owner_id,
    ownerName: r.owner_name,
    barnId: r.barn_id,
    barnName: r.barn_name,
    cycleWeeks: r.cycle_weeks,
    lastVisitOn: dateText(r.last_visit_on),
    nextDueOn: dateText(r.next_due_on),
    shoeSize: r.shoe_size,
    notes: r.notes,
    needsSecondPerson: Boolean(r.needs_second_person),
    archivedAt: isoOrNull(r.archived_at),
    workTypes: work.get(r.id) ?? [],
  };
}

function columns(q: Knex.QueryBuilder) {
  return q.join('owners as o', 'o.id', 'h.owner_id').join('barns as b', 'b.id', 'h.barn_id').select('h.*', 'o.name as owner_name', 'b.name as barn_name');
}

/** The usual work types of some horses, in one query. */
export async function workTypesOf(db: Knex | Knex.Transaction, horseIds: number[]): Promise<Map<number, { id: number; name: string }[]>> {
  const map = new Map<number, { id: number; name: string }[]>();
  if (horseIds.length === 0) return map;
  const rows = await db('horse_work_types as hw').join('work_types as w', 'w.id', 'hw.work_type_id').whereIn('hw.horse_id', horseIds).orderBy('w.name').select('hw.horse_id', 'w.id', 'w.name');
  for (const r of rows) {
    const list = map.get(r.horse_id) ?? [];
    list.push({ id: r.id, name: r.name });
    map.set(r.horse_id, list);
  }
  return map;
}

/** One page of a practice's horses, searched by horse, owner or barn name, filtered by barn, owner, work. */
export async function listHorses(db: Knex, practiceId: number, query: HorseListQuery): Promise<Page<Horse>> {
  const q = db('horses as h').where('h.practice_id', practiceId);
  if (query.archived === 'exclude') q.whereNull('h.archived_at');
  if (query.archived === 'only') q.whereNotNull('h.archived_at');
  if (query.barnId) q.where('h.barn_id', query.barnId);
  if (query.ownerId) q.where('h.owner_id', query.ownerId);
  if (query.workTypeId) q.whereExists(db('horse_work_types as hw').whereRaw('hw.horse_id = h.id').where('hw.work_type_id', query.workTypeId).select(db.raw('1')));
  if (query.q) {
    const p = likePattern(query.q);
    // Owner and barn names are searched through indexed lookups of their ids, not by joining every row.
    q.where((w) =>
      w
        .where('h.name', 'like', p)
        .orWhereIn('h.owner_id', db('owners').where('practice_id', practiceId).where('name', 'like', p).select('id'))
        .orWhereIn('h.barn_id', db('barns').where('practice_id', practiceId).where('name', 'like', p).select('id')),
    );
  }
  const rows = await pageOf(q, query.page, query.pageSize, (b) => {
    const withCols = columns(b);
    // Nulls last only where a column can be null: on name or cycle weeks the extra term would stop MariaDB ordering by the index.
    if (NULLABLE_SORTS.has(query.sort)) withCols.orderByRaw(`${SORTS[query.sort]} IS NULL ${query.dir === 'asc' ? 'DESC' : 'ASC'}`);
    return withCols.orderBy(SORTS[query.sort], query.dir).orderBy('h.id', query.dir);
  }, (r) => r);
  const work = await workTypesOf(db, rows.items.map((r: any) => r.id));
  return { ...rows, items: rows.items.map((r) => fromRow(r, work)) };
}

export async function getHorse(db: Knex | Knex.Transaction, practiceId: number, id: number): Promise<Horse | null> {
  const row = await columns(db('horses as h').where({ 'h.practice_id': practiceId, 'h.id': id })).first();
  if (!row) return null;
  return fromRow(row, await workTypesOf(db, [id]));
}

function toRow(input: HorsePatch): Record<string, unknown> {
  const row: Record<string, unknown> = {};
  if (input.name !== undefined) row.name = input.name;
  if (input.ownerId !== undefined) row.owner_id = input.ownerId;
  if (input.barnId !== undefined) row.barn_id = input.barnId;
  if (input.cycleWeeks !== undefined) row.cycle_weeks = input.cycleWeeks;
  if (input.lastVisitOn !== undefined) row.last_visit_on = input.lastVisitOn;
  if (input.shoeSize !== undefined) row.shoe_size = input.shoeSize;
  if (input.notes !== undefined) row.notes = input.notes;
  if (input.needsSecondPerson !== undefined) row.needs_second_person = input.needsSecondPerson;
  if (input.archived !== undefined) row.archived_at = input.archived ? new Date() : null;
  return row;
}

/**
 * Checks that the owner, barn and work types named by a horse belong to the practice; returns the
 * field errors (empty when all are fine), so a wrong id is a 400 on that field rather than a leak.
 */
export async function horseReferenceErrors(db: Knex | Knex.Transaction, practiceId: number, input: HorsePatch): Promise<Record<string, string>> {
  const errors: Record<string, string> = {};
  if (input.ownerId !== undefined && !(await db('owners').where({ practice_id: practiceId, id: input.ownerId }).whereNull('archived_at').first('id'))) errors.ownerId = 'Choose one of the practice’s owners';
  if (input.barnId !== undefined && !(await db('barns').where({ practice_id: practiceId, id: input.barnId }).whereNull('archived_at').first('id'))) errors.barnId = 'Choose one of the practice’s barns';
  if (input.workTypeIds !== undefined) {
    const ids = [...new Set(input.workTypeIds)];
    const found = await db('work_types').where({ practice_id: practiceId }).whereNull('archived_at').whereIn('id', ids).count({ n: '*' });
    if (Number(found[0]?.n) !== ids.length) errors.workTypeIds = 'Choose work types of this practice';
  }
  return errors;
}

async function setWorkTypes(db: Knex | Knex.Transaction, horseId: number, ids: number[]) {
  await db('horse_work_types').where({ horse_id: horseId }).delete();
  const unique = [...new Set(ids)];
  if (unique.length) await db('horse_work_types').insert(unique.map((w) => ({ horse_id: horseId, work_type_id: w })));
}

export async function createHorse(db: Knex | Knex.Transaction, practiceId: number, input: HorseCreate): Promise<number> {
  const [id] = await db('horses').insert({ practice_id: practiceId, ...toRow(input) });
  await setWorkTypes(db, Number(id), input.workTypeIds);
  return Number(id);
}

export async function updateHorse(db: Knex | Knex.Transaction, practiceId: number, id: number, patch: HorsePatch): Promise<boolean> {
  const n = await db('horses').where({ practice_id: practiceId, id }).update({ ...toRow(patch), updated_at: new Date() });
  if (n > 0 && patch.workTypeIds) await setWorkTypes(db, id, patch.workTypeIds);
  return n > 0;
}

/** Why a horse cannot be deleted (jobs, recorded visits, uploads), or null. */
export async function horseInUse(db: Knex | Knex.Transaction, id: number): Promise<string | null> {
  const [j] = await db('jobs').where({ horse_id: id }).count({ n: '*' });
  const [v] = await db('visit_log_horses').where({ horse_id: id }).count({ n: '*' });
  const [u] = await db('uploads').where({ horse_id: id }).count({ n: '*' });
  const parts: string[] = [];
  if (Number(j?.n) > 0) parts.push(`${j!.n} ${Number(j!.n) === 1 ? 'job' : 'jobs'}`);
  if (Number(v?.n) > 0) parts.push(`${v!.n} recorded ${Number(v!.n) === 1 ? 'visit' : 'visits'}`);
  if (Number(u?.n) > 0) parts.push(`${u!.n} ${Number(u!.n) === 1 ? 'upload' : 'uploads'}`);
  return parts.length ? `This horse has ${parts.join(', ')}; archive it instead to keep the history.` : null;
}

/** The horse's open job, if any (a horse has at most one). */
export async function openJobOf(db: Knex | Knex.Transaction, horseId: number): Promise<{ id: number; state: string; dueOn: string } | null> {
  const row = await db('jobs').where({ open_horse_id: horseId }).first('id', 'state', 'due_on');
  return row ? { id: row.id, state: row.state, dueOn: dateText(row.due_on)! } : null;
}

export async function deleteHorse(db: Knex | Knex.Transaction, practiceId: number, id: number): Promise<void> {
  await db('horse_work_types').where({ horse_id: id }).delete();
  await db('horses').where({ practice_id: practiceId, id }).delete();
}

/** One recorded visit of a horse: when, where, by whom, what was done. */
export interface HorseVisit {
  visitDate: string;
  state: string;
  farrierName: string;
  barnName: string;
  work: string;
  revenueCents: number;
  skipReason: string | null;
}

/** The horse's visit history, newest first (at most `limit`). */
export async function horseVisits(db: Knex, practiceId: number, horseId: number, limit = 50): Promise<HorseVisit[]> {
  const rows = await db('visit_log_horses as vh')
    .join('visit_logs as v', 'v.id', 'vh.visit_log_id')
    .join('farriers as f', 'f.id', 'v.farrier_id')
    .join('barns as b', 'b.id', 'v.barn_id')
    .where({ 'vh.horse_id': horseId, 'v.practice_id': practiceId })
    .orderBy('v.visit_date', 'desc')
    .limit(limit)
    .select('v.visit_date', 'v.state', 'f.name as farrier_name', 'b.name as barn_name', 'vh.work', 'vh.revenue_cents', 'v.skip_reason');
  return rows.map((r) => ({ visitDate: dateText(r.visit_date)!, state: r.state, farrierName: r.farrier_name, barnName: r.barn_name, work: r.work, revenueCents: r.revenue_cents, skipReason: r.skip_reason }));
}
