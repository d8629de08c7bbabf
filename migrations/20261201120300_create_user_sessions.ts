import type { Knex } from 'knex';

/** Sign-in sessions. `id` is the SHA-256 of the cookie's token: the token itself is never stored. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('user_sessions', (t) => {
    t.string('id', 255).primary();
    t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE');
    t.datetime('expires_at').notNullable();
    t.index(['user_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('user_sessions');
}
