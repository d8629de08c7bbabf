import type { Knex } from 'knex';

/** Tables whose rows belong to one practice (`practice_id`) and are addressed by `id` from the API. */
export type PracticeTable = 'barns' | 'horses' | 'owners' | 'work_types' | 'farriers' | 'jobs' | 'users';

/**
 * Locks one of the practice's rows for the rest of `trx` and returns the columns asked for, or
 * undefined when the row does not exist or belongs to another practice (the caller answers 404
 * either way, so another practice's ids are never confirmed). Taking the lock first means that a
 * check such as "is it still in use?" cannot go stale before the change it guards.
 */
export async function lockInPractice<C extends 'id' | 'name' | 'state'>(
  trx: Knex.Transaction, table: PracticeTable, practiceId: number, id: number, columns: C[],
): Promise<Record<C, string> | undefined> {
  return (await trx(table).where({ practice_id: practiceId, id }).forUpdate().first(...columns)) as Record<C, string> | undefined;
}

/** True when the row exists and belongs to the practice (no lock: for reads and for files stored before a transaction). */
export async function existsInPractice(db: Knex | Knex.Transaction, table: PracticeTable, practiceId: number, id: number): Promise<boolean> {
  return Boolean(await db(table).where({ practice_id: practiceId, id }).first('id'));
}
