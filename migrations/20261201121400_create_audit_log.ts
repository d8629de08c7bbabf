import type { Knex } from 'knex';

/** Who changed what, when: one row per change a user makes through the API. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('audit_log', (t) => {
    t.bigIncrements('id').primary();
    t.integer('practice_id').unsigned().notNullable().references('practices.id').onDelete('CASCADE');
    t.integer('user_id').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.string('action', 60).notNullable();
    t.string('entity', 40).notNullable();
    t.integer('entity_id').unsigned().nullable();
    t.json('detail').nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['practice_id', 'created_at']);
    t.index(['entity', 'entity_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('audit_log');
}
