import type { Knex } from 'knex';

/**
 * A plan is all routes of one practice for one day; a route is one farrier's ordered stops; a stop is a
 * visit to one barn holding one or more jobs (stop_jobs). `version` rises with every change so that a
 * stale edit can be refused.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('plans', (t) => {
    t.increments('id').primary();
    t.integer('practice_id').unsigned().notNullable().references('practices.id').onDelete('CASCADE');
    t.date('plan_date').notNullable();
    t.enum('state', ['draft', 'published']).notNullable().defaultTo('draft');
    t.integer('version').unsigned().notNullable().defaultTo(1);
    t.json('figures').nullable();
    t.datetime('published_at').nullable();
    t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(['practice_id', 'plan_date']);
  });
  await knex.schema.createTable('routes', (t) => {
    t.increments('id').primary();
    t.integer('practice_id').unsigned().notNullable().references('practices.id').onDelete('CASCADE');
    t.integer('plan_id').unsigned().notNullable().references('plans.id').onDelete('CASCADE');
    t.integer('farrier_id').unsigned().notNullable().references('farriers.id');
    t.datetime('start_at').notNullable();
    t.datetime('end_at').notNullable();
    t.integer('drive_seconds').unsigned().notNullable().defaultTo(0);
    t.integer('distance_m').unsigned().notNullable().defaultTo(0);
    t.integer('work_seconds').unsigned().notNullable().defaultTo(0);
    t.integer('overtime_seconds').unsigned().notNullable().defaultTo(0);
    t.datetime('break_start_at').nullable();
    t.unique(['plan_id', 'farrier_id']);
    t.index(['practice_id', 'farrier_id']);
  });
  await knex.schema.createTable('stops', (t) => {
    t.increments('id').primary();
    t.integer('practice_id').unsigned().notNullable().references('practices.id').onDelete('CASCADE');
    t.integer('route_id').unsigned().notNullable().references('routes.id').onDelete('CASCADE');
    t.smallint('position').unsigned().notNullable();
    t.integer('barn_id').unsigned().notNullable().references('barns.id');
    t.datetime('arrival_at').notNullable();
    t.datetime('start_at').notNullable();
    t.datetime('departure_at').notNullable();
    t.integer('leg_drive_seconds').unsigned().notNullable().defaultTo(0);
    t.integer('leg_distance_m').unsigned().notNullable().defaultTo(0);
    t.datetime('window_start_at').nullable();
    t.datetime('window_end_at').nullable();
    t.index(['route_id', 'position']);
  });
  await knex.schema.createTable('stop_jobs', (t) => {
    t.integer('stop_id').unsigned().notNullable().references('stops.id').onDelete('CASCADE');
    t.integer('job_id').unsigned().notNullable().references('jobs.id').onDelete('CASCADE');
    t.integer('plan_id').unsigned().notNullable().references('plans.id').onDelete('CASCADE');
    t.smallint('position').unsigned().notNullable().defaultTo(0);
    t.primary(['stop_id', 'job_id']);
    t.unique(['plan_id', 'job_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('stop_jobs');
  await knex.schema.dropTable('stops');
  await knex.schema.dropTable('routes');
  await knex.schema.dropTable('plans');
}
