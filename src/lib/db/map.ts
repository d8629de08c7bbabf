import type { Knex } from 'knex';
import { barnDueState, type BarnDueState } from '../map/due-state.ts';

/** A barn as the region map shows it. */
export interface MapBarnRow {
  id: number;
  name: string;
  address: string;
  lat: number;
  lon: number;
  horses: number;
  dueState: BarnDueState;
}

/** A farrier's home base as the region map shows it. */
export interface MapHomeRow {
  id: number;
  name: string;
  lat: number;
  lon: number;
  colour: string;
}

const OPEN_STATES = ['due', 'planned', 'booked', 'in_progress'];

/**
 * The practice's current barns with their horse count and due state, for the map. One grouped query;
 * every join is held to the same practice so no other practice's rows can leak in.
 */
export async function listMapBarns(db: Knex, practiceId: number, today: string): Promise<MapBarnRow[]> {
  const rows: { id: number; name: string; address: string; lat: number; lon: number; horses: number; next_due: string | Date | null; booked: number | string | null }[] = await db('barns as b')
    .leftJoin('horses as h', function joinHorses() {
      this.on('h.barn_id', 'b.id').andOn('h.practice_id', 'b.practice_id').andOnNull('h.archived_at');
    })
    .leftJoin('jobs as j', function joinJobs() {
      this.on('j.horse_id', 'h.id').andOn('j.practice_id', 'b.practice_id').andOnIn('j.state', OPEN_STATES);
    })
    .where('b.practice_id', practiceId)
    .whereNull('b.archived_at')
    .groupBy('b.id', 'b.name', 'b.address', 'b.lat', 'b.lon')
    .orderBy('b.name')
    .select(
      'b.id',
      'b.name',
      'b.address',
      'b.lat',
      'b.lon',
      db.raw('COUNT(DISTINCT h.id) AS horses'),
      db.raw("MIN(CASE WHEN j.state = 'due' THEN j.due_on END) AS next_due"),
      db.raw("SUM(CASE WHEN j.state IN ('planned','booked','in_progress') THEN 1 ELSE 0 END) AS booked"),
    );
  return rows.map((r) => {
    const nextDue = r.next_due === null ? null : typeof r.next_due === 'string' ? r.next_due.slice(0, 10) : r.next_due.toISOString().slice(0, 10);
    return {
      id: r.id,
      name: r.name,
      address: r.address,
      lat: Number(r.lat),
      lon: Number(r.lon),
      horses: Number(r.horses),
      dueState: barnDueState(nextDue, Number(r.booked ?? 0), today),
    };
  });
}

/** The practice's current farriers' home bases, with the colour their routes use. */
export async function listMapHomes(db: Knex, practiceId: number): Promise<MapHomeRow[]> {
  const rows: { id: number; name: string; home_lat: number; home_lon: number; colour: string }[] = await db('farriers')
    .where({ practice_id: practiceId })
    .whereNull('archived_at')
    .orderBy('name')
    .select('id', 'name', 'home_lat', 'home_lon', 'colour');
  return rows.map((r) => ({ id: r.id, name: r.name, lat: Number(r.home_lat), lon: Number(r.home_lon), colour: r.colour }));
}
