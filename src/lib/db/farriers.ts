import type { Knex } from 'knex';

/** Name and id of the practice's current farriers, for pickers. */
export async function listFarrierOptions(db: Knex, practiceId: number): Promise<{ id: number; name: string }[]> {
  return db('farriers').where({ practice_id: practiceId }).whereNull('archived_at').orderBy('name').select('id', 'name');
}
