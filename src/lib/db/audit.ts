import type { Knex } from 'knex';

/** Writes one audit_log row; call it inside the same transaction as the change it records. */
export async function audit(
  db: Knex | Knex.Transaction,
  entry: { practiceId: number; userId: number | null; action: string; entity: string; entityId?: number | null; detail?: unknown },
): Promise<void> {
  await db('audit_log').insert({
    practice_id: entry.practiceId,
    user_id: entry.userId,
    action: entry.action,
    entity: entry.entity,
    entity_id: entry.entityId ?? null,
    detail: entry.detail === undefined ? null : JSON.stringify(entry.detail),
  });
}
