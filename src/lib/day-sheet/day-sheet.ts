/**
 * Everything one farrier's day sheet shows, read in a few queries (src/lib/db) and put together with
 * the leg directions from src/lib/routing.
 */
import type { Knex } from 'knex';
import { directions, getRoadGraph } from '../routing/index.ts';
import { getPlanByDate, getRouteOfPlan } from '../db/plans.ts';
import { getSheetFarrier, listBarnOwners, listSheetHorses, listSheetStops, listSheetWork, listStopVisits } from '../db/day-sheets.ts';
import { listDayLogs, type DayLogView } from '../db/day-logs.ts';

export { farriersOnDay } from '../db/day-sheets.ts';
/** The practice's farriers, for the picker when a day has no plan yet. */
export { listFarrierOptions as practiceFarriers } from '../db/farriers.ts';

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
  const plan = await getPlanByDate(db, opts.practiceId, opts.date, { publishedOnly: opts.publishedOnly });
  if (!plan) return null;
  const route = await getRouteOfPlan(db, opts.practiceId, plan.id, opts.farrierId);
  if (!route) return null;
  // The route's farrier: the route holds it by foreign key, in the same practice.
  const farrier = (await getSheetFarrier(db, opts.practiceId, opts.farrierId))!;
  const stopRows = await listSheetStops(db, route.id);
  const stopIds = stopRows.map((s) => s.id);
  const horseRows = await listSheetHorses(db, stopIds);
  const workRows = await listSheetWork(db, horseRows.map((h) => h.jobId));
  const barnOwners = await listBarnOwners(db, [...new Set(stopRows.map((s) => s.barnOwnerId).filter((x): x is number => x != null))]);
  const visits = await listStopVisits(db, stopIds);

  const graph = getRoadGraph();
  const home = { lat: farrier.homeLat, lon: farrier.homeLon };
  let from = home;
  const stops: DaySheetStop[] = stopRows.map((s) => {
    const to = { lat: s.barn.lat, lon: s.barn.lon };
    const leg = legOf(directions(graph, from, to, opts.units));
    from = to;
    const horses = horseRows.filter((h) => h.stopId === s.id);
    const owners = new Map<number, DaySheetOwner>();
    const barnOwner = barnOwners.find((o) => o.id === s.barnOwnerId);
    if (barnOwner) owners.set(barnOwner.id, { id: barnOwner.id, name: barnOwner.name, phone: barnOwner.phone });
    for (const h of horses) if (!owners.has(h.ownerId)) owners.set(h.ownerId, { id: h.ownerId, name: h.ownerName, phone: h.ownerPhone });
    const visit = visits.filter((v) => v.stopId === s.id).pop();
    return {
      id: s.id,
      position: s.position,
      arrivalAt: iso(s.arrivalAt)!,
      startAt: iso(s.startAt)!,
      departureAt: iso(s.departureAt)!,
      windowStartAt: iso(s.windowStartAt),
      windowEndAt: iso(s.windowEndAt),
      barn: s.barn,
      owners: [...owners.values()],
      horses: horses.map((h) => ({
        id: h.horseId,
        jobId: h.jobId,
        name: h.horseName,
        ownerName: h.ownerName,
        minutes: h.minutes,
        work: workRows.filter((w) => w.jobId === h.jobId).map((w) => ({ name: w.name, needsForge: w.needsForge, needsQualified: w.needsQualified })),
        shoeSize: h.shoeSize,
        notes: h.horseNotes,
        jobNotes: h.jobNotes,
        needsSecondPerson: h.needsSecondPerson,
        lame: h.lame,
        jobState: h.jobState,
      })),
      leg,
      visit: visit ? { state: visit.state, arrivedAt: iso(visit.arrivedAt), departedAt: iso(visit.departedAt), skipReason: visit.skipReason } : null,
    };
  });
  const homeLeg = legOf(directions(graph, from, home, opts.units));
  return {
    date: opts.date,
    plan: { id: plan.id, state: plan.state, version: plan.version, publishedAt: iso(plan.publishedAt) },
    farrier,
    route: {
      id: route.id,
      startAt: iso(route.startAt)!,
      endAt: iso(route.endAt)!,
      driveSeconds: route.driveSeconds,
      distanceM: route.distanceM,
      workSeconds: route.workSeconds,
      overtimeSeconds: route.overtimeSeconds,
      breakStartAt: iso(route.breakStartAt),
    },
    stops,
    homeLeg,
    dayLog: (await listDayLogs(db, opts.practiceId, opts.date, opts.farrierId))[0] ?? null,
  };
}
