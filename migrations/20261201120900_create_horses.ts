import type { Knex } from 'knex';

/** Horses with their owner, barn, cycle and the work they usually get (horse_work_types). */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('horses', (t) => {
    t.increments('id').primary();
    t.integer('practice_id').unsigned().notNullable().references('practices.id').onDelete('CASCADE');
    t.integer('owner_id').unsigned().notNullable().references('owners.id');
    t.integer('barn_id').unsigned().notNullable().references('barns.id');
    t.string('name', 80).notNullable();
    t.tinyint('cycle_weeks').unsigned().notNullable().defaultTo(6);
    t.date('last_visit_on').nullable();
    t.string('shoe_size', 20).nullable();
    t.text('notes').nullable();
    t.boolean('needs_second_person').notNullable().defaultTo(false);
    t.datetime('archived_at', { precision: 3 }).nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['practice_id', 'name']);
    t.index(['practice_id', 'barn_id']);
    t.index(['practice_id', 'owner_id']);
  });
  await knex.schema.createTable('horse_work_types', (t) => {
    t.integer('horse_id').unsigned().notNullable().references('horses.id').onDelete('CASCADE');
    t.integer('work_type_id').unsigned().notNullable().references('work_types.id');
    t.primary(['horse_id', 'work_type_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('horse_work_types');
  await knex.schema.dropTable('horses');
}
