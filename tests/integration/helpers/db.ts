import type { Knex } from 'knex';
import { createKnex } from '../../../src/lib/db/connection.ts';

/**
 * Migrations loaded through Vite (import.meta.glob), so vitest can run the TypeScript files that the
 * knex CLI runs through tsx.
 */
const modules = import.meta.glob<{ up: (k: Knex) => Promise<void>; down: (k: Knex) => Promise<void> }>(
  '../../../migrations/*.ts',
  { eager: true },
);

export const migrationSource: Knex.MigrationSource<string> = {
  getMigrations: async () => Object.keys(modules).sort(),
  getMigrationName: (name) => name.split('/').pop()!,
  getMigration: async (name) => modules[name]!,
};

const baseUrl = process.env.TEST_DATABASE_URL ?? process.env.DATABASE_URL ?? '';

/** The roundsmith_test database that the built app of this test run serves. */
export function appDatabase(): Knex {
  if (!baseUrl) throw new Error('TEST_DATABASE_URL is not set: run integration tests through `npm test`');
  return createKnex(baseUrl, { min: 0, max: 4 });
}

/**
 * A database of this test worker's own (roundsmith_test_<name>_<worker>), created empty; the caller
 * migrates and destroys it. Lets tests that rewrite whole tables run beside the app's database.
 */
export async function scratchDatabase(name: string): Promise<{ knex: Knex; drop: () => Promise<void> }> {
  const worker = process.env.VITEST_POOL_ID ?? '0';
  const run = (process.env.TEST_RUN_ID ?? '').replace(/[^a-z0-9_]/gi, '');
  const dbName = `roundsmith_test_${run ? `${run}_` : ''}${name}_${worker}`;
  const admin = appDatabase();
  await admin.raw('DROP DATABASE IF EXISTS ??', [dbName]);
  await admin.raw('CREATE DATABASE ?? CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci', [dbName]);
  await admin.destroy();
  const url = new URL(baseUrl);
  url.pathname = `/${dbName}`;
  const knex = createKnex(url.toString(), { min: 0, max: 4 });
  return {
    knex,
    async drop() {
      await knex.raw('DROP DATABASE IF EXISTS ??', [dbName]);
      await knex.destroy();
    },
  };
}
