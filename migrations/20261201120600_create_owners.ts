import type { Knex } from 'knex';

/** Horse owners (clients). Phone in E.164; text consent and opt-out are recorded with their time. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('owners', (t) => {
    t.increments('id').primary();
    t.integer('practice_id').unsigned().notNullable().references('practices.id').onDelete('CASCADE');
    t.string('name', 120).notNullable();
    t.string('phone', 16).nullable();
    t.string('email', 254).nullable();
    t.datetime('text_consent_at').nullable();
    t.datetime('opted_out_at').nullable();
    t.text('notes').nullable();
    t.datetime('archived_at', { precision: 3 }).nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['practice_id', 'name']);
    t.index(['practice_id', 'phone']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('owners');
}
