import type { Knex } from 'knex';
import { checkSolution, createProblem, evaluateRoutes, solveInWorker, type CheckedRoute, type Problem } from '../solver/index.ts';
import type { Practice } from '../db/practices.ts';
import { audit } from '../db/audit.ts';
import {
  bumpPlan, deletePlan, getPlan, getPlanByDate, insertPlan, jobsInOtherPlans, listDayBarns, listDayFarriers, listDayJobs, loadRoutes,
  lockJobs, replaceRoutes, setJobPin, setJobStates, type DayBarn, type DayFarrier, type DayJob, type PlanFigures, type PlanRow, type RouteWrite,
} from '../db/plans.ts';
import { badRequest, conflict, HttpError, notFound } from '../server/http.ts';
import type { Move, PlanWarning } from '../../schemas/plans.ts';
import { applyMoves, type EditRoutes } from './edits.ts';
import { dayMatrix } from './matrix-cache.ts';
import { barnClosedOn, buildDayProblem, dayPlaces, farrierKey, idOf, jobKey } from './problem.ts';
import { finishRun, startRun, updateRun } from './progress.ts';
import { queueOwnerMessages } from './publish.ts';
import { windowSettings, type WindowSettings } from './arrival-window.ts';
import { routeWrite, warningsFor } from './retime.ts';
import { addDays, isoWeekday } from './time.ts';
import { warmDispatch } from './warm.ts';

warmDispatch();

/**
 * Dispatch's server side: plan a day with the engine in a worker thread, re-time hand edits, re-plan
 * around pins, publish. Every change is one transaction that locks the plan row, checks the version
 * the dispatcher edited, raises it by one and writes one audit row.
 */

export interface Actor {
  id: number;
  practiceId: number;
}

/** Everything needed to build and re-time one day's problem. */
interface Day {
  date: string;
  farriers: DayFarrier[];
  jobs: DayJob[];
  barns: DayBarn[];
  problem: Problem;
  homeIndex: Map<number, number>;
}

/**
 * Where the time of one planning request goes, in milliseconds: database reads, the drive matrix, the
 * engine's problem, the worker round trip (engine time inside it), the checker and row building, and
 * the one write transaction. The plans endpoint sends these as Server-Timing so a bench can see them.
 */
export interface PlanTimings {
  readMs?: number;
  matrixMs?: number;
  problemMs?: number;
  solveMs?: number;
  engineMs?: number;
  checkMs?: number;
  writeMs?: number;
}

/** Builds the engine's problem for a set of farriers and jobs on a date (matrix from memory where it can). */
async function loadDay(
  db: Knex | Knex.Transaction, practice: Practice, date: string, farriers: DayFarrier[], jobs: DayJob[],
  lap: (phase: 'readMs' | 'matrixMs' | 'problemMs') => void = () => {},
): Promise<Day> {
  const barns = await listDayBarns(db, practice.id, [...new Set(jobs.map((j) => j.barnId))]);
  lap('readMs');
  const places = dayPlaces(farriers, barns);
  const matrix = dayMatrix(places.points);
  lap('matrixMs');
  const problem = createProblem(buildDayProblem({ date, practice, farriers, jobs, barns, places, matrix }));
  lap('problemMs');
  return { date, farriers, jobs, barns, problem, homeIndex: places.homeIndex };
}

function working(farriers: DayFarrier[], date: string): DayFarrier[] {
  const wd = isoWeekday(date);
  return farriers.filter((f) => f.workingDays.includes(wd));
}

function routeCtx(day: Day, practice: Practice, farrierId: number, windows: WindowSettings) {
  return {
    windows,
    date: day.date,
    timeZone: practice.timeZone,
    farrier: day.farriers.find((f) => f.id === farrierId)!,
    homeLocation: day.homeIndex.get(farrierId)!,
    durationSec: day.problem.durationSec as number[][],
    distanceM: day.problem.distanceM as number[][],
  };
}

function warningsByFarrier(day: Day, violations: ReturnType<typeof checkSolution>['violations'], routes: CheckedRoute[]): Record<string, PlanWarning[]> {
  const jobs = new Map(day.jobs.map((j) => [j.id, j]));
  const barns = new Map(day.barns.map((b) => [b.id, b]));
  const out: Record<string, PlanWarning[]> = {};
  for (const r of routes) {
    const farrier = day.farriers.find((f) => farrierKey(f.id) === r.farrierId)!;
    const list = warningsFor(violations, r, { date: day.date, farrier, jobs, barns });
    if (list.length) out[String(farrier.id)] = list;
  }
  return out;
}

/** Jobs of a stored plan: on its routes, and on its unplanned list. */
async function planJobIds(db: Knex | Knex.Transaction, plan: PlanRow): Promise<{ routed: number[]; unplanned: number[] }> {
  const routes = await loadRoutes(db, plan.practiceId, plan.id);
  return { routed: routes.flatMap((r) => r.stops.flatMap((s) => s.jobIds)), unplanned: (plan.figures?.unplanned ?? []).map((u) => u.jobId) };
}

/**
 * Plans a day (or re-plans a stored one around its pins): reads the day from MariaDB, runs the engine
 * in a worker with the time budget, checks the answer with the independent checker, and stores it.
 * Returns the plan id. A run already going for the same date is a 409.
 */
export async function planDay(
  knex: Knex,
  practice: Practice,
  actor: Actor,
  input: { date: string; budgetSeconds: number; replan?: { planId: number; version: number }; timings?: PlanTimings },
): Promise<number> {
  const { date, budgetSeconds } = input;
  const timings = input.timings ?? {};
  let mark = performance.now();
  const lap = (phase: keyof PlanTimings) => {
    const now = performance.now();
    timings[phase] = (timings[phase] ?? 0) + (now - mark);
    mark = now;
  };
  if (!input.replan && (await getPlanByDate(knex, practice.id, date))) {
    throw conflict(`A plan for ${date} exists already: open it, or re-plan it`);
  }
  let existing: PlanRow | null = null;
  if (input.replan) {
    existing = await getPlan(knex, practice.id, input.replan.planId);
    if (!existing) throw notFound('Plan');
    if (existing.version !== input.replan.version) throw conflict(`The plan changed meanwhile (now version ${existing.version}); reload it`, 'stale_version');
  }
  if (!startRun(practice.id, date, budgetSeconds)) throw conflict(`The day ${date} is being planned already`);
  try {
    const farriers = working(await listDayFarriers(knex, practice.id), date);
    const own = existing ? await planJobIds(knex, existing) : { routed: [], unplanned: [] };
    const candidates = await listDayJobs(knex, practice.id, { date, dueBy: addDays(date, practice.planningHorizonDays) });
    const extra = await listDayJobs(knex, practice.id, { ids: [...own.routed, ...own.unplanned].filter((id) => !candidates.some((c) => c.id === id)) });
    const allJobs = [...candidates, ...extra.filter((j) => ['due', 'planned', 'booked'].includes(j.state))];
    const barnsAll = await listDayBarns(knex, practice.id, [...new Set(allJobs.map((j) => j.barnId))]);
    const weekday = isoWeekday(date);
    const closed = new Set(barnsAll.filter((b) => barnClosedOn(b, weekday)).map((b) => b.id));
    const jobs = allJobs.filter((j) => !closed.has(j.barnId));
    lap('readMs');
    const day = await loadDay(knex, practice, date, farriers, jobs, lap);
    updateRun(practice.id, date, { phase: 'construct' });
    const result = await solveInWorker(day.problem, { seed: 1, stop: { maxSeconds: budgetSeconds } }, {
      onProgress: (p) => updateRun(practice.id, date, { iterations: p.iterations, unplanned: p.unplanned, farriersUsed: p.farriersUsed, phase: p.phase }),
    });
    lap('solveMs');
    timings.engineMs = result.statistics.seconds * 1000;
    updateRun(practice.id, date, { phase: 'saving' });
    // The stored times are the checker's own re-timing of the engine's order, so what is saved is what is checked.
    const check = checkSolution(day.problem, { routes: result.routes.map((r) => ({ farrierId: r.farrierId, jobIds: r.stops.flatMap((s) => s.jobIds) })) });
    const windows = await windowSettings(knex, practice.id);
    const writes: RouteWrite[] = check.routes.map((r) => routeWrite(r, routeCtx(day, practice, idOf(r.farrierId), windows)));
    const unplanned = [
      ...result.unplanned.map((u) => ({ jobId: idOf(u.jobId), reason: u.reason as string })),
      ...allJobs.filter((j) => closed.has(j.barnId)).map((j) => ({ jobId: j.id, reason: 'barn_closed_today' })),
    ];
    const figures: PlanFigures = {
      unplanned,
      warnings: warningsByFarrier(day, check.violations, check.routes),
      solveSeconds: Math.round(result.statistics.seconds * 100) / 100,
      iterations: result.statistics.iterations,
      budgetSeconds,
      seed: result.statistics.seed,
    };
    const planned = writes.flatMap((w) => w.stops.flatMap((s) => s.jobIds));
    lap('checkMs');
    const planId = await knex.transaction(async (trx) => {
      let planId: number;
      let state: 'draft' | 'published' = 'draft';
      if (existing) {
        const locked = await getPlan(trx, practice.id, existing.id, { forUpdate: true });
        if (!locked) throw notFound('Plan');
        if (locked.version !== existing.version) throw conflict(`The plan changed while it was being re-planned (now version ${locked.version}); reload it`, 'stale_version');
        state = locked.state;
        planId = locked.id;
      } else {
        planId = await insertPlan(trx, practice.id, date, actor.id, figures);
      }
      const states = await lockJobs(trx, practice.id, planned);
      const ownIds = new Set([...own.routed, ...own.unplanned]);
      const taken = planned.filter((id) => states.get(id) !== 'due' && !ownIds.has(id));
      const elsewhere = await jobsInOtherPlans(trx, planId, planned);
      if (taken.length || elsewhere.length) throw conflict('Some jobs were planned on another day meanwhile: plan again');
      const allFarriers = await loadRoutes(trx, practice.id, planId);
      await replaceRoutes(trx, practice.id, planId, [...writes, ...allFarriers.filter((r) => !writes.some((w) => w.farrierId === r.farrierId)).map((r) => emptyRoute(r.farrierId, r.startAt))]);
      const dropped = own.routed.filter((id) => !planned.includes(id));
      await setJobStates(trx, practice.id, dropped, 'due');
      await setJobStates(trx, practice.id, planned, state === 'published' ? 'booked' : 'planned');
      if (existing) await bumpPlan(trx, planId, { figures });
      if (state === 'published') await queueOwnerMessages(trx, practice.id, planId, actor.id);
      await audit(trx, {
        practiceId: practice.id, userId: actor.id, action: existing ? 'plan.replan' : 'plan.create', entity: 'plan', entityId: planId,
        detail: { date, budgetSeconds, planned: planned.length, unplanned: unplanned.length, seconds: figures.solveSeconds, iterations: figures.iterations },
      });
      return planId;
    });
    lap('writeMs');
    return planId;
  } finally {
    finishRun(practice.id, date);
  }
}

function emptyRoute(farrierId: number, at: Date): RouteWrite {
  return { farrierId, startAt: at, endAt: at, driveSeconds: 0, distanceM: 0, workSeconds: 0, overtimeSeconds: 0, breakStartAt: null, stops: [] };
}

/** Locks a plan for a change and checks the version the dispatcher edited. */
export async function lockPlan(trx: Knex.Transaction, practiceId: number, planId: number, version: number): Promise<PlanRow> {
  const plan = await getPlan(trx, practiceId, planId, { forUpdate: true });
  if (!plan) throw notFound('Plan');
  if (plan.version !== version) throw conflict(`The plan changed meanwhile (now version ${plan.version}); reload it and try again`, 'stale_version');
  return plan;
}

/**
 * Applies the dispatcher's moves and re-times the touched routes at once with the engine's checker.
 * Whatever a move breaks is stored as a warning in words; nothing is moved to repair it.
 * Returns the server time the re-timing took, in milliseconds.
 */
export async function editPlan(knex: Knex, practice: Practice, actor: Actor, planId: number, input: { version: number; moves: Move[] }): Promise<number> {
  return knex.transaction(async (trx) => {
    const t0 = performance.now();
    const plan = await lockPlan(trx, practice.id, planId, input.version);
    const stored = await loadRoutes(trx, practice.id, planId);
    const routes: EditRoutes = new Map(stored.map((r) => [r.farrierId, r.stops.map((s) => ({ barnId: s.barnId, jobIds: [...s.jobIds] }))]));
    const unplanned = [...(plan.figures?.unplanned ?? [])];
    const inPlan = new Set([...stored.flatMap((r) => r.stops.flatMap((s) => s.jobIds)), ...unplanned.map((u) => u.jobId)]);

    // Every job moved must be this plan's or an open job no other plan holds; every farrier must have a lane here.
    const moveJobs = await listDayJobs(trx, practice.id, { ids: [...new Set(input.moves.map((m) => m.jobId))] });
    const byId = new Map(moveJobs.map((j) => [j.id, j]));
    const elsewhere = new Set(await jobsInOtherPlans(trx, planId, [...byId.keys()]));
    input.moves.forEach((m, i) => {
      const job = byId.get(m.jobId);
      if (!job) throw badRequest('Unknown job', { [`moves.${i}.jobId`]: `No job ${m.jobId} in this practice` });
      if (!inPlan.has(m.jobId) && (job.state !== 'due' || elsewhere.has(m.jobId))) {
        throw badRequest('That job is not open for this day', { [`moves.${i}.jobId`]: `Job ${m.jobId} is ${job.state} in another plan` });
      }
      if (m.toFarrierId !== null && !routes.has(m.toFarrierId)) {
        throw badRequest('That farrier has no route in this plan', { [`moves.${i}.toFarrierId`]: `Farrier ${m.toFarrierId} has no route on ${plan.date}` });
      }
      if (m.pin === true && m.toFarrierId === null) throw badRequest('Cannot pin a job that is taken off the plan', { [`moves.${i}.pin`]: 'Pin needs a farrier' });
    });
    const edit = applyMoves(routes, input.moves, (jobId) => byId.get(jobId)!.barnId);

    // Re-time only the touched routes.
    const touched = [...edit.touched];
    const farriers = (await listDayFarriers(trx, practice.id, { includeArchived: true })).filter((f) => touched.includes(f.id));
    const touchedJobIds = touched.flatMap((f) => (edit.routes.get(f) ?? []).flatMap((s) => s.jobIds));
    // Pins as they will be after this edit, so the checker judges the new pins.
    // Pins follow each job's last move: pin true pins there, false or off the plan unpins, otherwise a pin travels with the job.
    const lastMove = new Map(input.moves.map((m) => [m.jobId, m]));
    const pinnedBefore = new Map(moveJobs.map((j) => [j.id, j.pinnedFarrierId]));
    for (const m of lastMove.values()) {
      const job = byId.get(m.jobId)!;
      const pinSet = input.moves.some((x) => x.jobId === m.jobId && x.pin === true) && m.pin !== false;
      if (m.toFarrierId === null || m.pin === false) { job.pinnedFarrierId = null; job.pinnedPosition = null; }
      else if (m.pin === true || pinSet) { job.pinnedFarrierId = m.toFarrierId; job.pinnedPosition = m.position ?? null; }
      else if (pinnedBefore.get(m.jobId) != null) job.pinnedFarrierId = m.toFarrierId;
    }
    const others = await listDayJobs(trx, practice.id, { ids: touchedJobIds.filter((id) => !byId.has(id)) });
    const dayJobs = [...others, ...moveJobs.filter((j) => touchedJobIds.includes(j.id))];
    const day = await loadDay(trx, practice, plan.date, farriers, dayJobs);
    const check = evaluateRoutes(day.problem, touched.map((f) => ({ farrierId: farrierKey(f), jobIds: (edit.routes.get(f) ?? []).flatMap((s) => s.jobIds.map(jobKey)) })));
    const windows = await windowSettings(trx, practice.id);
    const writes = check.routes.map((r) => routeWrite(r, routeCtx(day, practice, idOf(r.farrierId), windows)));
    const retimeMs = performance.now() - t0;

    await replaceRoutes(trx, practice.id, planId, writes);
    for (const m of lastMove.values()) {
      const job = byId.get(m.jobId)!;
      await setJobPin(trx, practice.id, m.jobId, { farrierId: job.pinnedFarrierId, position: job.pinnedPosition });
    }
    await setJobStates(trx, practice.id, [...edit.removed], 'due');
    await setJobStates(trx, practice.id, [...edit.added], plan.state === 'published' ? 'booked' : 'planned');
    const warnings = { ...(plan.figures?.warnings ?? {}) };
    for (const f of touched) delete warnings[String(f)];
    Object.assign(warnings, warningsByFarrier(day, check.violations, check.routes));
    const nextUnplanned = [
      ...unplanned.filter((u) => !edit.added.has(u.jobId) && !edit.removed.has(u.jobId)),
      ...[...edit.removed].map((jobId) => ({ jobId, reason: 'taken_off' })),
    ];
    await bumpPlan(trx, planId, { figures: { ...(plan.figures ?? {}), unplanned: nextUnplanned, warnings } });
    if (plan.state === 'published') await queueOwnerMessages(trx, practice.id, planId, actor.id);
    await audit(trx, { practiceId: practice.id, userId: actor.id, action: 'plan.edit', entity: 'plan', entityId: planId, detail: { fromVersion: input.version, moves: input.moves } });
    return retimeMs;
  });
}

/** Publishes a plan: state published, its jobs booked, owners' arrival-window messages queued. */
export async function publishPlan(knex: Knex, practice: Practice, actor: Actor, planId: number, version: number): Promise<void> {
  await knex.transaction(async (trx) => {
    const plan = await lockPlan(trx, practice.id, planId, version);
    const stored = await loadRoutes(trx, practice.id, planId);
    const jobIds = stored.flatMap((r) => r.stops.flatMap((s) => s.jobIds));
    if (jobIds.length === 0) throw badRequest('The plan has no stops to publish', { version: 'Plan the day first' });
    await setJobStates(trx, practice.id, jobIds, 'booked');
    await bumpPlan(trx, planId, { figures: plan.figures ?? {}, state: 'published', publishedAt: plan.publishedAt ?? new Date() });
    const queued = await queueOwnerMessages(trx, practice.id, planId, actor.id);
    await audit(trx, { practiceId: practice.id, userId: actor.id, action: 'plan.publish', entity: 'plan', entityId: planId, detail: { fromVersion: version, jobs: jobIds.length, messages: queued } });
  });
}

/** Discards a draft: its jobs go back to due. A published plan is kept (409). */
export async function discardDraft(knex: Knex, practice: Practice, actor: Actor, planId: number): Promise<void> {
  await knex.transaction(async (trx) => {
    const plan = await getPlan(trx, practice.id, planId, { forUpdate: true });
    if (!plan) throw notFound('Plan');
    if (plan.state !== 'draft') throw new HttpError(409, 'conflict', 'A published plan cannot be discarded; edit it instead');
    const { routed } = await planJobIds(trx, plan);
    await setJobStates(trx, practice.id, routed, 'due');
    await deletePlan(trx, planId);
    await audit(trx, { practiceId: practice.id, userId: actor.id, action: 'plan.discard', entity: 'plan', entityId: planId, detail: { date: plan.date, version: plan.version } });
  });
}
