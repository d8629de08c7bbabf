import type { Knex } from 'knex';
import type { Practice } from './practices.ts';
import type { ReviewInput, ReviewFarrierInput, PlannedDayInput, ActualDayInput, VisitInput } from '../review/compute.ts';
import { weekOf, type IsoDate } from '../review/time.ts';

/**
 * Reads everything the review of [from, to] needs for one practice. Rows are read for the whole
 * workweeks holding `from` and `to`, so weekly overtime at the range's edges sees the full week.
 * Planned figures come from published plans only; a draft is not a plan anyone worked to.
 */
export async function loadReviewInput(db: Knex, practice: Practice, from: IsoDate, to: IsoDate): Promise<ReviewInput> {
  const readFrom = weekOf(from, practice.weekStart).from;
  const readTo = weekOf(to, practice.weekStart).to;
  const practiceId = practice.id;

  const farrierRows = await db('farriers')
    .where({ practice_id: practiceId })
    .orderBy('name')
    .select('id', 'name', 'colour', 'cost_per_hour_cents', 'break_minutes', 'archived_at');
  const farriers: ReviewFarrierInput[] = farrierRows.map((f) => ({
    id: f.id, name: f.name, colour: f.colour, costPerHourCents: f.cost_per_hour_cents, breakMinutes: f.break_minutes, archived: f.archived_at != null,
  }));

  // Stops, horses and planned revenue per route, from the jobs on the route priced by their work types.
  const stopCounts = db('stops as s').select('s.route_id').count({ stops: '*' }).groupBy('s.route_id').as('sc');
  const jobCounts = db('stops as s2')
    .join('stop_jobs as sj', 'sj.stop_id', 's2.id')
    .leftJoin(
      db('job_work_types as jwt').join('work_types as wt', 'wt.id', 'jwt.work_type_id').select('jwt.job_id').sum({ price: 'wt.price_cents' }).groupBy('jwt.job_id').as('jp'),
      'jp.job_id', 'sj.job_id',
    )
    .select('s2.route_id')
    .count({ horses: 'sj.job_id' })
    .sum({ revenue: 'jp.price' })
    .groupBy('s2.route_id')
    .as('jc');
  const routeRows = await db('routes as r')
    .join('plans as p', 'p.id', 'r.plan_id')
    .leftJoin(stopCounts, 'sc.route_id', 'r.id')
    .leftJoin(jobCounts, 'jc.route_id', 'r.id')
    .where('p.practice_id', practiceId)
    .andWhere('r.practice_id', practiceId)
    .andWhere('p.state', 'published')
    .whereBetween('p.plan_date', [readFrom, readTo])
    .select('r.farrier_id', 'p.plan_date', 'r.start_at', 'r.end_at', 'r.drive_seconds', 'r.distance_m', 'r.break_start_at', 'sc.stops', 'jc.horses', 'jc.revenue');
  const planned: PlannedDayInput[] = routeRows.map((r) => ({
    farrierId: r.farrier_id, date: r.plan_date, startAt: r.start_at, endAt: r.end_at, driveSec: r.drive_seconds, distanceM: r.distance_m,
    hasBreak: r.break_start_at != null, stops: Number(r.stops ?? 0), horses: Number(r.horses ?? 0), revenueCents: Number(r.revenue ?? 0),
  }));

  const dayRows = await db('day_logs')
    .where({ practice_id: practiceId })
    .whereBetween('work_date', [readFrom, readTo])
    .select('farrier_id', 'work_date', 'started_at', 'ended_at', 'distance_m', 'distance_source');
  const actual: ActualDayInput[] = dayRows.map((d) => ({
    farrierId: d.farrier_id, date: d.work_date, startedAt: d.started_at, endedAt: d.ended_at, distanceM: d.distance_m, distanceSource: d.distance_source ?? null,
  }));

  const horseSums = db('visit_log_horses').select('visit_log_id').count({ horses: '*' }).sum({ revenue: 'revenue_cents' }).groupBy('visit_log_id').as('vh');
  const visitRows = await db('visit_logs as v')
    .leftJoin(horseSums, 'vh.visit_log_id', 'v.id')
    .where('v.practice_id', practiceId)
    .whereBetween('v.visit_date', [readFrom, readTo])
    .select('v.farrier_id', 'v.visit_date', 'v.state', 'v.distance_m', 'vh.horses', 'vh.revenue');
  const visits: VisitInput[] = visitRows.map((v) => ({
    farrierId: v.farrier_id, date: v.visit_date, state: v.state, distanceM: v.distance_m, horsesDone: Number(v.horses ?? 0), revenueCents: Number(v.revenue ?? 0),
  }));

  return {
    from, to, units: practice.units, mileageRate: practice.mileageRate, currency: practice.currency,
    rule: {
      weeklyMinutes: practice.overtimeWeeklyMinutes, weeklyMultiplier: practice.overtimeWeeklyMultiplier,
      dailyMinutes: practice.overtimeDailyMinutes, dailyMultiplier: practice.overtimeDailyMultiplier,
      dailyDoubleMinutes: practice.overtimeDailyDoubleMinutes, dailyDoubleMultiplier: practice.overtimeDailyDoubleMultiplier,
      weekStart: practice.weekStart,
    },
    farriers, planned, actual, visits,
  };
}

/** A planned stop of a day, with its horses and their work. */
export interface DayStop {
  stopId: number;
  position: number;
  barnId: number;
  barnName: string;
  arrivalAt: Date;
  startAt: Date;
  departureAt: Date;
  legDriveSec: number;
  legDistanceM: number;
  jobs: { jobId: number; horseName: string; work: string; priceCents: number }[];
}

/** An actual visit of a day, with the horses done. */
export interface DayVisit {
  visitId: number;
  stopId: number | null;
  barnId: number;
  barnName: string;
  state: 'arrived' | 'done' | 'skipped';
  arrivedAt: Date | null;
  departedAt: Date | null;
  distanceM: number | null;
  skipReason: string | null;
  horses: { horseName: string; work: string; revenueCents: number }[];
}

/** One farrier's plan and actuals for one day. */
export interface FarrierDay {
  farrierId: number;
  name: string;
  colour: string;
  breakMinutes: number;
  route: {
    startAt: Date; endAt: Date; driveSec: number; distanceM: number; workSec: number; overtimeSec: number; breakStartAt: Date | null;
    planVersion: number; publishedAt: Date | null;
  } | null;
  stops: DayStop[];
  dayLog: { id: number; startedAt: Date; endedAt: Date | null; distanceM: number | null; startOdometer: number | null; endOdometer: number | null } | null;
  visits: DayVisit[];
}

/**
 * One day's published plan and what really happened, per farrier (optionally one farrier), for the
 * review's day page. Farriers with neither a route nor a log that day are left out.
 */
export async function loadReviewDay(db: Knex, practiceId: number, date: IsoDate, farrierId?: number): Promise<FarrierDay[]> {
  const farrierQuery = db('farriers').where({ practice_id: practiceId }).orderBy('name').select('id', 'name', 'colour', 'break_minutes');
  if (farrierId !== undefined) farrierQuery.andWhere({ id: farrierId });
  const farriers = await farrierQuery;

  const routes = await db('routes as r')
    .join('plans as p', 'p.id', 'r.plan_id')
    .where({ 'p.practice_id': practiceId, 'r.practice_id': practiceId, 'p.state': 'published', 'p.plan_date': date })
    .select('r.id', 'r.farrier_id', 'r.start_at', 'r.end_at', 'r.drive_seconds', 'r.distance_m', 'r.work_seconds', 'r.overtime_seconds', 'r.break_start_at', 'p.version', 'p.published_at');
  const routeIds = routes.map((r) => r.id);
  const stopRows = routeIds.length
    ? await db('stops as s').join('barns as b', 'b.id', 's.barn_id').whereIn('s.route_id', routeIds).andWhere('s.practice_id', practiceId).orderBy(['s.route_id', 's.position'])
      .select('s.id', 's.route_id', 's.position', 's.barn_id', 'b.name as barn_name', 's.arrival_at', 's.start_at', 's.departure_at', 's.leg_drive_seconds', 's.leg_distance_m')
    : [];
  const stopIds = stopRows.map((s) => s.id);
  const jobRows = stopIds.length
    ? await db('stop_jobs as sj').join('jobs as j', 'j.id', 'sj.job_id').join('horses as h', 'h.id', 'j.horse_id')
      .leftJoin('job_work_types as jwt', 'jwt.job_id', 'j.id').leftJoin('work_types as wt', 'wt.id', 'jwt.work_type_id')
      .whereIn('sj.stop_id', stopIds).andWhere('j.practice_id', practiceId).orderBy(['sj.stop_id', 'sj.position', 'wt.id'])
      .select('sj.stop_id', 'j.id as job_id', 'h.name as horse_name', 'wt.name as work_name', 'wt.price_cents')
    : [];
  const dayLogs = await db('day_logs').where({ practice_id: practiceId, work_date: date }).select('id', 'farrier_id', 'started_at', 'ended_at', 'distance_m', 'start_odometer', 'end_odometer');
  const visitRows = await db('visit_logs as v').join('barns as b', 'b.id', 'v.barn_id').where({ 'v.practice_id': practiceId, 'v.visit_date': date })
    .orderBy(['v.farrier_id', 'v.arrived_at', 'v.id'])
    .select('v.id', 'v.farrier_id', 'v.stop_id', 'v.barn_id', 'b.name as barn_name', 'v.state', 'v.arrived_at', 'v.departed_at', 'v.distance_m', 'v.skip_reason');
  const visitIds = visitRows.map((v) => v.id);
  const horseRows = visitIds.length
    ? await db('visit_log_horses as vh').join('horses as h', 'h.id', 'vh.horse_id').whereIn('vh.visit_log_id', visitIds).orderBy(['vh.visit_log_id', 'h.name'])
      .select('vh.visit_log_id', 'h.name as horse_name', 'vh.work', 'vh.revenue_cents')
    : [];

  const jobsByStop = new Map<number, DayStop['jobs']>();
  for (const j of jobRows) {
    const list = jobsByStop.get(j.stop_id) ?? [];
    const existing = list.find((x) => x.jobId === j.job_id);
    if (existing) {
      if (j.work_name) existing.work = existing.work ? `${existing.work}, ${j.work_name}` : j.work_name;
      existing.priceCents += j.price_cents ?? 0;
    } else {
      list.push({ jobId: j.job_id, horseName: j.horse_name, work: j.work_name ?? '', priceCents: j.price_cents ?? 0 });
    }
    jobsByStop.set(j.stop_id, list);
  }
  const out: FarrierDay[] = [];
  for (const f of farriers) {
    const route = routes.find((r) => r.farrier_id === f.id);
    const log = dayLogs.find((d) => d.farrier_id === f.id);
    const visits = visitRows.filter((v) => v.farrier_id === f.id);
    if (!route && !log && visits.length === 0) continue;
    out.push({
      farrierId: f.id, name: f.name, colour: f.colour, breakMinutes: f.break_minutes,
      route: route ? {
        startAt: route.start_at, endAt: route.end_at, driveSec: route.drive_seconds, distanceM: route.distance_m, workSec: route.work_seconds,
        overtimeSec: route.overtime_seconds, breakStartAt: route.break_start_at, planVersion: route.version, publishedAt: route.published_at,
      } : null,
      stops: route ? stopRows.filter((s) => s.route_id === route.id).map((s) => ({
        stopId: s.id, position: s.position, barnId: s.barn_id, barnName: s.barn_name, arrivalAt: s.arrival_at, startAt: s.start_at, departureAt: s.departure_at,
        legDriveSec: s.leg_drive_seconds, legDistanceM: s.leg_distance_m, jobs: jobsByStop.get(s.id) ?? [],
      })) : [],
      dayLog: log
        ? {
          id: Number(log.id), startedAt: log.started_at, endedAt: log.ended_at, distanceM: log.distance_m,
          startOdometer: log.start_odometer == null ? null : Number(log.start_odometer), endOdometer: log.end_odometer == null ? null : Number(log.end_odometer),
        }
        : null,
      visits: visits.map((v) => ({
        visitId: v.id, stopId: v.stop_id, barnId: v.barn_id, barnName: v.barn_name, state: v.state, arrivedAt: v.arrived_at, departedAt: v.departed_at,
        distanceM: v.distance_m, skipReason: v.skip_reason,
        horses: horseRows.filter((h) => h.visit_log_id === v.id).map((h) => ({ horseName: h.horse_name, work: h.work, revenueCents: h.revenue_cents })),
      })),
    });
  }
  return out;
}
