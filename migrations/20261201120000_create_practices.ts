import type { Knex } from 'knex';

/** The practice: every other row belongs to exactly one. Holds the settings the plan and review use. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('practices', (t) => {
    t.increments('id').primary();
    t.string('name', 120).notNullable();
    t.string('time_zone', 64).notNullable().defaultTo('America/New_York');
    t.enum('units', ['miles', 'km']).notNullable().defaultTo('miles');
    t.string('currency', 3).notNullable().defaultTo('USD');
    // Money per unit of distance (units above), e.g. 0.7000 = 70 cents a mile.
    t.decimal('mileage_rate', 8, 4).notNullable().defaultTo(0.7);
    t.integer('overtime_weekly_minutes').unsigned().notNullable().defaultTo(2400);
    t.decimal('overtime_weekly_multiplier', 4, 2).notNullable().defaultTo(1.5);
    t.integer('overtime_daily_minutes').unsigned().nullable();
    t.decimal('overtime_daily_multiplier', 4, 2).nullable();
    t.integer('overtime_daily_double_minutes').unsigned().nullable();
    t.decimal('overtime_daily_double_multiplier', 4, 2).nullable();
    // 0 = Sunday … 6 = Saturday.
    t.tinyint('week_start').unsigned().notNullable().defaultTo(1);
    t.integer('planning_horizon_days').unsigned().notNullable().defaultTo(7);
    t.string('contact_phone', 20).nullable();
    t.string('contact_email', 254).nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('practices');
}
