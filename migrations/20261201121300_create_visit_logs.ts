import type { Knex } from 'knex';

/**
 * What really happened: visit_logs hold a farrier's actual arrival, departure and distance driven to a
 * barn (with the horses done in visit_log_horses); day_logs hold the actual start and end of a working
 * day and its total distance. The review compares these with the published plans.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('day_logs', (t) => {
    t.increments('id').primary();
    t.integer('practice_id').unsigned().notNullable().references('practices.id').onDelete('CASCADE');
    t.integer('farrier_id').unsigned().notNullable().references('farriers.id');
    t.date('work_date').notNullable();
    t.datetime('started_at').notNullable();
    t.datetime('ended_at').nullable();
    t.integer('distance_m').unsigned().nullable();
    t.unique(['farrier_id', 'work_date']);
    t.index(['practice_id', 'work_date']);
  });
  await knex.schema.createTable('visit_logs', (t) => {
    t.increments('id').primary();
    t.integer('practice_id').unsigned().notNullable().references('practices.id').onDelete('CASCADE');
    t.integer('farrier_id').unsigned().notNullable().references('farriers.id');
    t.integer('barn_id').unsigned().notNullable().references('barns.id');
    t.integer('stop_id').unsigned().nullable().references('stops.id').onDelete('SET NULL');
    t.date('visit_date').notNullable();
    t.enum('state', ['arrived', 'done', 'skipped']).notNullable();
    t.datetime('arrived_at').nullable();
    t.datetime('departed_at').nullable();
    t.integer('distance_m').unsigned().nullable();
    t.string('skip_reason', 255).nullable();
    t.string('client_key', 64).nullable().unique();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['practice_id', 'visit_date']);
    t.index(['farrier_id', 'visit_date']);
  });
  await knex.schema.createTable('visit_log_horses', (t) => {
    t.integer('visit_log_id').unsigned().notNullable().references('visit_logs.id').onDelete('CASCADE');
    t.integer('horse_id').unsigned().notNullable().references('horses.id');
    t.integer('job_id').unsigned().nullable().references('jobs.id').onDelete('SET NULL');
    t.string('work', 255).notNullable();
    t.integer('revenue_cents').unsigned().notNullable().defaultTo(0);
    t.primary(['visit_log_id', 'horse_id']);
    t.index(['horse_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('visit_log_horses');
  await knex.schema.dropTable('visit_logs');
  await knex.schema.dropTable('day_logs');
}
