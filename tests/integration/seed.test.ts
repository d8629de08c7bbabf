import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { migrationSource, scratchDatabase } from './helpers/db.ts';
import { seed } from '../../seeds/01_demo_practice.ts';

const TODAY = '2026-12-01';

async function fingerprint(knex: Knex): Promise<string> {
  const hash = createHash('sha256');
  for (const table of ['farriers', 'owners', 'barns', 'horses', 'jobs', 'routes', 'stops', 'visit_logs', 'day_logs']) {
    const rows = await knex(table).orderBy('id').select();
    hash.update(JSON.stringify(rows.map((r: Record<string, unknown>) => ({ ...r, created_at: undefined, updated_at: undefined }))));
  }
  return hash.digest('hex');
}

describe('the demo seed', () => {
  let db: Awaited<ReturnType<typeof scratchDatabase>>;
  beforeAll(async () => {
    db = await scratchDatabase('seed');
    await db.knex.migrate.latest({ migrationSource });
    process.env.SEED_TODAY = TODAY;
    await seed(db.knex);
  });
  afterAll(async () => {
    delete process.env.SEED_TODAY;
    await db.drop();
  });

  it('has the demo practice the scenario describes: six farriers, one apprentice without a forge, a specialist', async () => {
    const farriers = await db.knex('farriers').where({ practice_id: 1 });
    expect(farriers).toHaveLength(6);
    const apprentices = farriers.filter((f) => f.apprentice);
    expect(apprentices).toHaveLength(1);
    expect(apprentices[0].has_forge).toBe(0);
    expect(farriers.some((f) => f.qualified_therapeutic)).toBe(true);
    const roles = await db.knex('users').where({ practice_id: 1 }).select('role');
    expect(roles.filter((r) => r.role === 'lead')).toHaveLength(1);
    expect(roles.filter((r) => r.role === 'dispatcher')).toHaveLength(1);
    expect(roles.filter((r) => r.role === 'farrier')).toHaveLength(6);
  });

  it('has about 80 barns, 400 horses and 60 owners, and a second small practice', async () => {
    const count = async (table: string, practiceId: number) =>
      Number((await db.knex(table).where({ practice_id: practiceId }).count({ n: '*' }))[0]!.n);
    expect(await count('barns', 1)).toBe(80);
    expect(await count('owners', 1)).toBe(60);
    const horses = await count('horses', 1);
    expect(horses).toBeGreaterThanOrEqual(360);
    expect(horses).toBeLessThanOrEqual(440);
    expect(await count('horses', 2)).toBeGreaterThan(0);
    expect(await count('horses', 2)).toBeLessThan(40);
  });

  it('places every barn and farrier home on an address point of the region', async () => {
    const points = JSON.parse(readFileSync('tiles/source/addresses.geojson', 'utf8')).features as { geometry: { coordinates: [number, number] } }[];
    const keys = new Set(points.map((p) => `${p.geometry.coordinates[1].toFixed(6)},${p.geometry.coordinates[0].toFixed(6)}`));
    for (const b of await db.knex('barns').select('lat', 'lon')) expect(keys.has(`${Number(b.lat).toFixed(6)},${Number(b.lon).toFixed(6)}`)).toBe(true);
    for (const f of await db.knex('farriers').select('home_lat', 'home_lon')) expect(keys.has(`${Number(f.home_lat).toFixed(6)},${Number(f.home_lon).toFixed(6)}`)).toBe(true);
  });

  it('has twelve weeks of history with actual times and distances, and open jobs for every horse due within 14 days', async () => {
    const span = await db.knex('visit_logs').min({ first: 'visit_date' }).max({ last: 'visit_date' }).first();
    expect(span!.first >= '2026-09-08').toBe(true); // 2026-12-01 minus 84 days
    expect(span!.first <= '2026-09-12').toBe(true);
    expect(span!.last < TODAY).toBe(true);
    const missing = await db.knex('visit_logs').where({ state: 'done' }).where((q) => q.whereNull('arrived_at').orWhereNull('departed_at').orWhereNull('distance_m')).count({ n: '*' });
    expect(Number(missing[0]!.n)).toBe(0);
    // Every horse whose next due date (last visit + cycle) is within 14 days has exactly one open job.
    const horses = await db.knex('horses').where({ practice_id: 1 }).select('id', 'last_visit_on', 'cycle_weeks');
    const open = new Set((await db.knex('jobs').where({ state: 'due' }).select('horse_id')).map((j) => j.horse_id));
    const limit = new Date('2026-12-15T00:00:00Z').getTime();
    for (const h of horses) {
      const due = new Date(`${h.last_visit_on}T00:00:00Z`).getTime() + h.cycle_weeks * 7 * 86_400_000;
      expect(open.has(h.id)).toBe(due <= limit);
    }
    const overdue = await db.knex('jobs').where({ state: 'due' }).andWhere('due_on', '<', TODAY).count({ n: '*' });
    const later = await db.knex('jobs').where({ state: 'due' }).andWhere('due_on', '>', '2026-12-07').count({ n: '*' });
    expect(Number(overdue[0]!.n)).toBeGreaterThan(0);
    expect(Number(later[0]!.n)).toBeGreaterThan(0);
  });

  it('loads identically every time for the same day', async () => {
    const first = await fingerprint(db.knex);
    await seed(db.knex);
    expect(await fingerprint(db.knex)).toBe(first);
  });
});
