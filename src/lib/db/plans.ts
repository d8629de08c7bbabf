import type { Db } from './connection.ts';

/**
 * Queries behind dispatch: what a day's plan is built from (farriers working, open jobs, barns) and the
 * stored plan itself (plans, routes, stops, stop_jobs, owner messages). Every query is held to one
 * practice. Times are UTC Date objects here; the dispatch layer turns them into local ISO strings.
 */

export interface DayFarrier {
  id: number;
  name: string;
  colour: string;
  homeLat: number;
  homeLon: number;
  qualified: boolean;
  apprentice: boolean;
  hasForge: boolean;
  workingDays: number[];
  shiftStartMinute: number;
  shiftEndMinute: number;
  breakMinutes: number;
  breakWindowStartMinute: number;
  breakWindowEndMinute: number;
  normalWorkMinutes: number;
  maxOvertimeMinutes: number;
  costPerHourCents: number;
}

export interface DayWorkType {
  id: number;
  name: string;
  needsForge: boolean;
  needsQualified: boolean;
}

export interface DayJob {
  id: number;
  horseId: number;
  horseName: string;
  horseNotes: string | null;
  secondPerson: boolean;
  ownerId: number;
  ownerName: string;
  barnId: number;
  minutes: number;
  dueOn: string;
  state: string;
  pinnedFarrierId: number | null;
  pinnedPosition: number | null;
  ownerWindowStartMinute: number | null;
  ownerWindowEndMinute: number | null;
  lame: boolean;
  notes: string | null;
  workTypes: DayWorkType[];
}

export interface DayBarn {
  id: number;
  name: string;
  lat: number;
  lon: number;
  /** Seven entries, Monday first, each a list of [startMinute, endMinute]. */
  accessHours: [number, number][][];
  setupMinutes: number;
}

export interface PlanRow {
  id: number;
  practiceId: number;
  date: string;
  state: 'draft' | 'published';
  version: number;
  figures: PlanFigures | null;
  publishedAt: Date | null;
}

/** What plans.figures holds: the unplanned list, the warnings of hand edits and the engine's run. */
export interface PlanFigures {
  unplanned?: { jobId: number; reason: string }[];
  warnings?: Record<string, { code: string; message: string; jobId?: number }[]>;
  solveSeconds?: number;
  iterations?: number;
  budgetSeconds?: number;
  seed?: number;
}

export interface StoredStop {
  id: number;
  routeId: number;
  position: number;
  barnId: number;
  arrivalAt: Date;
  startAt: Date;
  departureAt: Date;
  legDriveSeconds: number;
  legDistanceM: number;
  windowStartAt: Date | null;
  windowEndAt: Date | null;
  jobIds: number[];
}

export interface StoredRoute {
  id: number;
  farrierId: number;
  startAt: Date;
  endAt: Date;
  driveSeconds: number;
  distanceM: number;
  workSeconds: number;
  overtimeSeconds: number;
  breakStartAt: Date | null;
  stops: StoredStop[];
}

/** A route to write; ids are assigned by the database. */
export type RouteWrite = Omit<StoredRoute, 'id' | 'stops'> & { stops: Omit<StoredStop, 'id' | 'routeId'>[] };

const bool = (v: unknown) => v === true || v === 1 || v === '1';
const parseJson = <T>(v: unknown): T | null => (v == null ? null : typeof v === 'string' ? (JSON.parse(v) as T) : (v as T));

/** The practice's current farriers with their working pattern; the caller keeps those working a weekday. */
export async function listDayFarriers(db: Db, practiceId: number, opts: { includeArchived?: boolean } = {}): Promise<DayFarrier[]> {
  const q = db('farriers').where({ practice_id: practiceId }).orderBy('id');
  if (!opts.includeArchived) q.whereNull('archived_at');
  const rows = await q;
  return rows.map((r: Record<string, any>) => ({
    id: r.id,
    name: r.name,
    colour: r.colour,
    homeLat: Number(r.home_lat),
    homeLon: Number(r.home_lon),
    qualified: bool(r.qualified_therapeutic),
    apprentice: bool(r.apprentice),
    hasForge: bool(r.has_forge),
    workingDays: String(r.working_days).split(',').map(Number).filter((n) => n >= 1 && n <= 7),
    shiftStartMinute: r.shift_start_minute,
    shiftEndMinute: r.shift_end_minute,
    breakMinutes: r.break_minutes,
    breakWindowStartMinute: r.break_window_start_minute,
    breakWindowEndMinute: r.break_window_end_minute,
    normalWorkMinutes: r.normal_work_minutes,
    maxOvertimeMinutes: r.max_overtime_minutes,
    costPerHourCents: r.cost_per_hour_cents,
  }));
}

/**
 * Jobs with their horse, owner and work: either the open `due` jobs eligible on a date (due on or before
 * `dueBy`, and not held back by an earliest date after the day), or the jobs with the given ids.
 */
export async function listDayJobs(db: Db, practiceId: number, filter: { date: string; dueBy: string } | { ids: number[] }): Promise<DayJob[]> {
  const q = db('jobs as j')
    .join('horses as h', function () {
      this.on('h.id', 'j.horse_id').andOn('h.practice_id', 'j.practice_id');
    })
    .join('owners as o', function () {
      this.on('o.id', 'h.owner_id').andOn('o.practice_id', 'j.practice_id');
    })
    .where('j.practice_id', practiceId)
    .select(
      'j.id', 'j.horse_id', 'h.name as horse_name', 'h.notes as horse_notes', 'h.needs_second_person', 'h.owner_id', 'o.name as owner_name',
      'h.barn_id', 'j.minutes', 'j.due_on', 'j.state', 'j.pinned_farrier_id', 'j.pinned_position', 'j.owner_window_start_minute',
      'j.owner_window_end_minute', 'j.lame', 'j.notes',
    )
    .orderBy([{ column: 'j.due_on' }, { column: 'j.id' }]);
  if ('ids' in filter) {
    if (filter.ids.length === 0) return [];
    q.whereIn('j.id', filter.ids);
  } else {
    q.where('j.state', 'due')
      .whereNull('h.archived_at')
      .where('j.due_on', '<=', filter.dueBy)
      .where((w) => w.whereNull('j.earliest_on').orWhere('j.earliest_on', '<=', filter.date));
  }
  const rows: Record<string, any>[] = await q;
  const ids = rows.map((r) => r.id as number);
  const work: Record<string, any>[] = ids.length
    ? await db('job_work_types as jw')
        .join('work_types as w', 'w.id', 'jw.work_type_id')
        .whereIn('jw.job_id', ids)
        .where('w.practice_id', practiceId)
        .orderBy(['jw.job_id', 'w.id'])
        .select('jw.job_id', 'w.id', 'w.name', 'w.needs_forge', 'w.needs_qualified')
    : [];
  const byJob = new Map<number, DayWorkType[]>();
  for (const w of work) {
    const list = byJob.get(w.job_id) ?? [];
    list.push({ id: w.id, name: w.name, needsForge: bool(w.needs_forge), needsQualified: bool(w.needs_qualified) });
    byJob.set(w.job_id, list);
  }
  return rows.map((r) => ({
    id: r.id,
    horseId: r.horse_id,
    horseName: r.horse_name,
    horseNotes: r.horse_notes,
    secondPerson: bool(r.needs_second_person),
    ownerId: r.owner_id,
    ownerName: r.owner_name,
    barnId: r.barn_id,
    minutes: r.minutes,
    dueOn: String(r.due_on).slice(0, 10),
    state: r.state,
    pinnedFarrierId: r.pinned_farrier_id,
    pinnedPosition: r.pinned_position,
    ownerWindowStartMinute: r.owner_window_start_minute,
    ownerWindowEndMinute: r.owner_window_end_minute,
    lame: bool(r.lame),
    notes: r.notes,
    workTypes: byJob.get(r.id) ?? [],
  }));
}

/** Barns by id, held to the practice. */
export async function listDayBarns(db: Db, practiceId: number, ids: number[]): Promise<DayBarn[]> {
  if (ids.length === 0) return [];
  const rows: Record<string, any>[] = await db('barns').where({ practice_id: practiceId }).whereIn('id', ids).orderBy('id');
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    lat: Number(r.lat),
    lon: Number(r.lon),
    accessHours: parseJson<[number, number][][]>(r.access_hours) ?? [],
    setupMinutes: r.setup_minutes,
  }));
}

function planFromRow(r: Record<string, any>): PlanRow {
  return {
    id: r.id,
    practiceId: r.practice_id,
    date: String(r.plan_date).slice(0, 10),
    state: r.state,
    version: r.version,
    figures: parseJson<PlanFigures>(r.figures),
    publishedAt: r.published_at ?? null,
  };
}

/** One plan of the practice; with `forUpdate` the row stays locked until the transaction ends. */
export async function getPlan(db: Db, practiceId: number, id: number, opts: { forUpdate?: boolean } = {}): Promise<PlanRow | null> {
  const q = db('plans').where({ id, practice_id: practiceId }).first();
  if (opts.forUpdate) q.forUpdate();
  const row = await q;
  return row ? planFromRow(row) : null;
}

/** The practice's plan of a date; with `publishedOnly` a draft counts as none (farriers work from published plans). */
export async function getPlanByDate(db: Db, practiceId: number, date: string, opts: { publishedOnly?: boolean } = {}): Promise<PlanRow | null> {
  const q = db('plans').where({ practice_id: practiceId, plan_date: date });
  if (opts.publishedOnly) q.andWhere('state', 'published');
  const row = await q.first();
  return row ? planFromRow(row) : null;
}

export async function insertPlan(db: Db, practiceId: number, date: string, userId: number, figures: PlanFigures): Promise<number> {
  const [id] = await db('plans').insert({ practice_id: practiceId, plan_date: date, state: 'draft', version: 1, figures: JSON.stringify(figures), created_by: userId });
  return Number(id);
}

/** Raises the version by one and stores new figures (and state, when given). */
export async function bumpPlan(db: Db, id: number, change: { figures: PlanFigures; state?: 'draft' | 'published'; publishedAt?: Date }): Promise<void> {
  const row: Record<string, unknown> = { figures: JSON.stringify(change.figures), version: db.raw('version + 1'), updated_at: db.fn.now(3) };
  if (change.state) row.state = change.state;
  if (change.publishedAt) row.published_at = change.publishedAt;
  await db('plans').where({ id }).update(row);
}

/** Deletes a draft plan's rows (routes, stops and stop_jobs go with it by cascade). */
export async function deletePlan(db: Db, id: number): Promise<void> {
  await db('plans').where({ id }).delete();
}

/** The stored routes of a plan with their stops and the jobs of each stop, in order. */
export async function loadRoutes(db: Db, practiceId: number, planId: number): Promise<StoredRoute[]> {
  const routes: Record<string, any>[] = await db('routes').where({ plan_id: planId, practice_id: practiceId }).orderBy('id');
  if (routes.length === 0) return [];
  const stops: Record<string, any>[] = await db('stops').whereIn('route_id', routes.map((r) => r.id)).orderBy(['route_id', 'position']);
  const sj: Record<string, any>[] = await db('stop_jobs').where({ plan_id: planId }).orderBy(['stop_id', 'position']);
  const jobsByStop = new Map<number, number[]>();
  for (const r of sj) jobsByStop.set(r.stop_id, [...(jobsByStop.get(r.stop_id) ?? []), r.job_id]);
  const stopsByRoute = new Map<number, StoredStop[]>();
  for (const s of stops) {
    const list = stopsByRoute.get(s.route_id) ?? [];
    list.push({
      id: s.id,
      routeId: s.route_id,
      position: s.position,
      barnId: s.barn_id,
      arrivalAt: s.arrival_at,
      startAt: s.start_at,
      departureAt: s.departure_at,
      legDriveSeconds: s.leg_drive_seconds,
      legDistanceM: s.leg_distance_m,
      windowStartAt: s.window_start_at,
      windowEndAt: s.window_end_at,
      jobIds: jobsByStop.get(s.id) ?? [],
    });
    stopsByRoute.set(s.route_id, list);
  }
  return routes.map((r) => ({ ...routeFromRow(r), stops: stopsByRoute.get(r.id) ?? [] }));
}

function routeFromRow(r: Record<string, any>): Omit<StoredRoute, 'stops'> {
  return {
    id: r.id,
    farrierId: r.farrier_id,
    startAt: r.start_at,
    endAt: r.end_at,
    driveSeconds: r.drive_seconds,
    distanceM: r.distance_m,
    workSeconds: r.work_seconds,
    overtimeSeconds: r.overtime_seconds,
    breakStartAt: r.break_start_at,
  };
}

/** One farrier's route on a plan, without its stops (the day sheet reads those with their barns). */
export async function getRouteOfPlan(db: Db, practiceId: number, planId: number, farrierId: number): Promise<Omit<StoredRoute, 'stops'> | null> {
  const row = await db('routes').where({ plan_id: planId, farrier_id: farrierId, practice_id: practiceId }).first();
  return row ? routeFromRow(row) : null;
}

/**
 * The farrier's route on the practice's plan of a date, with the plan's state, whatever that state:
 * the day's marks answer "not published yet" differently from "no day sheet".
 */
export async function getRouteOfDay(
  db: Db,
  practiceId: number,
  farrierId: number,
  date: string,
): Promise<{ id: number; startAt: Date; endAt: Date; distanceM: number; planState: PlanRow['state'] } | null> {
  const row = await db('routes as r')
    .join('plans as p', 'p.id', 'r.plan_id')
    .where({ 'p.practice_id': practiceId, 'r.practice_id': practiceId, 'p.plan_date': date, 'r.farrier_id': farrierId })
    .first('r.id', 'r.start_at', 'r.end_at', 'r.distance_m', 'p.state as plan_state');
  return row ? { id: row.id, startAt: row.start_at, endAt: row.end_at, distanceM: Number(row.distance_m), planState: row.plan_state } : null;
}

/** Multi-row INSERT … RETURNING (MariaDB 10.5+): one round trip, and each row's id paired with its own key columns. */
async function insertReturning<T>(db: Db, table: string, rows: Record<string, unknown>[], returning: string[]): Promise<T[]> {
  const { sql, bindings } = db(table).insert(rows).toSQL().toNative();
  const [result] = (await db.raw(`${sql} returning ${returning.map((c) => `\`${c}\``).join(', ')}`, bindings)) as [T[]];
  return result;
}

/**
 * Replaces the routes of the given farriers in a plan: old routes (and by cascade their stops and
 * stop_jobs) are deleted, new ones written. Routes, stops and stop_jobs are each one multi-row insert;
 * the ids come back from INSERT … RETURNING with the farrier (route) or route and position (stop) they
 * belong to, so every id used is the one the database returned for that row.
 */
export async function replaceRoutes(db: Db, practiceId: number, planId: number, routes: RouteWrite[]): Promise<void> {
  if (routes.length === 0) return;
  await db('routes').where({ plan_id: planId, practice_id: practiceId }).whereIn('farrier_id', routes.map((r) => r.farrierId)).delete();
  const routeIds = new Map(
    (await insertReturning<{ id: number; farrier_id: number }>(db, 'routes', routes.map((r) => ({
      practice_id: practiceId, plan_id: planId, farrier_id: r.farrierId, start_at: r.startAt, end_at: r.endAt,
      drive_seconds: r.driveSeconds, distance_m: r.distanceM, work_seconds: r.workSeconds, overtime_seconds: r.overtimeSeconds,
      break_start_at: r.breakStartAt,
    })), ['id', 'farrier_id'])).map((row) => [row.farrier_id, row.id]),
  );
  const stopRows: Record<string, unknown>[] = [];
  for (const r of routes) {
    const routeId = routeIds.get(r.farrierId)!;
    for (const s of r.stops) {
      stopRows.push({
        practice_id: practiceId, route_id: routeId, position: s.position, barn_id: s.barnId, arrival_at: s.arrivalAt, start_at: s.startAt,
        departure_at: s.departureAt, leg_drive_seconds: s.legDriveSeconds, leg_distance_m: s.legDistanceM,
        window_start_at: s.windowStartAt, window_end_at: s.windowEndAt,
      });
    }
  }
  if (stopRows.length === 0) return;
  const stopIds = new Map(
    (await insertReturning<{ id: number; route_id: number; position: number }>(db, 'stops', stopRows, ['id', 'route_id', 'position']))
      .map((row) => [`${row.route_id}|${row.position}`, row.id]),
  );
  const stopJobs: Record<string, unknown>[] = [];
  for (const r of routes) {
    const routeId = routeIds.get(r.farrierId)!;
    for (const s of r.stops) {
      const stopId = stopIds.get(`${routeId}|${s.position}`)!;
      s.jobIds.forEach((jobId, i) => stopJobs.push({ stop_id: stopId, job_id: jobId, plan_id: planId, position: i + 1 }));
    }
  }
  if (stopJobs.length) await db('stop_jobs').insert(stopJobs);
}

/** Locks jobs and returns their states, so a write can refuse jobs another plan took meanwhile. */
export async function lockJobs(db: Db, practiceId: number, ids: number[]): Promise<Map<number, string>> {
  if (ids.length === 0) return new Map();
  const rows: { id: number; state: string }[] = await db('jobs').where({ practice_id: practiceId }).whereIn('id', ids).forUpdate().select('id', 'state');
  return new Map(rows.map((r) => [r.id, r.state]));
}

/** Job ids that sit in some plan other than `planId`. */
export async function jobsInOtherPlans(db: Db, planId: number, ids: number[]): Promise<number[]> {
  if (ids.length === 0) return [];
  const rows: { job_id: number }[] = await db('stop_jobs').whereIn('job_id', ids).whereNot('plan_id', planId).distinct('job_id');
  return rows.map((r) => r.job_id);
}

export async function setJobStates(db: Db, practiceId: number, ids: number[], state: 'due' | 'planned' | 'booked'): Promise<void> {
  if (ids.length === 0) return;
  await db('jobs').where({ practice_id: practiceId }).whereIn('id', ids).update({ state, updated_at: db.fn.now(3) });
}

/** Sets or clears a job's pin. */
export async function setJobPin(db: Db, practiceId: number, jobId: number, pin: { farrierId: number | null; position: number | null }): Promise<void> {
  await db('jobs').where({ practice_id: practiceId, id: jobId }).update({ pinned_farrier_id: pin.farrierId, pinned_position: pin.position, updated_at: db.fn.now(3) });
}

/** The newest day-sheet mark of each stop (arrived, done or skipped), keyed by stop id. */
export async function stopProgress(
  db: Db,
  practiceId: number,
  stopIds: number[],
): Promise<Map<number, { state: 'arrived' | 'done' | 'skipped'; arrivedAt: Date | null; departedAt: Date | null; skipReason: string | null }>> {
  const out = new Map<number, { state: 'arrived' | 'done' | 'skipped'; arrivedAt: Date | null; departedAt: Date | null; skipReason: string | null }>();
  if (stopIds.length === 0) return out;
  const rows: { stop_id: number; state: 'arrived' | 'done' | 'skipped'; arrived_at: Date | null; departed_at: Date | null; skip_reason: string | null }[] = await db('visit_logs')
    .where({ practice_id: practiceId })
    .whereIn('stop_id', stopIds)
    .orderBy('id')
    .select('stop_id', 'state', 'arrived_at', 'departed_at', 'skip_reason');
  for (const r of rows) out.set(r.stop_id, { state: r.state, arrivedAt: r.arrived_at, departedAt: r.departed_at, skipReason: r.skip_reason });
  return out;
}
