import type { Knex } from 'knex';

/**
 * People who sign in. E-mail is unique across all practices and compared case-insensitively
 * (utf8mb4_unicode_ci), so "Lead@Demo.test" and "lead@demo.test" are one account.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (t) => {
    t.increments('id').primary();
    t.integer('practice_id').unsigned().notNullable().references('practices.id').onDelete('CASCADE');
    t.string('email', 254).notNullable().collate('utf8mb4_unicode_ci').unique();
    t.string('name', 120).notNullable();
    t.string('password_hash', 255).nullable();
    t.enum('role', ['lead', 'dispatcher', 'farrier']).notNullable();
    t.integer('farrier_id').unsigned().nullable().references('farriers.id').onDelete('SET NULL');
    t.boolean('active').notNullable().defaultTo(true);
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['practice_id', 'role']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('users');
}
