import type { Knex } from 'knex';

/**
 * Barns, where horses are kept and visited. access_hours is JSON: an array of seven entries, Monday
 * first, each a list of [startMinute, endMinute] spans in the practice's local time.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('barns', (t) => {
    t.increments('id').primary();
    t.integer('practice_id').unsigned().notNullable().references('practices.id').onDelete('CASCADE');
    t.integer('owner_id').unsigned().nullable().references('owners.id').onDelete('SET NULL');
    t.string('name', 120).notNullable();
    t.string('address', 255).notNullable();
    t.string('address_point_id', 40).nullable();
    t.decimal('lat', 9, 6).notNullable();
    t.decimal('lon', 9, 6).notNullable();
    t.json('access_hours').notNullable();
    t.smallint('setup_minutes').unsigned().notNullable().defaultTo(10);
    t.text('notes').nullable();
    t.datetime('archived_at', { precision: 3 }).nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['practice_id', 'name']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('barns');
}
