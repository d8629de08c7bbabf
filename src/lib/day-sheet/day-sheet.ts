/**
 * Everything one farrier's day sheet shows, read in a few queries and put together with the leg
 * directions from src/lib/routing. Lives here rather than in src/lib/db because it joins plans,
 * barns, owners, horses, jobs and visit logs for this one screen.
 */
import type { Knex } from 'knex';
import { directions, getRoadGraph } from '../routing/index.ts';
import { dayLogsOf, type DayLogView } from './day-logs.ts';

export interface DaySheetStep {
  text: string;
  distanceM: number;
  durationSec: number;
}

export interface DaySheetLeg {
  steps: DaySheetStep[];
  distanceM: number;
  durationSec: number;
  fallback: boolean;
  geometry: [number, number][];
}

export interface DaySheetWork {
  name: string;
  needsForge: boolean;
  needsQualified: boolean;
}

export interface DaySheetHorse {
  id: number;
  jobId: number;
  name: string;
  ownerName: string;
  minutes: number;
  work: DaySheetWork[];
  shoeSize: string | null;
  notes: string | null;
  jobNotes: string | null;
  needsSecondPerson: boolean;
  lame: boolean;
  jobState: string;
}

export interface DaySheetOwner {
  id: number;
  name: string;
  phone: string | null;
}

export interface DaySheetVisit {
  state: 'arrived' | 'done' | 'skipped';
  arrivedAt: string | null;
  departedAt: string | null;
  skipReason: string | null;
}

export interface DaySheetStop {
  id: number;
  position: number;
  arrivalAt: string;
  startAt: string;
  departureAt: string;
  windowStartAt: string | null;
  windowEndAt: string | null;
  barn: { id: number; name: string; address: string; notes: string | null; lat: number; lon: number };
  owners: DaySheetOwner[];
  horses: DaySheetHorse[];
  leg: DaySheetLeg;
  visit: DaySheetVisit | null;
}

export interface DaySheet {
  date: string;
  plan: { id: number; state: 'draft' | 'published'; version: number; publishedAt: string | null };
  farrier: { id: number; name: string; colour: string; homeAddress: string; homeLat: number; homeLon: number };
  route: { id: number; startAt: string; endAt: string; driveSeconds: number; distanceM: number; workSeconds: number; overtimeSeconds: number; breakStartAt: string | null };
  stops: DaySheetStop[];
  homeLeg: DaySheetLeg;
  /** The farrier's day log (Start the day / Back home, odometer readings), null before the day starts. */
  dayLog: DayLogView | null;
}

const iso = (d: Date | string | null): string | null => (d ? new Date(d).toISOString() : null);

/** The farriers with a route on the practice's plan of a day (for the dispatcher's picker). */
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

/** The practice's farriers, for the picker when a day has no plan yet. */
export async function practiceFarriers(db: Knex, practiceId: number): Promise<{ id: number; name: string }[]> {
  return db('farriers').where({ practice_id: practiceId }).whereNull('archived_at').select('id', 'name').orderBy('name');
}

function legOf(d: ReturnType<typeof directions>): DaySheetLeg {
  return {
    steps: d.steps.map((s) => ({ text: s.text, distanceM: s.distanceM, durationSec: s.durationSec })),
    distanceM: d.distanceM,
    durationSec: d.durationSec,
    fallback: d.fallback,
    geometry: d.geometry,
  };
}

/**
 * One farrier's day sheet, or null when the practice has no plan with a route for them that day.
 * `publishedOnly` hides drafts (farriers work from published plans only).
 */
export async function loadDaySheet(
  db: Knex,
  opts: { practiceId: number; date: string; farrierId: number; units: 'miles' | 'km'; publishedOnly: boolean },
): Promise<DaySheet | null> {
  const planQuery = db('plans').where({ practice_id: opts.practiceId, plan_date: opts.date });
  if (opts.publishedOnly) planQuery.andWhere('state', 'published');
  const plan = await planQuery.first();
  if (!plan) return null;
  const route = await db('routes').where({ plan_id: plan.id, farrier_id: opts.farrierId, practice_id: opts.practiceId }).first();
  if (!route) return null;
  const farrier = await db('farriers').where({ id: opts.farrierId, practice_id: opts.practiceId }).first();
  const stopRows = await db('stops as s')
    .join('barns as b', 'b.id', 's.barn_id')
    .where('s.route_id', route.id)
    .select('s.*', 'b.name as barn_name', 'b.address as barn_address', 'b.notes as barn_notes', 'b.lat as barn_lat', 'b.lon as barn_lon', 'b.owner_id as barn_owner_id')
    .orderBy('s.position');
  const stopIds = stopRows.map((s) => s.id as number);
  const horseRows = stopIds.length
    ? await db('stop_jobs as sj')
        .join('jobs as j', 'j.id', 'sj.job_id')
        .join('horses as h', 'h.id', 'j.horse_id')
        .join('owners as o', 'o.id', 'h.owner_id')
        .whereIn('sj.stop_id', stopIds)
        .select('sj.stop_id', 'sj.position', 'j.id as job_id', 'j.minutes', 'j.notes as job_notes', 'j.lame', 'j.state as job_state', 'h.id as horse_id', 'h.name as horse_name', 'h.shoe_size', 'h.notes as horse_notes', 'h.needs_second_person', 'o.id as owner_id', 'o.name as owner_name', 'o.phone as owner_phone')
        .orderBy([{ column: 'sj.stop_id' }, { column: 'sj.position' }])
    : [];
  const jobIds = horseRows.map((h) => h.job_id as number);
  const workRows = jobIds.length
    ? await db('job_work_types as jw').join('work_types as w', 'w.id', 'jw.work_type_id').whereIn('jw.job_id', jobIds).select('jw.job_id', 'w.name', 'w.needs_forge', 'w.needs_qualified').orderBy('w.id')
    : [];
  const barnOwnerIds = [...new Set(stopRows.map((s) => s.barn_owner_id).filter((x): x is number => x != null))];
  const barnOwners = barnOwnerIds.length ? await db('owners').whereIn('id', barnOwnerIds).select('id', 'name', 'phone') : [];
  const visits = stopIds.length ? await db('visit_logs').whereIn('stop_id', stopIds).select('stop_id', 'state', 'arrived_at', 'departed_at', 'skip_reason').orderBy('id') : [];

  const graph = getRoadGraph();
  let from = { lat: Number(farrier.home_lat), lon: Number(farrier.home_lon) };
  const stops: DaySheetStop[] = stopRows.map((s) => {
    const to = { lat: Number(s.barn_lat), lon: Number(s.barn_lon) };
    const leg = legOf(directions(graph, from, to, opts.units));
    from = to;
    const horses = horseRows.filter((h) => h.stop_id === s.id);
    const owners = new Map<number, DaySheetOwner>();
    const barnOwner = barnOwners.find((o) => o.id === s.barn_owner_id);
    if (barnOwner) owners.set(barnOwner.id, { id: barnOwner.id, name: barnOwner.name, phone: barnOwner.phone });
    for (const h of horses) if (!owners.has(h.owner_id)) owners.set(h.owner_id, { id: h.owner_id, name: h.owner_name, phone: h.owner_phone });
    const visit = visits.filter((v) => v.stop_id === s.id).pop();
    return {
      id: s.id,
      position: s.position,
      arrivalAt: iso(s.arrival_at)!,
      startAt: iso(s.start_at)!,
      departureAt: iso(s.departure_at)!,
      windowStartAt: iso(s.window_start_at),
      windowEndAt: iso(s.window_end_at),
      barn: { id: s.barn_id, name: s.barn_name, address: s.barn_address, notes: s.barn_notes, lat: Number(s.barn_lat), lon: Number(s.barn_lon) },
      owners: [...owners.values()],
      horses: horses.map((h) => ({
        id: h.horse_id,
        jobId: h.job_id,
        name: h.horse_name,
        ownerName: h.owner_name,
        minutes: h.minutes,
        work: workRows.filter((w) => w.job_id === h.job_id).map((w) => ({ name: w.name, needsForge: !!w.needs_forge, needsQualified: !!w.needs_qualified })),
        shoeSize: h.shoe_size,
        notes: h.horse_notes,
        jobNotes: h.job_notes,
        needsSecondPerson: !!h.needs_second_person,
        lame: !!h.lame,
        jobState: h.job_state,
      })),
      leg,
      visit: visit ? { state: visit.state, arrivedAt: iso(visit.arrived_at), departedAt: iso(visit.departed_at), skipReason: visit.skip_reason } : null,
    };
  });
  const homeLeg = legOf(directions(graph, from, { lat: Number(farrier.home_lat), lon: Number(farrier.home_lon) }, opts.units));
  return {
    date: opts.date,
    plan: { id: plan.id, state: plan.state, version: plan.version, publishedAt: iso(plan.published_at) },
    farrier: { id: farrier.id, name: farrier.name, colour: farrier.colour, homeAddress: farrier.home_address, homeLat: Number(farrier.home_lat), homeLon: Number(farrier.home_lon) },
    route: {
      id: route.id,
      startAt: iso(route.start_at)!,
      endAt: iso(route.end_at)!,
      driveSeconds: route.drive_seconds,
      distanceM: route.distance_m,
      workSeconds: route.work_seconds,
      overtimeSeconds: route.overtime_seconds,
      breakStartAt: iso(route.break_start_at),
    },
    stops,
    homeLeg,
    dayLog: (await dayLogsOf(db, opts.practiceId, opts.date, opts.farrierId))[0] ?? null,
  };
}
