import type { Knex } from 'knex';
import { createKnex } from '../db/connection.ts';

let instance: Knex | undefined;

/**
 * The app's one knex instance, made on first use from DATABASE_URL. Server code only: islands and
 * pages never import it (pages call src/lib/db query modules with it).
 */
export function db(): Knex {
  if (!instance) {
    const url = process.env.DATABASE_URL;
    if (!url) throw new Error('DATABASE_URL is not set');
    instance = createKnex(url, { min: 0, max: 20 });
  }
  return instance;
}
