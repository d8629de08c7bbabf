/**
 * Marks from the day sheet: arrived, done, skipped. Each mark carries a key the phone made for it
 * (visit_marks.client_key is unique), so a queue replayed after a dead spot changes nothing twice. One
 * visit_logs row per stop holds the result the dispatcher's board and the review read:
 * state, arrived_at, departed_at, skip_reason, stop_id, barn_id, farrier_id, visit_date, client_key
 * (the first mark's key); done stops also get visit_log_horses rows (work and revenue per horse).
 * Jobs follow: arrived → in_progress, done → done (and the horse's last_visit_on), skipped → skipped.
 * The first stop mark of a day not yet started starts it (day_logs) at the route's planned departure.
 */
import type { Knex } from 'knex';
import { audit } from '../db/audit.ts';
import {
  clearVisitHorses, findVisitMark, insertVisitHorses, insertVisitLog, insertVisitMark, latestVisitLog, linkMarkToVisitLog, listDayProgress,
  listStopJobs, listStopMarks, listWorkPrices, lockStopForMark, setLastVisitOn, setVisitJobStates, updateVisitLog, type ProgressRow,
  type VisitOutcome,
} from '../db/visits.ts';
import { reestimate, type StopMark } from './reestimate.ts';
import { startDayImplicitly } from './day-logs.ts';

export interface MarkInput {
  clientKey: string;
  stopId: number;
  state: 'arrived' | 'done' | 'skipped';
  /** When the farrier made the mark on the phone (ISO), which may be well before it reached us. */
  at: string;
  skipReason?: string | null;
}

export interface MarkActor {
  id: number;
  practiceId: number;
  role: 'lead' | 'dispatcher' | 'farrier';
  farrierId: number | null;
}

export class MarkRefused extends Error {
  constructor(
    readonly status: 404 | 409 | 400,
    message: string,
  ) {
    super(message);
  }
}

export interface MarkResult {
  replayed: boolean;
  visitLogId: number;
  state: 'arrived' | 'done' | 'skipped';
  stopId: number;
}

const JOB_STATE = { arrived: 'in_progress', done: 'done', skipped: 'skipped' } as const;

/**
 * Records one mark. A farrier may mark only stops of their own route; a dispatcher or lead any stop
 * of the practice. The plan must be published. A later mark may move a stop forward (arrived → done)
 * or correct it (done ↔ skipped); marks are applied in the order the farrier made them, so an older
 * mark that arrives late does not undo a newer one.
 */
export async function recordMark(db: Knex, actor: MarkActor, input: MarkInput): Promise<MarkResult> {
  return db.transaction(async (trx) => {
    const existing = await findVisitMark(trx, input.clientKey);
    if (existing) {
      if (existing.practiceId !== actor.practiceId) throw new MarkRefused(409, 'This mark key is already used');
      const log = await latestVisitLog(trx, existing.stopId);
      return { replayed: true, visitLogId: log?.id ?? existing.visitLogId!, state: log?.state ?? existing.state, stopId: existing.stopId };
    }
    const stop = await lockStopForMark(trx, actor.practiceId, input.stopId);
    if (!stop || (actor.role === 'farrier' && stop.farrierId !== actor.farrierId)) throw new MarkRefused(404, 'Stop not found');
    if (stop.planState !== 'published') throw new MarkRefused(409, 'This day is not published yet');
    if (input.state === 'skipped' && !input.skipReason?.trim()) throw new MarkRefused(400, 'Give a reason for skipping');

    // A stop marked before "Start the day" starts the day at the planned departure (the sheet says so).
    await startDayImplicitly(trx, { practiceId: actor.practiceId, farrierId: stop.farrierId, date: stop.planDate, plannedStartAt: stop.routeStartAt, userId: actor.id, stopId: stop.id });

    const markId = await insertVisitMark(trx, {
      practiceId: actor.practiceId,
      clientKey: input.clientKey,
      stopId: stop.id,
      state: input.state,
      markedAt: new Date(input.at),
      skipReason: input.state === 'skipped' ? input.skipReason!.trim().slice(0, 255) : null,
      userId: actor.id,
    });
    // Replay every mark of the stop in the farrier's order: the result does not depend on arrival order.
    const outcome: VisitOutcome = { state: 'arrived', arrivedAt: null, departedAt: null, skipReason: null };
    for (const m of await listStopMarks(trx, stop.id)) {
      outcome.state = m.state;
      if (m.state === 'arrived') {
        outcome.arrivedAt ??= m.markedAt;
        outcome.departedAt = null;
        outcome.skipReason = null;
      } else if (m.state === 'done') {
        outcome.arrivedAt ??= m.markedAt;
        outcome.departedAt = m.markedAt;
        outcome.skipReason = null;
      } else {
        outcome.departedAt = m.markedAt;
        outcome.skipReason = m.skipReason;
      }
    }
    const { state } = outcome;
    const log = await latestVisitLog(trx, stop.id);
    let visitLogId: number;
    if (log) {
      visitLogId = log.id;
      await updateVisitLog(trx, log.id, outcome);
    } else {
      visitLogId = await insertVisitLog(trx, {
        practiceId: actor.practiceId, farrierId: stop.farrierId, barnId: stop.barnId, stopId: stop.id, date: stop.planDate, clientKey: input.clientKey, ...outcome,
      });
    }
    await linkMarkToVisitLog(trx, markId, visitLogId);

    const jobs = await listStopJobs(trx, stop.id);
    const jobIds = jobs.map((j) => j.id);
    await setVisitJobStates(trx, jobIds, JOB_STATE[state]);
    await clearVisitHorses(trx, visitLogId);
    if (state === 'done' && jobs.length) {
      const work = await listWorkPrices(trx, jobIds);
      await insertVisitHorses(
        trx,
        jobs.map((j) => {
          const mine = work.filter((w) => w.jobId === j.id);
          return {
            visitLogId,
            horseId: j.horseId,
            jobId: j.id,
            work: mine.map((w) => w.name).join(', ').slice(0, 255) || 'Visit',
            revenueCents: mine.reduce((sum, w) => sum + w.priceCents, 0),
          };
        }),
      );
      await setLastVisitOn(trx, jobs.map((j) => j.horseId), stop.planDate);
    }
    await audit(trx, { practiceId: actor.practiceId, userId: actor.id, action: `visit.${input.state}`, entity: 'stop', entityId: stop.id, detail: { clientKey: input.clientKey, at: input.at } });
    return { replayed: false, visitLogId, state, stopId: stop.id };
  });
}

export interface RouteProgress {
  farrierId: number;
  farrierName: string;
  stops: {
    stopId: number;
    position: number;
    barnName: string;
    plannedArrivalAt: string;
    expectedArrivalAt: string;
    expectedDepartureAt: string;
    delaySec: number;
    basis: 'actual' | 'estimate' | 'plan';
    state: 'arrived' | 'done' | 'skipped' | null;
    arrivedAt: string | null;
    departedAt: string | null;
    skipReason: string | null;
  }[];
}

/**
 * Progress of every route of a day (or one farrier's): planned times, the marks, and re-estimated
 * times for the stops still ahead. What GET /api/visits answers and the day sheet shows.
 */
export async function dayProgress(db: Knex, practiceId: number, date: string, farrierId?: number): Promise<RouteProgress[]> {
  const rows = await listDayProgress(db, practiceId, date, farrierId);
  const byFarrier = new Map<number, ProgressRow[]>();
  for (const r of rows) {
    const list = byFarrier.get(r.farrierId) ?? [];
    if (!list.some((x) => x.stopId === r.stopId)) list.push(r);
    byFarrier.set(r.farrierId, list);
  }
  const iso = (d: Date | null) => (d ? d.toISOString() : null);
  return [...byFarrier.entries()].map(([fid, list]) => {
    const marks = new Map<number, StopMark>();
    for (const r of list) if (r.state) marks.set(r.stopId, { state: r.state, arrivedMs: r.arrivedAt?.getTime() ?? null, departedMs: r.departedAt?.getTime() ?? null });
    const est = reestimate(
      list.map((r) => ({ id: r.stopId, arrivalMs: r.arrivalAt.getTime(), startMs: r.startAt.getTime(), departureMs: r.departureAt.getTime() })),
      marks,
    );
    return {
      farrierId: fid,
      farrierName: list[0]!.farrierName,
      stops: list.map((r, i) => ({
        stopId: r.stopId,
        position: r.position,
        barnName: r.barnName,
        plannedArrivalAt: iso(r.arrivalAt)!,
        expectedArrivalAt: new Date(est[i]!.arrivalMs).toISOString(),
        expectedDepartureAt: new Date(est[i]!.departureMs).toISOString(),
        delaySec: est[i]!.delaySec,
        basis: est[i]!.basis,
        state: r.state,
        arrivedAt: iso(r.arrivedAt),
        departedAt: iso(r.departedAt),
        skipReason: r.skipReason,
      })),
    };
  });
}
