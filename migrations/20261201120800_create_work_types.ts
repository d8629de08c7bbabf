import type { Knex } from 'knex';

/** Kinds of hoof work with minutes per horse, the equipment and skill they need, and a price. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('work_types', (t) => {
    t.increments('id').primary();
    t.integer('practice_id').unsigned().notNullable().references('practices.id').onDelete('CASCADE');
    t.string('name', 80).notNullable();
    t.smallint('minutes_per_horse').unsigned().notNullable();
    t.boolean('needs_forge').notNullable().defaultTo(false);
    t.boolean('needs_qualified').notNullable().defaultTo(false);
    t.integer('price_cents').unsigned().notNullable().defaultTo(0);
    t.datetime('archived_at', { precision: 3 }).nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(['practice_id', 'name']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('work_types');
}
