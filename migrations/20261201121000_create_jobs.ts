import type { Knex } from 'knex';

const OPEN = "'due','planned','booked','in_progress'";

/**
 * Jobs: one horse's work on one visit. `open_horse_id` is a generated column that holds the horse
 * while the job is open and NULL otherwise; its unique index makes "a horse never has two open jobs"
 * a database rule rather than a hope.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('jobs', (t) => {
    t.increments('id').primary();
    t.integer('practice_id').unsigned().notNullable().references('practices.id').onDelete('CASCADE');
    t.integer('horse_id').unsigned().notNullable().references('horses.id');
    t.smallint('minutes').unsigned().notNullable();
    t.date('due_on').notNullable();
    t.date('earliest_on').nullable();
    t.date('latest_on').nullable();
    t.enum('state', ['due', 'planned', 'booked', 'in_progress', 'done', 'skipped', 'cancelled'])
      .notNullable()
      .defaultTo('due');
    t.integer('pinned_farrier_id').unsigned().nullable().references('farriers.id').onDelete('SET NULL');
    t.smallint('pinned_position').unsigned().nullable();
    // The owner's wish to be present, in local minutes of the day; both null when no wish.
    t.smallint('owner_window_start_minute').unsigned().nullable();
    t.smallint('owner_window_end_minute').unsigned().nullable();
    t.boolean('lame').notNullable().defaultTo(false);
    t.text('notes').nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['practice_id', 'state', 'due_on']);
  });
  await knex.raw(
    `ALTER TABLE jobs ADD COLUMN open_horse_id INT UNSIGNED AS (CASE WHEN state IN (${OPEN}) THEN horse_id END) PERSISTENT, ADD UNIQUE INDEX jobs_open_horse_unique (open_horse_id)`,
  );
  await knex.schema.createTable('job_work_types', (t) => {
    t.integer('job_id').unsigned().notNullable().references('jobs.id').onDelete('CASCADE');
    t.integer('work_type_id').unsigned().notNullable().references('work_types.id');
    t.primary(['job_id', 'work_type_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('job_work_types');
  await knex.schema.dropTable('jobs');
}
