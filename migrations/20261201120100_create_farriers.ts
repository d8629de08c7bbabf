import type { Knex } from 'knex';

/** Farriers of a practice: home base, skills, truck equipment, working pattern and cost. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('farriers', (t) => {
    t.increments('id').primary();
    t.integer('practice_id').unsigned().notNullable().references('practices.id').onDelete('CASCADE');
    t.string('name', 120).notNullable();
    t.string('phone', 20).nullable();
    t.string('home_address', 255).notNullable();
    t.decimal('home_lat', 9, 6).notNullable();
    t.decimal('home_lon', 9, 6).notNullable();
    t.boolean('qualified_therapeutic').notNullable().defaultTo(false);
    t.boolean('apprentice').notNullable().defaultTo(false);
    t.boolean('has_forge').notNullable().defaultTo(true);
    // ISO weekdays, 1 = Monday … 7 = Sunday, comma separated.
    t.string('working_days', 20).notNullable().defaultTo('1,2,3,4,5');
    t.smallint('shift_start_minute').unsigned().notNullable().defaultTo(450);
    t.smallint('shift_end_minute').unsigned().notNullable().defaultTo(1020);
    t.smallint('break_minutes').unsigned().notNullable().defaultTo(30);
    t.smallint('break_window_start_minute').unsigned().notNullable().defaultTo(690);
    t.smallint('break_window_end_minute').unsigned().notNullable().defaultTo(840);
    t.smallint('normal_work_minutes').unsigned().notNullable().defaultTo(480);
    t.smallint('max_overtime_minutes').unsigned().notNullable().defaultTo(90);
    t.integer('cost_per_hour_cents').unsigned().notNullable().defaultTo(3500);
    t.string('colour', 7).notNullable().defaultTo('#445a76');
    t.datetime('archived_at', { precision: 3 }).nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['practice_id', 'archived_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('farriers');
}
