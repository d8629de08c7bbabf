import type { Knex } from 'knex';
import { likePattern, type Page } from '../records/list-query.ts';
import { isoOrNull, pageOf } from '../records/paging.ts';
import type { OwnerCreate, OwnerListQuery, OwnerPatch } from '../../schemas/owners.ts';

/** An owner as the API and screens see it. */
export interface Owner {
  id: number;
  name: string;
  phone: string | null;
  email: string | null;
  textConsentAt: string | null;
  optedOutAt: string | null;
  notes: string | null;
  archivedAt: string | null;
  horses: number;
  barns: number;
}

const SORTS: Record<OwnerListQuery['sort'], string> = { name: 'o.name', phone: 'o.phone', horses: 'horses', createdAt: 'o.created_at' };

function fromRow(r: any): Owner {
  return {
    id: r.id,
    name: r.name,
    phone: r.phone,
    email: r.email,
    textConsentAt: isoOrNull(r.text_consent_at),
    optedOutAt: isoOrNull(r.opted_out_at),
    notes: r.notes,
    archivedAt: isoOrNull(r.archived_at),
    horses: Number(r.horses ?? 0),
    barns: Number(r.barns ?? 0),
  };
}

function withCounts(db: Knex, q: Knex.QueryBuilder) {
  return q.select(
    'o.*',
    db.raw('(SELECT COUNT(*) FROM horses h WHERE h.owner_id = o.id AND h.archived_at IS NULL) AS horses'),
    db.raw('(SELECT COUNT(*) FROM barns b WHERE b.owner_id = o.id AND b.archived_at IS NULL) AS barns'),
  );
}

/** One page of a practice's owners, searched by name, phone or e-mail. */
export async function listOwners(db: Knex, practiceId: number, query: OwnerListQuery): Promise<Page<Owner>> {
  const q = db('owners as o').where('o.practice_id', practiceId);
  if (query.archived === 'exclude') q.whereNull('o.archived_at');
  if (query.archived === 'only') q.whereNotNull('o.archived_at');
  if (query.q) {
    const p = likePattern(query.q);
    q.where((w) => w.where('o.name', 'like', p).orWhere('o.phone', 'like', p).orWhere('o.email', 'like', p));
  }
  return pageOf(q, query.page, query.pageSize, (b) => withCounts(db, b).orderBy(SORTS[query.sort], query.dir).orderBy('o.id', query.dir), fromRow);
}

export async function getOwner(db: Knex, practiceId: number, id: number): Promise<Owner | null> {
  const row = await withCounts(db, db('owners as o').where({ 'o.practice_id': practiceId, 'o.id': id })).first();
  return row ? fromRow(row) : null;
}

/** Owner names for pickers (current owners only). */
export async function listOwnerOptions(db: Knex, practiceId: number): Promise<{ id: number; name: string }[]> {
  return db('owners').where({ practice_id: practiceId }).whereNull('archived_at').orderBy('name').select('id', 'name');
}

function toRow(input: OwnerPatch, now: Date): Record<string, unknown> {
  const row: Record<string, unknown> = {};
  if (input.name !== undefined) row.name = input.name;
  if (input.phone !== undefined) row.phone = input.phone;
  if (input.email !== undefined) row.email = input.email;
  if (input.notes !== undefined) row.notes = input.notes;
  if (input.textConsent !== undefined) row.text_consent_at = input.textConsent ? now : null;
  if (input.archived !== undefined) row.archived_at = input.archived ? now : null;
  return row;
}

export async function createOwner(db: Knex | Knex.Transaction, practiceId: number, input: OwnerCreate): Promise<number> {
  const [id] = await db('owners').insert({ practice_id: practiceId, ...toRow(input, new Date()) });
  return Number(id);
}

/** Applies a change; consent keeps its original time when it is given again. Returns false if absent. */
export async function updateOwner(db: Knex | Knex.Transaction, practiceId: number, id: number, patch: OwnerPatch): Promise<boolean> {
  const row = toRow(patch, new Date());
  if (patch.textConsent === true) {
    const current = await db('owners').where({ practice_id: practiceId, id }).first('text_consent_at');
    if (current?.text_consent_at) delete row.text_consent_at;
  }
  row.updated_at = new Date();
  const n = await db('owners').where({ practice_id: practiceId, id }).update(row);
  return n > 0;
}

/** Why an owner cannot be deleted, or null when nothing refers to it. */
export async function ownerInUse(db: Knex | Knex.Transaction, id: number): Promise<string | null> {
  const [h] = await db('horses').where({ owner_id: id }).count({ n: '*' });
  const [b] = await db('barns').where({ owner_id: id }).count({ n: '*' });
  const [m] = await db('messages').where({ owner_id: id }).count({ n: '*' });
  const parts: string[] = [];
  const count = (n: unknown, one: string, many: string) => {
    const k = Number(n);
    if (k > 0) parts.push(`${k} ${k === 1 ? one : many}`);
  };
  count(h?.n, 'horse', 'horses');
  count(b?.n, 'barn', 'barns');
  count(m?.n, 'message', 'messages');
  return parts.length ? `This owner still has ${parts.join(', ')}; archive the owner instead to keep the history.` : null;
}

export async function deleteOwner(db: Knex | Knex.Transaction, practiceId: number, id: number): Promise<void> {
  await db('owners').where({ practice_id: practiceId, id }).delete();
}

/** An owner an inbound text came from, with what the reply to it needs from the owner's practice. */
export interface TextingOwner {
  id: number;
  practiceId: number;
  optedOutAt: Date | null;
  textConsentAt: Date | null;
  practiceName: string;
  contactPhone: string | null;
  contactEmail: string | null;
}

/**
 * Current owners with this phone number in every practice: practices can share a sender number, so an
 * inbound text is not tied to one practice until its owners are found.
 */
export async function findOwnersByPhone(db: Knex | Knex.Transaction, phone: string): Promise<TextingOwner[]> {
  const rows: {
    id: number;
    practice_id: number;
    opted_out_at: Date | null;
    text_consent_at: Date | null;
    practice_name: string;
    contact_phone: string | null;
    contact_email: string | null;
  }[] = await db('owners as o')
    .join('practices as p', 'p.id', 'o.practice_id')
    .where('o.phone', phone)
    .whereNull('o.archived_at')
    .select('o.id', 'o.practice_id', 'o.opted_out_at', 'o.text_consent_at', 'p.name as practice_name', 'p.contact_phone', 'p.contact_email');
  return rows.map((r) => ({
    id: r.id,
    practiceId: r.practice_id,
    optedOutAt: r.opted_out_at,
    textConsentAt: r.text_consent_at,
    practiceName: r.practice_name,
    contactPhone: r.contact_phone,
    contactEmail: r.contact_email,
  }));
}

/** Records an opt-out with its time; call it in the transaction that also drops the owner's queued texts. */
export async function optOutOwner(trx: Knex.Transaction, ownerId: number): Promise<void> {
  await trx('owners').where({ id: ownerId }).update({ opted_out_at: trx.fn.now(), updated_at: trx.fn.now(3) });
}

/** Clears an opt-out; consent keeps `consentAt` when one was recorded, else it is given now. */
export async function optInOwner(db: Knex | Knex.Transaction, ownerId: number, consentAt: Date | null): Promise<void> {
  await db('owners')
    .where({ id: ownerId })
    .update({ opted_out_at: null, text_consent_at: consentAt ?? db.fn.now(), updated_at: db.fn.now(3) });
}
