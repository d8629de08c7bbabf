import type { Knex } from 'knex';

/** Invitations the lead sends; the link's token is stored only as its SHA-256 and works once. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('invites', (t) => {
    t.increments('id').primary();
    t.integer('practice_id').unsigned().notNullable().references('practices.id').onDelete('CASCADE');
    t.string('email', 254).notNullable().collate('utf8mb4_unicode_ci');
    t.string('name', 120).notNullable();
    t.enum('role', ['lead', 'dispatcher', 'farrier']).notNullable();
    t.integer('farrier_id').unsigned().nullable().references('farriers.id').onDelete('SET NULL');
    t.string('token_hash', 64).notNullable().unique();
    t.datetime('expires_at').notNullable();
    t.datetime('accepted_at').nullable();
    t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['practice_id', 'created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('invites');
}
