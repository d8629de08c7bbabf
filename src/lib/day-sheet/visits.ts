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
    const existing = await trx('visit_marks').where({ client_key: input.clientKey }).first();
    if (existing) {
      if (existing.practice_id !== actor.practiceId) throw new MarkRefused(409, 'This mark key is already used');
      const log = await trx('visit_logs').where({ stop_id: existing.stop_id }).orderBy('id', 'desc').first();
      return { replayed: true, visitLogId: log?.id ?? existing.visit_log_id, state: log?.state ?? existing.state, stopId: existing.stop_id };
    }
    const stop = await trx('stops as s')
      .join('routes as r', 'r.id', 's.route_id')
      .join('plans as p', 'p.id', 'r.plan_id')
      .where({ 's.id': input.stopId, 's.practice_id': actor.practiceId })
      .select('s.id', 's.barn_id', 's.leg_distance_m', 'r.farrier_id', 'r.start_at as route_start_at', 'p.plan_date', 'p.state as plan_state')
      .forUpdate()
      .first();
    if (!stop || (actor.role === 'farrier' && stop.farrier_id !== actor.farrierId)) throw new MarkRefused(404, 'Stop not found');
    if (stop.plan_state !== 'published') throw new MarkRefused(409, 'This day is not published yet');
    if (input.state === 'skipped' && !input.skipReason?.trim()) throw new MarkRefused(400, 'Give a reason for skipping');

    // A stop marked before "Start the day" starts the day at the planned departure (the sheet says so).
    await startDayImplicitly(trx, { practiceId: actor.practiceId, farrierId: stop.farrier_id, date: stop.plan_date, plannedStartAt: new Date(stop.route_start_at), userId: actor.id, stopId: stop.id });

    const at = new Date(input.at);
    const [markId] = await trx('visit_marks').insert({
      practice_id: actor.practiceId,
      client_key: input.clientKey,
      stop_id: stop.id,
      state: input.state,
      marked_at: at,
      skip_reason: input.state === 'skipped' ? input.skipReason!.trim().slice(0, 255) : null,
      user_id: actor.id,
    });
    // Replay every mark of the stop in the farrier's order: the result does not depend on arrival order.
    const marks = await trx('visit_marks').where({ stop_id: stop.id }).orderBy([{ column: 'marked_at' }, { column: 'id' }]);
    let state: MarkResult['state'] = 'arrived';
    let arrivedAt: Date | null = null;
    let departedAt: Date | null = null;
    let skipReason: string | null = null;
    for (const m of marks) {
      state = m.state;
      if (m.state === 'arrived') {
        arrivedAt ??= m.marked_at;
        departedAt = null;
        skipReason = null;
      } else if (m.state === 'done') {
        arrivedAt ??= m.marked_at;
        departedAt = m.marked_at;
        skipReason = null;
      } else {
        departedAt = m.marked_at;
        skipReason = m.skip_reason;
      }
    }
    const row = {
      state,
      arrived_at: arrivedAt,
      departed_at: departedAt,
      skip_reason: skipReason,
    };
    let log = await trx('visit_logs').where({ stop_id: stop.id }).orderBy('id', 'desc').first();
    let visitLogId: number;
    if (log) {
      visitLogId = log.id;
      await trx('visit_logs').where({ id: log.id }).update(row);
    } else {
      const [id] = await trx('visit_logs').insert({
        practice_id: actor.practiceId,
        farrier_id: stop.farrier_id,
        barn_id: stop.barn_id,
        stop_id: stop.id,
        visit_date: stop.plan_date,
        client_key: input.clientKey,
        ...row,
      });
      visitLogId = Number(id);
      log = { id: visitLogId };
    }
    await trx('visit_marks').where({ id: markId }).update({ visit_log_id: visitLogId });

    const jobs = await trx('stop_jobs as sj')
      .join('jobs as j', 'j.id', 'sj.job_id')
      .where('sj.stop_id', stop.id)
      .whereNot('j.state', 'cancelled')
      .select('j.id', 'j.horse_id');
    const jobIds = jobs.map((j) => j.id as number);
    if (jobIds.length) await trx('jobs').whereIn('id', jobIds).update({ state: JOB_STATE[state], updated_at: trx.fn.now(3) });
    await trx('visit_log_horses').where({ visit_log_id: visitLogId }).delete();
    if (state === 'done' && jobs.length) {
      const work = await trx('job_work_types as jw').join('work_types as w', 'w.id', 'jw.work_type_id').whereIn('jw.job_id', jobIds).select('jw.job_id', 'w.name', 'w.price_cents');
      await trx('visit_log_horses').insert(
        jobs.map((j) => {
          const mine = work.filter((w) => w.job_id === j.id);
          return {
            visit_log_id: visitLogId,
            horse_id: j.horse_id,
            job_id: j.id,
            work: mine.map((w) => w.name).join(', ').slice(0, 255) || 'Visit',
            revenue_cents: mine.reduce((sum, w) => sum + Number(w.price_cents), 0),
          };
        }),
      );
      await trx('horses').whereIn('id', jobs.map((j) => j.horse_id)).update({ last_visit_on: stop.plan_date, updated_at: trx.fn.now(3) });
    }
    await trx('audit_log').insert({
      practice_id: actor.practiceId,
      user_id: actor.id,
      action: `visit.${input.state}`,
      entity: 'stop',
      entity_id: stop.id,
      detail: JSON.stringify({ clientKey: input.clientKey, at: input.at }),
    });
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
  const q = db('stops as s')
    .join('routes as r', 'r.id', 's.route_id')
    .join('plans as p', 'p.id', 'r.plan_id')
    .join('farriers as f', 'f.id', 'r.farrier_id')
    .join('barns as b', 'b.id', 's.barn_id')
    .leftJoin('visit_logs as v', 'v.stop_id', 's.id')
    .where({ 'p.practice_id': practiceId, 'p.plan_date': date, 'p.state': 'published' })
    .select('s.id', 's.position', 's.arrival_at', 's.start_at', 's.departure_at', 'b.name as barn_name', 'r.farrier_id', 'f.name as farrier_name', 'v.state', 'v.arrived_at', 'v.departed_at', 'v.skip_reason')
    .orderBy([{ column: 'f.name' }, { column: 's.position' }]);
  if (farrierId) q.andWhere('r.farrier_id', farrierId);
  const rows = await q;
  const byFarrier = new Map<number, typeof rows>();
  for (const r of rows) {
    const list = byFarrier.get(r.farrier_id) ?? [];
    if (!list.some((x) => x.id === r.id)) list.push(r);
    byFarrier.set(r.farrier_id, list);
  }
  const iso = (d: Date | null) => (d ? new Date(d).toISOString() : null);
  return [...byFarrier.entries()].map(([fid, list]) => {
    const marks = new Map<number, StopMark>();
    for (const r of list) if (r.state) marks.set(r.id, { state: r.state, arrivedMs: r.arrived_at ? new Date(r.arrived_at).getTime() : null, departedMs: r.departed_at ? new Date(r.departed_at).getTime() : null });
    const est = reestimate(
      list.map((r) => ({ id: r.id, arrivalMs: new Date(r.arrival_at).getTime(), startMs: new Date(r.start_at).getTime(), departureMs: new Date(r.departure_at).getTime() })),
      marks,
    );
    return {
      farrierId: fid,
      farrierName: list[0]!.farrier_name,
      stops: list.map((r, i) => ({
        stopId: r.id,
        position: r.position,
        barnName: r.barn_name,
        plannedArrivalAt: iso(r.arrival_at)!,
        expectedArrivalAt: new Date(est[i]!.arrivalMs).toISOString(),
        expectedDepartureAt: new Date(est[i]!.departureMs).toISOString(),
        delaySec: est[i]!.delaySec,
        basis: est[i]!.basis,
        state: r.state ?? null,
        arrivedAt: iso(r.arrived_at),
        departedAt: iso(r.departed_at),
        skipReason: r.skip_reason ?? null,
      })),
    };
  });
}
