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

/** Creates an account; an e-mail address that already has one (in any practice) fails on the unique key. */
export async function insertUser(
  trx: Knex.Transaction,
  user: { practiceId: number; email: string; name: string; passwordHash: string; role: Role; farrierId: number | null },
): Promise<number> {
  const [id] = await trx('users').insert({
    practice_id: user.practiceId,
    email: user.email,
    name: user.name,
    password_hash: user.passwordHash,
    role: user.role,
    farrier_id: user.farrierId,
  });
  return Number(id);
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

/** A farrier with a route on a plan, the account that farrier signs in with (if any) and the route's stop count. */
export interface PlanFarrierAccount {
  farrierId: number;
  farrierName: string;
  stops: number;
  email: string | null;
  userName: string | null;
}

/** The plan's routes with their farrier's account, if any: a farrier without one has no address to mail a day sheet to. */
export async function listPlanFarrierAccounts(db: Knex | Knex.Transaction, planId: number): Promise<PlanFarrierAccount[]> {
  const rows: { farrier_id: number; farrier_name: string; stops: number | string; email: string | null; user_name: string | null }[] = await db('routes as r')
    .join('farriers as f', 'f.id', 'r.farrier_id')
    .leftJoin('users as u', function () {
      this.on('u.farrier_id', '=', 'r.farrier_id').andOn('u.practice_id', '=', 'r.practice_id');
    })
    .where('r.plan_id', planId)
    .select('r.farrier_id', 'f.name as farrier_name', 'u.email', 'u.name as user_name')
    .select(db.raw('(SELECT COUNT(*) FROM stops s WHERE s.route_id = r.id) AS stops'));
  return rows.map((r) => ({ farrierId: r.farrier_id, farrierName: r.farrier_name, stops: Number(r.stops), email: r.email, userName: r.user_name }));
}
