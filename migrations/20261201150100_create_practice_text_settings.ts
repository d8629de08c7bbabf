import type { Knex } from 'knex';

/**
 * A practice's settings for texts to owners: the arrival and update templates, how wide arrival
 * windows are and how they grow along a route, how far a window must move before an update text goes,
 * and the quiet hours (local minutes). A practice without a row uses the defaults in code.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('practice_text_settings', (t) => {
    t.integer('practice_id').unsigned().primary().references('practices.id').onDelete('CASCADE');
    t.text('arrival_template').notNullable();
    t.text('update_template').notNullable();
    t.smallint('window_min_minutes').unsigned().notNullable().defaultTo(60);
    t.smallint('window_growth_minutes').unsigned().notNullable().defaultTo(15);
    t.smallint('window_max_minutes').unsigned().notNullable().defaultTo(180);
    t.smallint('update_threshold_minutes').unsigned().notNullable().defaultTo(30);
    t.smallint('quiet_start_minute').unsigned().notNullable().defaultTo(1260);
    t.smallint('quiet_end_minute').unsigned().notNullable().defaultTo(480);
    t.integer('updated_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('practice_text_settings');
}
