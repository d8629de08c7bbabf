import type { Knex } from 'knex';
import type { z } from 'zod';
import { likePattern, type Page } from '../records/list-query.ts';
import { isoOrNull, pageOf } from '../records/paging.ts';
import type { AccessHours, BarnCreate, BarnPatch, barnListQuery } from '../../schemas/barns.ts';

type BarnListQuery = z.infer<typeof barnListQuery>;

/** A barn as the API and screens see it. */
export interface Barn {
  id: number;
  name: string;
  ownerId: number | null;
  ownerName: string | null;
  address: string;
  addressPointId: string | null;
  lat: number;
  lon: number;
  accessHours: AccessHours;
  setupMinutes: number;
  notes: string | null;
  archivedAt: string | null;
  horses: number;
}

const SORTS: Record<BarnListQuery['sort'], string> = { name: 'b.name', address: 'b.address', horses: 'horses', owner: 'owner_name' };

function fromRow(r: any): Barn {
  return {
    id: r.id,
    name: r.name,
    ownerId: r.owner_id,
    ownerName: r.owner_name ?? null,
    address: r.address,
    addressPointId: r.address_point_id,
    lat: Number(r.lat),
    lon: Number(r.lon),
    accessHours: typeof r.access_hours === 'string' ? JSON.parse(r.access_hours) : r.access_hours,
    setupMinutes: r.setup_minutes,
    notes: r.notes,
    archivedAt: isoOrNull(r.archived_at),
    horses: Number(r.horses ?? 0),
  };
}

function columns(db: Knex, q: Knex.QueryBuilder) {
  return q
    .leftJoin('owners as o', 'o.id', 'b.owner_id')
    .select('b.*', 'o.name as owner_name', db.raw('(SELECT COUNT(*) FROM horses h WHERE h.barn_id = b.id AND h.archived_at IS NULL) AS horses'));
}

/** One page of a practice's barns, searched by name or address. */
export async function listBarns(db: Knex, practiceId: number, query: BarnListQuery): Promise<Page<Barn>> {
  const q = db('barns as b').where('b.practice_id', practiceId);
  if (query.archived === 'exclude') q.whereNull('b.archived_at');
  if (query.archived === 'only') q.whereNotNull('b.archived_at');
  if (query.ownerId) q.where('b.owner_id', query.ownerId);
  if (query.q) {
    const p = likePattern(query.q);
    q.where((w) => w.where('b.name', 'like', p).orWhere('b.address', 'like', p));
  }
  return pageOf(q, query.page, query.pageSize, (b) => columns(db, b).orderBy(SORTS[query.sort], query.dir).orderBy('b.id', query.dir), fromRow);
}

export async function getBarn(db: Knex | Knex.Transaction, practiceId: number, id: number): Promise<Barn | null> {
  const row = await columns(db as Knex, db('barns as b').where({ 'b.practice_id': practiceId, 'b.id': id })).first();
  return row ? fromRow(row) : null;
}

/** Barn names for pickers and filters (current barns only). */
export async function listBarnOptions(db: Knex, practiceId: number): Promise<{ id: number; name: string }[]> {
  return db('barns').where({ practice_id: practiceId }).whereNull('archived_at').orderBy('name').select('id', 'name');
}

function toRow(input: BarnPatch): Record<string, unknown> {
  const row: Record<string, unknown> = {};
  if (input.name !== undefined) row.name = input.name;
  if (input.ownerId !== undefined) row.owner_id = input.ownerId;
  if (input.address !== undefined) row.address = input.address;
  if (input.addressPointId !== undefined) row.address_point_id = input.addressPointId;
  if (input.lat !== undefined) row.lat = input.lat;
  if (input.lon !== undefined) row.lon = input.lon;
  if (input.accessHours !== undefined) row.access_hours = JSON.stringify(input.accessHours);
  if (input.setupMinutes !== undefined) row.setup_minutes = input.setupMinutes;
  if (input.notes !== undefined) row.notes = input.notes;
  if (input.archived !== undefined) row.archived_at = input.archived ? new Date() : null;
  return row;
}

export async function createBarn(db: Knex | Knex.Transaction, practiceId: number, input: BarnCreate): Promise<number> {
  const [id] = await db('barns').insert({ practice_id: practiceId, setup_minutes: 10, ...toRow(input) });
  return Number(id);
}

export async function updateBarn(db: Knex | Knex.Transaction, practiceId: number, id: number, patch: BarnPatch): Promise<boolean> {
  const n = await db('barns').where({ practice_id: practiceId, id }).update({ ...toRow(patch), updated_at: new Date() });
  return n > 0;
}

/** Why a barn cannot be deleted (horses, visits or planned stops refer to it), or null. */
export async function barnInUse(db: Knex | Knex.Transaction, id: number): Promise<string | null> {
  const [h] = await db('horses').where({ barn_id: id }).count({ n: '*' });
  const [v] = await db('visit_logs').where({ barn_id: id }).count({ n: '*' });
  const [s] = await db('stops').where({ barn_id: id }).count({ n: '*' });
  const parts: string[] = [];
  if (Number(h?.n) > 0) parts.push(`${h!.n} ${Number(h!.n) === 1 ? 'horse' : 'horses'}`);
  if (Number(v?.n) > 0) parts.push(`${v!.n} recorded ${Number(v!.n) === 1 ? 'visit' : 'visits'}`);
  if (Number(s?.n) > 0) parts.push(`${s!.n} planned ${Number(s!.n) === 1 ? 'stop' : 'stops'}`);
  return parts.length ? `This barn still has ${parts.join(', ')}; archive it instead to keep the history.` : null;
}

export async function deleteBarn(db: Knex | Knex.Transaction, practiceId: number, id: number): Promise<void> {
  await db('barns').where({ practice_id: practiceId, id }).delete();
}

/** Whether an owner id belongs to the practice (and is current), for validating references. */
export async function ownerBelongs(db: Knex | Knex.Transaction, practiceId: number, ownerId: number): Promise<boolean> {
  return Boolean(await db('owners').where({ practice_id: practiceId, id: ownerId }).first('id'));
}
