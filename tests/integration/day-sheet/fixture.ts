/**
 * Test data of our own: a published day for the demo practice on a date nobody else uses, with new
 * owners (consenting, opted out, never consented), barns placed on existing demo barns' spots (so the
 * roads route to them) and horses, one stop per owner. Phone numbers use 555-01xx, set aside for fiction.
 */
import type { Knex } from 'knex';

export interface OwnerSpec {
  name: string;
  phone: string;
  consent: boolean;
  optedOut?: boolean;
  horses: { name: string; work: string[]; secondPerson?: boolean; shoeSize?: string; notes?: string }[];
}

export interface PublishedDay {
  planId: number;
  routeId: number;
  farrierId: number;
  stopIds: number[];
  ownerIds: number[];
  barnIds: number[];
  jobIds: number[][];
}

/** Builds and publishes the day: plan, route for the farrier signed in as `farrierEmail`, one stop per owner. */
export async function publishedDay(knex: Knex, opts: { date: string; farrierEmail: string; owners: OwnerSpec[]; firstArrivalUtc: string; tag: string }): Promise<PublishedDay> {
  const practiceId = 1;
  const user = await knex('users').where({ email: opts.farrierEmail }).first();
  const farrierId: number = user.farrier_id;
  const spots = await knex('barns').where({ practice_id: practiceId }).whereNull('archived_at').orderBy('id').limit(opts.owners.length + 3).select('lat', 'lon', 'address');
  const workTypes = await knex('work_types').where({ practice_id: practiceId }).select('id', 'name', 'minutes_per_horse');
  const [planId] = await knex('plans').insert({ practice_id: practiceId, plan_date: opts.date, state: 'published', version: 1, published_at: new Date(), figures: JSON.stringify({}) });
  const first = new Date(opts.firstArrivalUtc).getTime();
  const stopCount = opts.owners.length;
  const [routeId] = await knex('routes').insert({
    practice_id: practiceId, plan_id: planId, farrier_id: farrierId,
    start_at: new Date(first - 25 * 60_000), end_at: new Date(first + stopCount * 90 * 60_000 + 25 * 60_000),
    drive_seconds: stopCount * 20 * 60, distance_m: stopCount * 14_000, work_seconds: stopCount * 60 * 60, overtime_seconds: 0,
  });
  const out: PublishedDay = { planId: Number(planId), routeId: Number(routeId), farrierId, stopIds: [], ownerIds: [], barnIds: [], jobIds: [] };
  for (const [i, o] of opts.owners.entries()) {
    const [ownerId] = await knex('owners').insert({
      practice_id: practiceId, name: o.name, phone: o.phone, email: null,
      text_consent_at: o.consent ? new Date('2026-06-01T12:00:00Z') : null, opted_out_at: o.optedOut ? new Date('2026-09-01T12:00:00Z') : null,
    });
    const spot = spots[(i + 3) % spots.length]!;
    const hours = JSON.stringify(Array.from({ length: 7 }, () => [[420, 1140]]));
    const [barnId] = await knex('barns').insert({
      practice_id: practiceId, owner_id: ownerId, name: `${o.name.split(' ')[1]} ${opts.tag} Barn`, address: spot.address, lat: spot.lat, lon: spot.lon,
      access_hours: hours, setup_minutes: 10, notes: i === 0 ? 'Gate code 4417. Two collies, friendly. Park by the hay shed.' : null,
    });
    const arrival = first + i * 90 * 60_000;
    const [stopId] = await knex('stops').insert({
      practice_id: practiceId, route_id: routeId, position: i + 1, barn_id: barnId,
      arrival_at: new Date(arrival), start_at: new Date(arrival + 10 * 60_000), departure_at: new Date(arrival + 70 * 60_000),
      leg_drive_seconds: 20 * 60, leg_distance_m: 14_000,
    });
    const jobs: number[] = [];
    for (const [k, h] of o.horses.entries()) {
      const [horseId] = await knex('horses').insert({ practice_id: practiceId, owner_id: ownerId, barn_id: barnId, name: h.name, cycle_weeks: 6, shoe_size: h.shoeSize ?? null, notes: h.notes ?? null, needs_second_person: !!h.secondPerson });
      const types = h.work.map((w) => workTypes.find((t) => t.name === w)!);
      const [jobId] = await knex('jobs').insert({ practice_id: practiceId, horse_id: horseId, minutes: types.reduce((n, t) => n + t.minutes_per_horse, 0), due_on: opts.date, state: 'booked' });
      for (const t of types) await knex('job_work_types').insert({ job_id: jobId, work_type_id: t.id });
      await knex('stop_jobs').insert({ stop_id: stopId, job_id: jobId, plan_id: planId, position: k });
      jobs.push(Number(jobId));
    }
    out.stopIds.push(Number(stopId));
    out.ownerIds.push(Number(ownerId));
    out.barnIds.push(Number(barnId));
    out.jobIds.push(jobs);
  }
  return out;
}

/** The fake's texts to one number. */
export async function fakeTextsTo(phone: string): Promise<{ sid: string; to: string; body: string; status: string; direction: string }[]> {
  const response = await fetch(`${process.env.FAKES_URL}/sms`);
  const { messages } = (await response.json()) as { messages: { sid: string; to: string; body: string; status: string; direction: string }[] };
  return messages.filter((m) => m.to === phone && m.direction === 'outbound-api');
}

/** Waits until a condition holds (polling), for delivery reports that arrive asynchronously. */
export async function eventually<T>(read: () => Promise<T>, ok: (v: T) => boolean, timeoutMs = 10_000): Promise<T> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const v = await read();
    if (ok(v) || Date.now() > until) return v;
    await new Promise((r) => setTimeout(r, 100));
  }
}
