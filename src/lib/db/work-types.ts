import type { Knex } from 'knex';
import type { z } from 'zod';
import { likePattern, type Page } from '../records/list-query.ts';
import { isoOrNull, pageOf } from '../records/paging.ts';
import type { WorkTypeCreate, WorkTypePatch, workTypeListQuery } from '../../schemas/work-types.ts';

type WorkTypeListQuery = z.infer<typeof workTypeListQuery>;

/** A work type as the API and screens see it; `horses` counts current horses that usually get it. */
export interface WorkType {
  id: number;
  name: string;
  minutesPerHorse: number;
  needsForge: boolean;
  needsQualified: boolean;
  priceCents: number;
  archivedAt: string | null;
  horses: number;
}

const SORTS: Record<WorkTypeListQuery['sort'], string> = { name: 'w.name', minutesPerHorse: 'w.minutes_per_horse', priceCents: 'w.price_cents', horses: 'horses' };

function fromRow(r: any): WorkType {
  return {
    id: r.id, name: r.name, minutesPerHorse: r.minutes_per_horse, needsForge: Boolean(r.needs_forge), needsQualified: Boolean(r.needs_qualified),
    priceCents: r.price_cents, archivedAt: isoOrNull(r.archived_at), horses: Number(r.horses ?? 0),
  };
}

const columns = (db: Knex, q: Knex.QueryBuilder) =>
  q.select('w.*', db.raw('(SELECT COUNT(*) FROM horse_work_types hw JOIN horses h ON h.id = hw.horse_id WHERE hw.work_type_id = w.id AND h.archived_at IS NULL) AS horses'));

export async function listWorkTypes(db: Knex, practiceId: number, query: WorkTypeListQuery): Promise<Page<WorkType>> {
  const q = db('work_types as w').where('w.practice_id', practiceId);
  if (query.archived === 'exclude') q.whereNull('w.archived_at');
  if (query.archived === 'only') q.whereNotNull('w.archived_at');
  if (query.q) q.where('w.name', 'like', likePattern(query.q));
  return pageOf(q, query.page, query.pageSize, (b) => columns(db, b).orderBy(SORTS[query.sort], query.dir).orderBy('w.id', query.dir), fromRow);
}

export async function getWorkType(db: Knex, practiceId: number, id: number): Promise<WorkType | null> {
  const row = await columns(db, db('work_types as w').where({ 'w.practice_id': practiceId, 'w.id': id })).first();
  return row ? fromRow(row) : null;
}

/** Current work types for pickers, with minutes, forge and qualification. */
export async function listWorkTypeOptions(db: Knex, practiceId: number): Promise<{ id: number; name: string; minutesPerHorse: number }[]> {
  const rows = await db('work_types').where({ practice_id: practiceId }).whereNull('archived_at').orderBy('name').select('id', 'name', 'minutes_per_horse');
  return rows.map((r) => ({ id: r.id, name: r.name, minutesPerHorse: r.minutes_per_horse }));
}

function toRow(input: WorkTypePatch): Record<string, unknown> {
  const row: Record<string, unknown> = {};
  if (input.name !== undefined) row.name = input.name;
  if (input.minutesPerHorse !== undefined) row.minutes_per_horse = input.minutesPerHorse;
  if (input.needsForge !== undefined) row.needs_forge = input.needsForge;
  if (input.needsQualified !== undefined) row.needs_qualified = input.needsQualified;
  if (input.priceCents !== undefined) row.price_cents = input.priceCents;
  if (input.archived !== undefined) row.archived_at = input.archived ? new Date() : null;
  return row;
}

export async function createWorkType(db: Knex | Knex.Transaction, practiceId: number, input: WorkTypeCreate): Promise<number> {
  const [id] = await db('work_types').insert({ practice_id: practiceId, ...toRow(input) });
  return Number(id);
}

export async function updateWorkType(db: Knex | Knex.Transaction, practiceId: number, id: number, patch: WorkTypePatch): Promise<boolean> {
  return (await db('work_types').where({ practice_id: practiceId, id }).update({ ...toRow(patch), updated_at: new Date() })) > 0;
}

/** Why a work type cannot be deleted (horses usually get it, jobs hold it), or null. */
export async function workTypeInUse(db: Knex | Knex.Transaction, id: number): Promise<string | null> {
  const [h] = await db('horse_work_types').where({ work_type_id: id }).count({ n: '*' });
  const [j] = await db('job_work_types').where({ work_type_id: id }).count({ n: '*' });
  const parts: string[] = [];
  if (Number(h?.n) > 0) parts.push(`${h!.n} ${Number(h!.n) === 1 ? 'horse gets' : 'horses get'} it`);
  if (Number(j?.n) > 0) parts.push(`${j!.n} ${Number(j!.n) === 1 ? 'job holds' : 'jobs hold'} it`);
  return parts.length ? `In use: ${parts.join(' and ')}. Archive it instead to keep the history.` : null;
}

export async function deleteWorkType(db: Knex | Knex.Transaction, practiceId: number, id: number): Promise<void> {
  await db('work_types').where({ practice_id: practiceId, id }).delete();
}
