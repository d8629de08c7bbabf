import type { Knex } from 'knex';
import type { Db } from './connection.ts';

/**
 * What one farrier's day sheet reads besides the plan and route: the farrier's home, the stops with
 * their barns, the horses and owners at each stop, their work and the visit marks. Stops, jobs and
 * visits are reached through a route the caller has already held to the practice, so those lookups
 * go by route, stop or job id alone.
 */

/** A stop of the route with its barn; `barnOwnerId` is the barn's owner, whom the sheet lists first. */
export interface SheetStop {
  id: number;
  position: number;
  arrivalAt: Date;
  startAt: Date;
  departureAt: Date;
  windowStartAt: Date | null;
  windowEndAt: Date | null;
  barn: { id: number; name: string; address: string; notes: string | null; lat: number; lon: number };
  barnOwnerId: number | null;
}

/** A horse booked at a stop, with its job and owner. */
export interface SheetHorse {
  stopId: number;
  jobId: number;
  minutes: number;
  jobNotes: string | null;
  lame: boolean;
  jobState: string;
  horseId: number;
  horseName: string;
  shoeSize: string | null;
  horseNotes: string | null;
  needsSecondPerson: boolean;
  ownerId: number;
  ownerName: string;
  ownerPhone: string | null;
}

/** The farriers with a route on the practice's plan of a day, with their stop counts (for the dispatcher's picker). */
export async function farriersOnDay(db: Knex, practiceId: number, date: string): Promise<{ id: number; name: string; stops: number }[]> {
  const rows = await db('routes as r')
    .join('plans as p', 'p.id', 'r.plan_id')
    .join('farriers as f', 'f.id', 'r.farrier_id')
    .where({ 'p.practice_id': practiceId, 'p.plan_date': date })
    .select('f.id', 'f.name')
    .select(db.raw('(SELECT COUNT(*) FROM stops s WHERE s.route_id = r.id) AS stops'))
    .orderBy('f.name');
  return rows.map((r) => ({ id: r.id, name: r.name, stops: Number(r.stops) }));
}

/** The farrier's name, colour and home, where the day starts and ends; null for another practice's farrier. */
export async function getSheetFarrier(
  db: Db,
  practiceId: number,
  id: number,
): Promise<{ id: number; name: string; colour: string; homeAddress: string; homeLat: number; homeLon: number } | null> {
  const f = await db('farriers').where({ id, practice_id: practiceId }).first();
  return f ? { id: f.id, name: f.name, colour: f.colour, homeAddress: f.home_address, homeLat: Number(f.home_lat), homeLon: Number(f.home_lon) } : null;
}

/** The route's stops in driving order, each with its barn. */
export async function listSheetStops(db: Db, routeId: number): Promise<SheetStop[]> {
  const rows = await db('stops as s')
    .join('barns as b', 'b.id', 's.barn_id')
    .where('s.route_id', routeId)
    .select('s.*', 'b.name as barn_name', 'b.address as barn_address', 'b.notes as barn_notes', 'b.lat as barn_lat', 'b.lon as barn_lon', 'b.owner_id as barn_owner_id')
    .orderBy('s.position');
  return rows.map((s) => ({
    id: s.id,
    position: s.position,
    arrivalAt: s.arrival_at,
    startAt: s.start_at,
    departureAt: s.departure_at,
    windowStartAt: s.window_start_at,
    windowEndAt: s.window_end_at,
    barn: { id: s.barn_id, name: s.barn_name, address: s.barn_address, notes: s.barn_notes, lat: Number(s.barn_lat), lon: Number(s.barn_lon) },
    barnOwnerId: s.barn_owner_id,
  }));
}

/** The horses booked at the stops, in each stop's job order. */
export async function listSheetHorses(db: Db, stopIds: number[]): Promise<SheetHorse[]> {
  if (stopIds.length === 0) return [];
  const rows = await db('stop_jobs as sj')
    .join('jobs as j', 'j.id', 'sj.job_id')
    .join('horses as h', 'h.id', 'j.horse_id')
    .join('owners as o', 'o.id', 'h.owner_id')
    .whereIn('sj.stop_id', stopIds)
    .select('sj.stop_id', 'j.id as job_id', 'j.minutes', 'j.notes as job_notes', 'j.lame', 'j.state as job_state', 'h.id as horse_id', 'h.name as horse_name', 'h.shoe_size', 'h.notes as horse_notes', 'h.needs_second_person', 'o.id as owner_id', 'o.name as owner_name', 'o.phone as owner_phone')
    .orderBy([{ column: 'sj.stop_id' }, { column: 'sj.position' }]);
  return rows.map((h) => ({
    stopId: h.stop_id,
    jobId: h.job_id,
    minutes: h.minutes,
    jobNotes: h.job_notes,
    lame: !!h.lame,
    jobState: h.job_state,
    horseId: h.horse_id,
    horseName: h.horse_name,
    shoeSize: h.shoe_size,
    horseNotes: h.horse_notes,
    needsSecondPerson: !!h.needs_second_person,
    ownerId: h.owner_id,
    ownerName: h.owner_name,
    ownerPhone: h.owner_phone,
  }));
}

/** The work of each job with what it asks of the farrier (a forge, a therapeutic qualification). */
export async function listSheetWork(db: Db, jobIds: number[]): Promise<{ jobId: number; name: string; needsForge: boolean; needsQualified: boolean }[]> {
  if (jobIds.length === 0) return [];
  const rows = await db('job_work_types as jw').join('work_types as w', 'w.id', 'jw.work_type_id').whereIn('jw.job_id', jobIds).select('jw.job_id', 'w.name', 'w.needs_forge', 'w.needs_qualified').orderBy('w.id');
  return rows.map((w) => ({ jobId: w.job_id, name: w.name, needsForge: !!w.needs_forge, needsQualified: !!w.needs_qualified }));
}

/** Name and phone of the barns' owners, whom the farrier may call on arrival. */
export async function listBarnOwners(db: Db, ownerIds: number[]): Promise<{ id: number; name: string; phone: string | null }[]> {
  if (ownerIds.length === 0) return [];
  return db('owners').whereIn('id', ownerIds).select('id', 'name', 'phone');
}

/** Every visit log of the stops, oldest first, so the last one of a stop is its current mark. */
export async function listStopVisits(
  db: Db,
  stopIds: number[],
): Promise<{ stopId: number; state: 'arrived' | 'done' | 'skipped'; arrivedAt: Date | null; departedAt: Date | null; skipReason: string | null }[]> {
  if (stopIds.length === 0) return [];
  const rows = await db('visit_logs').whereIn('stop_id', stopIds).select('stop_id', 'state', 'arrived_at', 'departed_at', 'skip_reason').orderBy('id');
  return rows.map((v) => ({ stopId: v.stop_id, state: v.state, arrivedAt: v.arrived_at, departedAt: v.departed_at, skipReason: v.skip_reason }));
}
