import type { Knex } from 'knex';

/** Every text and e-mail the practice sends or receives, with its state and segment count. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('messages', (t) => {
    t.increments('id').primary();
    t.integer('practice_id').unsigned().notNullable().references('practices.id').onDelete('CASCADE');
    t.enum('channel', ['sms', 'email']).notNullable();
    t.enum('direction', ['out', 'in']).notNullable().defaultTo('out');
    t.string('to_address', 254).notNullable();
    t.string('from_address', 254).nullable();
    t.string('subject', 200).nullable();
    t.text('body').notNullable();
    t.smallint('segments').unsigned().nullable();
    t.enum('encoding', ['gsm7', 'ucs2']).nullable();
    t.enum('state', ['queued', 'sent', 'delivered', 'failed', 'received', 'suppressed']).notNullable().defaultTo('queued');
    t.integer('owner_id').unsigned().nullable().references('owners.id').onDelete('SET NULL');
    t.integer('plan_id').unsigned().nullable().references('plans.id').onDelete('SET NULL');
    t.integer('stop_id').unsigned().nullable().references('stops.id').onDelete('SET NULL');
    t.string('idempotency_key', 191).nullable().unique();
    t.string('provider_id', 64).nullable();
    t.datetime('send_after').nullable();
    t.datetime('sent_at').nullable();
    t.string('error', 255).nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['practice_id', 'created_at']);
    t.index(['state', 'send_after']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('messages');
}
