import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { migrationSource, scratchDatabase } from './helpers/db.ts';

const TABLES = [
  'practices', 'farriers', 'users', 'user_sessions', 'sign_in_attempts', 'invites', 'owners', 'barns',
  'work_types', 'horses', 'horse_work_types', 'jobs', 'job_work_types', 'plans', 'routes', 'stops',
  'stop_jobs', 'messages', 'day_logs', 'visit_logs', 'visit_log_horses', 'audit_log', 'uploads',
  'practice_text_settings', 'visit_marks',
];

async function tables(knex: Knex): Promise<string[]> {
  const [rows] = await knex.raw('SHOW TABLES');
  return (rows as Record<string, string>[]).map((r) => Object.values(r)[0]!).filter((t) => !t.startsWith('knex_'));
}

describe('migrations on the real MariaDB', () => {
  let db: Awaited<ReturnType<typeof scratchDatabase>>;
  beforeAll(async () => {
    db = await scratchDatabase('migrations');
  });
  afterAll(async () => {
    await db.drop();
  });

  it('migrating up creates every table the product needs, all utf8mb4', async () => {
    await db.knex.migrate.latest({ migrationSource });
    expect((await tables(db.knex)).sort()).toEqual([...TABLES].sort());
    const [rows] = await db.knex.raw(
      "SELECT TABLE_NAME, TABLE_COLLATION FROM information_schema.TABLES WHERE TABLE_SCHEMA = DATABASE() AND TABLE_NAME NOT LIKE 'knex%'",
    );
    for (const row of rows as { TABLE_COLLATION: string }[]) expect(row.TABLE_COLLATION).toMatch(/^utf8mb4_/);
  });

  it('a horse can have at most one open job, but any number of finished ones', async () => {
    const k = db.knex;
    const [practiceId] = await k('practices').insert({ name: 'Scratch practice' });
    const [ownerId] = await k('owners').insert({ practice_id: practiceId, name: 'Scratch owner' });
    const [barnId] = await k('barns').insert({ practice_id: practiceId, name: 'Scratch barn', address: '1 Test Lane', lat: 38.2, lon: -84.6, access_hours: '[]' });
    const [horseId] = await k('horses').insert({ practice_id: practiceId, owner_id: ownerId, barn_id: barnId, name: 'Scratch' });
    const job = { practice_id: practiceId, horse_id: horseId, minutes: 30, due_on: '2026-12-01' };
    await k('jobs').insert({ ...job, state: 'done' });
    await k('jobs').insert({ ...job, state: 'done' });
    await k('jobs').insert({ ...job, state: 'due' });
    await expect(k('jobs').insert({ ...job, state: 'planned' })).rejects.toMatchObject({ code: 'ER_DUP_ENTRY' });
  });

  it('user e-mail addresses are unique regardless of letter case', async () => {
    const k = db.knex;
    const practice = await k('practices').first('id');
    await k('users').insert({ practice_id: practice.id, email: 'case@demo.test', name: 'A', role: 'lead' });
    await expect(k('users').insert({ practice_id: practice.id, email: 'CASE@Demo.Test', name: 'B', role: 'lead' })).rejects.toMatchObject({ code: 'ER_DUP_ENTRY' });
  });

  it('migrating all the way down removes every table, and up again works', async () => {
    await db.knex.migrate.rollback({ migrationSource }, true);
    expect(await tables(db.knex)).toEqual([]);
    await db.knex.migrate.latest({ migrationSource });
    expect((await tables(db.knex)).length).toBe(TABLES.length);
  });
});
