import type { Knex } from 'knex';
import type { z } from 'zod';
import { likePattern, type Page } from '../records/list-query.ts';
import { isoOrNull, pageOf } from '../records/paging.ts';
import type { FarrierCreate, FarrierPatch, farrierListQuery } from '../../schemas/farriers.ts';

type FarrierListQuery = z.infer<typeof farrierListQuery>;

/** A farrier of the team as the API and Team screens see it, with the linked user account if any. */
export interface FarrierRecord {
  id: number;
  name: string;
  phone: string | null;
  homeAddress: string;
  homeLat: number;
  homeLon: number;
  qualifiedTherapeutic: boolean;
  apprentice: boolean;
  hasForge: boolean;
  workingDays: number[];
  shiftStartMinute: number;
  shiftEndMinute: number;
  breakMinutes: number;
  breakWindowStartMinute: number;
  breakWindowEndMinute: number;
  normalWorkMinutes: number;
  maxOvertimeMinutes: number;
  costPerHourCents: number;
  colour: string;
  archivedAt: string | null;
  userId: number | null;
  userEmail: string | null;
}

const SORTS: Record<FarrierListQuery['sort'], string> = { name: 'f.name', costPerHourCents: 'f.cost_per_hour_cents', shiftStartMinute: 'f.shift_start_minute' };

function fromRow(r: any): FarrierRecord {
  return {
    id: r.id, name: r.name, phone: r.phone, homeAddress: r.home_address, homeLat: Number(r.home_lat), homeLon: Number(r.home_lon),
    qualifiedTherapeutic: Boolean(r.qualified_therapeutic), apprentice: Boolean(r.apprentice), hasForge: Boolean(r.has_forge),
    workingDays: String(r.working_days).split(',').filter(Boolean).map(Number),
    shiftStartMinute: r.shift_start_minute, shiftEndMinute: r.shift_end_minute, breakMinutes: r.break_minutes,
    breakWindowStartMinute: r.break_window_start_minute, breakWindowEndMinute: r.break_window_end_minute,
    normalWorkMinutes: r.normal_work_minutes, maxOvertimeMinutes: r.max_overtime_minutes, costPerHourCents: r.cost_per_hour_cents,
    colour: r.colour, archivedAt: isoOrNull(r.archived_at), userId: r.user_id ?? null, userEmail: r.user_email ?? null,
  };
}

const columns = (db: Knex, q: Knex.QueryBuilder) =>
  q.leftJoin('users as u', function join() {
    this.on('u.farrier_id', '=', 'f.id').andOn('u.practice_id', '=', 'f.practice_id');
  }).select('f.*', 'u.id as user_id', 'u.email as user_email');

export async function listFarrierRecords(db: Knex, practiceId: number, query: FarrierListQuery): Promise<Page<FarrierRecord>> {
  const q = db('farriers as f').where('f.practice_id', practiceId);
  if (query.archived === 'exclude') q.whereNull('f.archived_at');
  if (query.archived === 'only') q.whereNotNull('f.archived_at');
  if (query.q) q.where((w) => w.where('f.name', 'like', likePattern(query.q)).orWhere('f.home_address', 'like', likePattern(query.q)));
  return pageOf(q, query.page, query.pageSize, (b) => columns(db, b).orderBy(SORTS[query.sort], query.dir).orderBy('f.id', query.dir), fromRow);
}

export async function getFarrierRecord(db: Knex | Knex.Transaction, practiceId: number, id: number): Promise<FarrierRecord | null> {
  const row = await columns(db as Knex, db('farriers as f').where({ 'f.practice_id': practiceId, 'f.id': id })).first();
  return row ? fromRow(row) : null;
}

/** Farrier-role users of the practice, with the farrier each is linked to, for the link picker. */
export async function listFarrierUsers(db: Knex, practiceId: number): Promise<{ id: number; name: string; email: string; farrierId: number | null }[]> {
  const rows = await db('users').where({ practice_id: practiceId, role: 'farrier', active: true }).orderBy('name').select('id', 'name', 'email', 'farrier_id');
  return rows.map((r) => ({ id: r.id, name: r.name, email: r.email, farrierId: r.farrier_id }));
}

function toRow(input: FarrierPatch): Record<string, unknown> {
  const map: [keyof FarrierPatch, string][] = [
    ['name', 'name'], ['phone', 'phone'], ['homeAddress', 'home_address'], ['homeLat', 'home_lat'], ['homeLon', 'home_lon'],
    ['qualifiedTherapeutic', 'qualified_therapeutic'], ['apprentice', 'apprentice'], ['hasForge', 'has_forge'],
    ['shiftStartMinute', 'shift_start_minute'], ['shiftEndMinute', 'shift_end_minute'], ['breakMinutes', 'break_minutes'],
    ['breakWindowStartMinute', 'break_window_start_minute'], ['breakWindowEndMinute', 'break_window_end_minute'],
    ['normalWorkMinutes', 'normal_work_minutes'], ['maxOvertimeMinutes', 'max_overtime_minutes'], ['costPerHourCents', 'cost_per_hour_cents'], ['colour', 'colour'],
  ];
  const row: Record<string, unknown> = {};
  for (const [k, c] of map) if (input[k] !== undefined) row[c] = input[k];
  if (input.workingDays !== undefined) row.working_days = [...new Set(input.workingDays)].sort().join(',');
  if (input.archived !== undefined) row.archived_at = input.archived ? new Date() : null;
  return row;
}

/**
 * Links a farrier to a user account (or unlinks with null). The user must be a farrier-role user of
 * the same practice; returns a field error otherwise. One user signs in as one farrier.
 */
export async function linkUser(db: Knex | Knex.Transaction, practiceId: number, farrierId: number, userId: number | null): Promise<string | null> {
  if (userId !== null) {
    const user = await db('users').where({ practice_id: practiceId, id: userId }).first('id', 'role');
    if (!user) return 'Choose a user of this practice';
    if (user.role !== 'farrier') return 'Only a user with the farrier role can be linked';
  }
  await db('users').where({ practice_id: practiceId, farrier_id: farrierId }).update({ farrier_id: null });
  if (userId !== null) await db('users').where({ practice_id: practiceId, id: userId }).update({ farrier_id: farrierId });
  return null;
}

export async function createFarrierRecord(db: Knex | Knex.Transaction, practiceId: number, input: FarrierCreate): Promise<number> {
  const [id] = await db('farriers').insert({ practice_id: practiceId, ...toRow(input) });
  return Number(id);
}

export async function updateFarrierRecord(db: Knex | Knex.Transaction, practiceId: number, id: number, patch: FarrierPatch): Promise<boolean> {
  const row = toRow(patch);
  if (Object.keys(row).length === 0) return Boolean(await db('farriers').where({ practice_id: practiceId, id }).first('id'));
  return (await db('farriers').where({ practice_id: practiceId, id }).update({ ...row, updated_at: new Date() })) > 0;
}

/** Why a farrier cannot be deleted (routes, recorded days or visits, pinned jobs, a linked user), or null. */
export async function farrierInUse(db: Knex | Knex.Transaction, id: number): Promise<string | null> {
  const checks: [string, string, string, string][] = [
    ['routes', 'farrier_id', 'planned route', 'planned routes'],
    ['visit_logs', 'farrier_id', 'recorded visit', 'recorded visits'],
    ['day_logs', 'farrier_id', 'recorded day', 'recorded days'],
    ['jobs', 'pinned_farrier_id', 'pinned job', 'pinned jobs'],
    ['users', 'farrier_id', 'linked user account', 'linked user accounts'],
  ];
  const parts: string[] = [];
  for (const [table, column, one, many] of checks) {
    const [r] = await db(table).where(column, id).count({ n: '*' });
    const n = Number(r?.n);
    if (n > 0) parts.push(`${n} ${n === 1 ? one : many}`);
  }
  return parts.length ? `This farrier has ${parts.join(', ')}; archive instead to keep the history.` : null;
}

export async function deleteFarrierRecord(db: Knex | Knex.Transaction, practiceId: number, id: number): Promise<void> {
  await db('farriers').where({ practice_id: practiceId, id }).delete();
}
