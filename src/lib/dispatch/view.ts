import type { Knex } from 'knex';
import type { Practice } from '../db/practices.ts';
import { getPlan, listDayBarns, listDayFarriers, listDayJobs, loadRoutes, stopProgress, type DayJob } from '../db/plans.ts';
import { directions, getRoadGraph } from '../routing/index.ts';
import type { PlanJobView, PlanRouteView, PlanView, PlanWarning } from '../../schemas/plans.ts';
import { isoLocal } from './time.ts';
import { jobCautions, routeCautions, unplannedWords } from './words.ts';
import { warmDispatch } from './warm.ts';

warmDispatch();

/**
 * A stored plan as the API answers it: times in ISO 8601 with the practice's offset, distances in the
 * practice's units (one decimal), minutes as whole numbers, reasons and warnings in words.
 */

const METRES_PER_UNIT = { miles: 1609.344, km: 1000 } as const;

export function distanceIn(units: 'miles' | 'km', metres: number): number {
  return Math.round((metres / METRES_PER_UNIT[units]) * 10) / 10;
}

function jobView(j: DayJob): PlanJobView {
  return {
    id: j.id,
    horseId: j.horseId,
    horseName: j.horseName,
    ownerName: j.ownerName,
    workTypes: j.workTypes.map((w) => w.name),
    minutes: j.minutes,
    dueOn: j.dueOn,
    lame: j.lame,
    pinned: j.pinnedFarrierId != null,
    pinnedPosition: j.pinnedPosition,
    cautions: jobCautions(j),
  };
}

/** The plan with its routes, stops and unplanned jobs, or null when it is not the practice's. */
export async function planView(db: Knex | Knex.Transaction, practice: Practice, planId: number): Promise<PlanView | null> {
  const plan = await getPlan(db, practice.id, planId);
  if (!plan) return null;
  const tz = practice.timeZone;
  const units = practice.units;
  const routes = await loadRoutes(db, practice.id, planId);
  const unplanned = plan.figures?.unplanned ?? [];
  const jobIds = [...routes.flatMap((r) => r.stops.flatMap((s) => s.jobIds)), ...unplanned.map((u) => u.jobId)];
  const jobs = new Map((await listDayJobs(db, practice.id, { ids: jobIds })).map((j) => [j.id, j]));
  const barnIds = [...new Set([...routes.flatMap((r) => r.stops.map((s) => s.barnId)), ...[...jobs.values()].map((j) => j.barnId)])];
  const barns = new Map((await listDayBarns(db, practice.id, barnIds)).map((b) => [b.id, b]));
  const farriers = new Map((await listDayFarriers(db, practice.id, { includeArchived: true })).map((f) => [f.id, f]));
  const warnings = plan.figures?.warnings ?? {};
  const progress = await stopProgress(db, practice.id, routes.flatMap((r) => r.stops.map((s) => s.id)));

  const routeViews: PlanRouteView[] = routes
    .map((r) => {
      const f = farriers.get(r.farrierId)!;
      const list = (warnings[String(r.farrierId)] ?? []) as PlanWarning[];
      const stops = r.stops.map((s) => {
        const b = barns.get(s.barnId)!;
        const stopJobs = s.jobIds.map((id) => jobs.get(id)).filter((j): j is DayJob => !!j);
        return {
          id: s.id,
          position: s.position,
          barnId: s.barnId,
          barnName: b?.name ?? `Barn ${s.barnId}`,
          lat: b?.lat ?? 0,
          lon: b?.lon ?? 0,
          arrival: isoLocal(s.arrivalAt, tz),
          start: isoLocal(s.startAt, tz),
          departure: isoLocal(s.departureAt, tz),
          legDriveMinutes: Math.round(s.legDriveSeconds / 60),
          legDistance: distanceIn(units, s.legDistanceM),
          window: s.windowStartAt && s.windowEndAt ? { start: isoLocal(s.windowStartAt, tz), end: isoLocal(s.windowEndAt, tz) } : null,
          minutes: Math.round((s.departureAt.getTime() - s.startAt.getTime()) / 60000),
          jobs: stopJobs.map(jobView),
          warnings: list.filter((w) => w.jobId !== undefined && s.jobIds.includes(w.jobId)),
          progress: (() => {
            const p = progress.get(s.id);
            if (!p) return null;
            return { state: p.state, arrived: p.arrivedAt ? isoLocal(p.arrivedAt, tz) : null, departed: p.departedAt ? isoLocal(p.departedAt, tz) : null, skipReason: p.skipReason };
          })(),
        };
      });
      return {
        id: r.id,
        farrierId: r.farrierId,
        farrierName: f?.name ?? `Farrier ${r.farrierId}`,
        colour: f?.colour ?? '#445a76',
        home: { lat: f?.homeLat ?? 0, lon: f?.homeLon ?? 0 },
        hasForge: f?.hasForge ?? false,
        qualified: (f?.qualified ?? false) && !(f?.apprentice ?? false),
        apprentice: f?.apprentice ?? false,
        start: isoLocal(r.startAt, tz),
        end: isoLocal(r.endAt, tz),
        breakStart: r.breakStartAt ? isoLocal(r.breakStartAt, tz) : null,
        driveMinutes: Math.round(r.driveSeconds / 60),
        distance: distanceIn(units, r.distanceM),
        workMinutes: Math.round(r.workSeconds / 60),
        overtimeMinutes: Math.round(r.overtimeSeconds / 60),
        horses: stops.reduce((a, s) => a + s.jobs.length, 0),
        stops,
        warnings: list.filter((w) => w.jobId === undefined || !r.stops.some((s) => s.jobIds.includes(w.jobId!))),
        cautions: r.stops.length ? routeCautions(r.driveSeconds, (r.endAt.getTime() - r.startAt.getTime()) / 1000) : [],
      };
    })
    .sort((a, b) => a.farrierName.localeCompare(b.farrierName));

  const unplannedViews = unplanned
    .map((u) => {
      const j = jobs.get(u.jobId);
      if (!j) return null;
      const b = barns.get(j.barnId);
      return { jobId: u.jobId, reason: u.reason, reasonText: unplannedWords(u.reason), job: jobView(j), barnId: j.barnId, barnName: b?.name ?? `Barn ${j.barnId}` };
    })
    .filter((u): u is NonNullable<typeof u> => u !== null)
    .sort((a, b) => a.job.dueOn.localeCompare(b.job.dueOn) || a.jobId - b.jobId);

  const totalDriveSec = routes.reduce((a, r) => a + r.driveSeconds, 0);
  return {
    id: plan.id,
    date: plan.date,
    state: plan.state,
    version: plan.version,
    publishedAt: plan.publishedAt ? isoLocal(plan.publishedAt, tz) : null,
    timeZone: tz,
    units,
    routes: routeViews,
    unplanned: unplannedViews,
    figures: {
      driveMinutes: Math.round(totalDriveSec / 60),
      distance: distanceIn(units, routes.reduce((a, r) => a + r.distanceM, 0)),
      overtimeMinutes: Math.round(routes.reduce((a, r) => a + r.overtimeSeconds, 0) / 60),
      horses: routeViews.reduce((a, r) => a + r.horses, 0),
      stops: routeViews.reduce((a, r) => a + r.stops.length, 0),
      solveSeconds: plan.figures?.solveSeconds ?? null,
      iterations: plan.figures?.iterations ?? null,
      budgetSeconds: plan.figures?.budgetSeconds ?? null,
    },
  };
}

const legCache = new Map<string, [number, number][]>();

/**
 * One line per farrier along the roads: home, each stop, home, leg by leg with the routing module's
 * directions geometry. Legs are remembered, so redrawing after an edit only routes the new legs.
 */
export function routeLines(view: PlanView): { farrierId: number; colour: string; coordinates: [number, number][] }[] {
  const graph = getRoadGraph();
  return view.routes
    .filter((r) => r.stops.length > 0)
    .map((r) => {
      const places = [r.home, ...r.stops.map((s) => ({ lat: s.lat, lon: s.lon })), r.home];
      const coordinates: [number, number][] = [];
      for (let i = 1; i < places.length; i++) {
        const a = places[i - 1]!, b = places[i]!;
        const key = `${a.lat},${a.lon}|${b.lat},${b.lon}`;
        let line = legCache.get(key);
        if (!line) {
          line = directions(graph, a, b, view.units).geometry;
          if (legCache.size > 20_000) legCache.clear();
          legCache.set(key, line);
        }
        coordinates.push(...(coordinates.length ? line.slice(1) : line));
      }
      return { farrierId: r.farrierId, colour: r.colour, coordinates };
    });
}
