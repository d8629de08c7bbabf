import type { Knex } from 'knex';

/**
 * Photos, radiographs and documents attached to a horse. The bytes live under UPLOADS_DIR (outside
 * public/), named by storage_key; the row records the type found in the bytes, not the one claimed.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('uploads', (t) => {
    t.increments('id').primary();
    t.integer('practice_id').unsigned().notNullable().references('practices.id').onDelete('CASCADE');
    t.integer('horse_id').unsigned().notNullable().references('horses.id');
    t.enum('kind', ['photo', 'radiograph', 'document']).notNullable();
    t.string('file_name', 200).notNullable();
    t.string('mime_type', 60).notNullable();
    t.integer('size_bytes').unsigned().notNullable();
    t.string('storage_key', 80).notNullable().unique();
    t.string('thumb_key', 80).nullable();
    t.integer('uploaded_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['practice_id', 'horse_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('uploads');
}
