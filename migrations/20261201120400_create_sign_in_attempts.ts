import type { Knex } from 'knex';

/** Failed and successful sign-ins, kept so the failure limit holds across app instances. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('sign_in_attempts', (t) => {
    t.bigIncrements('id').primary();
    t.string('email', 254).notNullable().collate('utf8mb4_unicode_ci');
    t.string('address', 64).notNullable();
    t.boolean('succeeded').notNullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['email', 'address', 'created_at']);
    t.index(['address', 'created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('sign_in_attempts');
}
