import type { Knex } from 'knex';
import type { Role } from '../server/auth.ts';

export interface UserRecord {
  id: number;
  practiceId: number;
  email: string;
  name: string;
  role: Role;
  farrierId: number | null;
  active: boolean;
  passwordHash: string | null;
  createdAt: string;
}

interface UserRow {
  id: number;
  practice_id: number;
  email: string;
  name: string;
  role: Role;
  farrier_id: number | null;
  active: number;
  password_hash: string | null;
  created_at: Date;
}

const fromRow = (r: UserRow): UserRecord => ({
  id: r.id,
  practiceId: r.practice_id,
  email: r.email,
  name: r.name,
  role: r.role,
  farrierId: r.farrier_id,
  active: Boolean(r.active),
  passwordHash: r.password_hash,
  createdAt: new Date(r.created_at).toISOString(),
});

/** Looks an account up by e-mail across practices: sign-in is the one query not scoped to one. */
export async function findUserByEmail(db: Knex, email: string): Promise<UserRecord | null> {
  const row = await db<UserRow>('users').where({ email }).first();
  return row ? fromRow(row) : null;
}

/** The lead's change to an account; deactivating it also ends its sessions. Call inside the transaction that locked the row. */
export async function updateUserAccount(trx: Knex.Transaction, id: number, change: { role?: Role; active?: boolean }): Promise<void> {
  const row: Record<string, unknown> = { updated_at: trx.fn.now(3) };
  if (change.role) row.role = change.role;
  if (change.active !== undefined) row.active = change.active;
  await trx('users').where({ id }).update(row);
  if (change.active === false) await trx('user_sessions').where({ user_id: id }).delete();
}

export async function listUsers(db: Knex, practiceId: number): Promise<Omit<UserRecord, 'passwordHash'>[]> {
  const rows = await db<UserRow>('users').where({ practice_id: practiceId }).orderBy([{ column: 'role' }, { column: 'name' }]);
  return rows.map(fromRow).map(({ passwordHash: _omit, ...u }) => u);
}

/** Failed sign-ins for this e-mail from this address in the last `windowMinutes`. */
export async function countRecentFailures(db: Knex, email: string, address: string, windowMinutes: number): Promise<number> {
  const row = await db('sign_in_attempts')
    .where({ email, address, succeeded: false })
    .andWhere('created_at', '>', db.raw('NOW(3) - INTERVAL ? MINUTE', [windowMinutes]))
    .count<{ n: number }[]>({ n: '*' })
    .first();
  return Number(row?.n ?? 0);
}

export async function recordAttempt(db: Knex, email: string, address: string, succeeded: boolean): Promise<void> {
  await db('sign_in_attempts').insert({ email, address, succeeded });
}
