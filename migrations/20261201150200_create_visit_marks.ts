import type { Knex } from 'knex';

/**
 * Every mark a farrier makes on the day sheet (arrived, done, skipped), keyed by the id the phone
 * generated for it. A phone that lost its connection replays its queue; the unique client_key makes a
 * replay a no-op. visit_logs keeps one row per stop, derived from these marks.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('visit_marks', (t) => {
    t.increments('id').primary();
    t.integer('practice_id').unsigned().notNullable().references('practices.id').onDelete('CASCADE');
    t.string('client_key', 64).notNullable().unique();
    t.integer('stop_id').unsigned().notNullable().references('stops.id').onDelete('CASCADE');
    t.integer('visit_log_id').unsigned().nullable().references('visit_logs.id').onDelete('SET NULL');
    t.enum('state', ['arrived', 'done', 'skipped']).notNullable();
    t.datetime('marked_at').notNullable();
    t.string('skip_reason', 255).nullable();
    t.integer('user_id').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['stop_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('visit_marks');
}
