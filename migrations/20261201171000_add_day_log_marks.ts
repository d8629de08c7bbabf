import type { Knex } from 'knex';

/**
 * The day sheet's "Start the day" and "Back home" marks write day_logs. Farriers keep a mileage log
 * for tax, so each mark may carry the truck's odometer (whole units of the practice: miles or km);
 * the readings are kept as given so a correction can be checked against them. distance_source says
 * whether distance_m was measured (odometer difference) or filled with the planned route's distance
 * when readings were missing, so the review can tell the two apart (NULL: logged before this, source
 * not recorded). start_source says whether the farrier marked the start or it was implied by a first
 * stop mark. The client keys make a replayed mark from the phone's offline queue a no-op.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('day_logs', (t) => {
    t.integer('start_odometer').unsigned().nullable();
    t.integer('end_odometer').unsigned().nullable();
    t.enum('distance_source', ['odometer', 'planned']).nullable();
    t.enum('start_source', ['marked', 'first_stop']).nullable();
    t.string('start_client_key', 64).nullable().unique();
    t.string('end_client_key', 64).nullable().unique();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('day_logs', (t) => {
    t.dropUnique(['start_client_key']);
    t.dropUnique(['end_client_key']);
    t.dropColumn('start_odometer');
    t.dropColumn('end_odometer');
    t.dropColumn('distance_source');
    t.dropColumn('start_source');
    t.dropColumn('start_client_key');
    t.dropColumn('end_client_key');
  });
}
