import type { Knex } from 'knex';

/**
 * A horse's next due date, kept by the database as last visit + cycle weeks (pure calendar arithmetic
 * on a DATE, so no time zone enters it), with an index so the due list sorts and filters 10,000 horses
 * by due date without a table scan.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(
    'ALTER TABLE horses ADD COLUMN next_due_on DATE AS (last_visit_on + INTERVAL cycle_weeks WEEK) PERSISTENT, ADD INDEX horses_practice_next_due (practice_id, archived_at, next_due_on)',
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE horses DROP INDEX horses_practice_next_due, DROP COLUMN next_due_on');
}
