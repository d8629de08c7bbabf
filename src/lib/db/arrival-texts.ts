import type { Db } from './connection.ts';

/**
 * What arrival texts for a published plan are built from: each stop with its barn and farrier, and
 * the owners of the horses at each stop with their phone and text consent. The stop's window is
 * written back so the day sheet and the board show the window the owner was told.
 */

export interface TextStop {
  stopId: number;
  position: number;
  barnId: number;
  barnName: string;
  arrivalAt: Date;
  farrierName: string;
}

/** The plan's stops in route order (farrier, then position). */
export async function listTextStops(db: Db, practiceId: number, planId: number): Promise<TextStop[]> {
  const rows: { stop_id: number; position: number; barn_id: number; barn_name: string; arrival_at: Date; farrier_name: string }[] = await db('stops as s')
    .join('routes as r', 'r.id', 's.route_id')
    .join('farriers as f', 'f.id', 'r.farrier_id')
    .join('barns as b', 'b.id', 's.barn_id')
    .where('r.plan_id', planId)
    .andWhere('s.practice_id', practiceId)
    .select('s.id as stop_id', 's.position', 's.barn_id', 'b.name as barn_name', 's.arrival_at', 'f.name as farrier_name')
    .orderBy([{ column: 'r.farrier_id' }, { column: 's.position' }]);
  return rows.map((r) => ({
    stopId: r.stop_id,
    position: r.position,
    barnId: r.barn_id,
    barnName: r.barn_name,
    arrivalAt: new Date(r.arrival_at),
    farrierName: r.farrier_name,
  }));
}

/** A horse at a stop (cancelled jobs left out) and its owner, with what decides whether the owner gets a text. */
export interface StopHorse {
  stopId: number;
  horseName: string;
  ownerId: number;
  ownerPhone: string | null;
  textConsentAt: Date | null;
  optedOutAt: Date | null;
}

/** The horses at these stops, each stop's in its job order; none for no stops. */
export async function listStopHorses(db: Db, stopIds: number[]): Promise<StopHorse[]> {
  if (stopIds.length === 0) return [];
  const rows: { stop_id: number; horse_name: string; owner_id: number; owner_phone: string | null; text_consent_at: Date | null; opted_out_at: Date | null }[] =
    await db('stop_jobs as sj')
      .join('jobs as j', 'j.id', 'sj.job_id')
      .join('horses as h', 'h.id', 'j.horse_id')
      .join('owners as o', 'o.id', 'h.owner_id')
      .whereIn('sj.stop_id', stopIds)
      .whereNot('j.state', 'cancelled')
      .select('sj.stop_id', 'h.name as horse_name', 'o.id as owner_id', 'o.phone as owner_phone', 'o.text_consent_at', 'o.opted_out_at')
      .orderBy([{ column: 'sj.stop_id' }, { column: 'sj.position' }]);
  return rows.map((r) => ({
    stopId: r.stop_id,
    horseName: r.horse_name,
    ownerId: r.owner_id,
    ownerPhone: r.owner_phone,
    textConsentAt: r.text_consent_at,
    optedOutAt: r.opted_out_at,
  }));
}

export async function setStopWindow(db: Db, stopId: number, window: { startAt: Date; endAt: Date }): Promise<void> {
  await db('stops').where({ id: stopId }).update({ window_start_at: window.startAt, window_end_at: window.endAt });
}
