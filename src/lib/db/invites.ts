import type { Knex } from 'knex';
import type { Role } from '../server/auth.ts';

export interface InviteRecord {
  id: number;
  email: string;
  name: string;
  role: Role;
  farrierId: number | null;
  expiresAt: string;
  acceptedAt: string | null;
  createdAt: string;
}

interface InviteRow {
  id: number;
  practice_id: number;
  email: string;
  name: string;
  role: Role;
  farrier_id: number | null;
  token_hash: string;
  expires_at: Date;
  accepted_at: Date | null;
  created_at: Date;
}

const fromRow = (r: InviteRow): InviteRecord => ({
  id: r.id,
  email: r.email,
  name: r.name,
  role: r.role,
  farrierId: r.farrier_id,
  expiresAt: new Date(r.expires_at).toISOString(),
  acceptedAt: r.accepted_at ? new Date(r.accepted_at).toISOString() : null,
  createdAt: new Date(r.created_at).toISOString(),
});

export async function listInvites(db: Knex, practiceId: number): Promise<InviteRecord[]> {
  const rows = await db<InviteRow>('invites').where({ practice_id: practiceId }).orderBy('created_at', 'desc').limit(100);
  return rows.map(fromRow);
}

export async function insertInvite(
  db: Knex | Knex.Transaction,
  invite: { practiceId: number; email: string; name: string; role: Role; farrierId: number | null; tokenHash: string; expiresAt: Date; createdBy: number },
): Promise<number> {
  const [id] = await db('invites').insert({
    practice_id: invite.practiceId,
    email: invite.email,
    name: invite.name,
    role: invite.role,
    farrier_id: invite.farrierId,
    token_hash: invite.tokenHash,
    expires_at: invite.expiresAt,
    created_by: invite.createdBy,
  });
  return Number(id);
}

/** Invites for a token hash that are still open: not accepted and not expired. */
const openInvites = (db: Knex | Knex.Transaction, tokenHash: string) =>
  db<InviteRow>('invites').where({ token_hash: tokenHash }).whereNull('accepted_at').andWhere('expires_at', '>', db.fn.now());

/** The name on an open invite, for the page where its holder sets a password; null when the link is spent or expired. */
export async function openInviteName(db: Knex, tokenHash: string): Promise<string | null> {
  const row = await openInvites(db, tokenHash).first('name');
  return row?.name ?? null;
}

/** The open invite for a token hash (not accepted, not expired), locked for update inside `trx`. */
export async function openInviteForUpdate(trx: Knex.Transaction, tokenHash: string) {
  const row = await openInvites(trx, tokenHash).forUpdate().first();
  return row ? { ...fromRow(row), practiceId: row.practice_id } : null;
}

export async function markInviteAccepted(trx: Knex.Transaction, id: number): Promise<void> {
  await trx('invites').where({ id }).update({ accepted_at: trx.fn.now() });
}
