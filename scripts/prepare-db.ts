// Brings a database up to date: runs the Knex migrations, then loads the demo practice when the
// database has no practice yet (or always with --reseed). Used by `npm start` and `npm test`.
import { createKnex } from '../src/lib/db/connection.ts';
import { seed } from '../seeds/01_demo_practice.ts';
import path from 'node:path';

const url = process.env.DATABASE_URL;
if (!url) throw new Error('DATABASE_URL is not set');
const reseed = process.argv.includes('--reseed');
const knex = createKnex(url, { min: 0, max: 4 });
try {
  const [batch, names] = await knex.migrate.latest({ directory: path.resolve('migrations'), loadExtensions: ['.ts'] });
  if (names.length > 0) console.log(`Migrations: batch ${batch}, ${names.length} applied`);
  const row = await knex('practices').count<{ n: number }[]>({ n: '*' }).first();
  if (reseed || Number(row?.n ?? 0) === 0) {
    const started = Date.now();
    await seed(knex);
    console.log(`Demo practice loaded (${((Date.now() - started) / 1000).toFixed(1)} s)`);
  }
} finally {
  await knex.destroy();
}
