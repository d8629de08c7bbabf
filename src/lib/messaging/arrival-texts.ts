/**
 * Arrival-window texts to owners, queued when a plan is published and sent by sendDueMessages. This is
 * the single place that writes them: publish calls queueArrivalTexts inside its transaction, and
 * sendDueMessages after it (and a ticker every half minute, for texts held back by quiet hours).
 *
 * Idempotency key of a text: `arrival:{practiceId}:{planDate}:b{barnId}:o{ownerId}:{startMin}-{endMin}`
 * (window ends in minutes since the epoch, UTC). The prefix names one owner's visit at one barn on one
 * day whatever the stop's row id (re-publishing may write new stop rows), and the suffix is the window:
 * publishing the same window again inserts nothing, a new window is a new key.
 */
import type { Knex } from 'knex';
import { randomUUID } from 'node:crypto';
import { arrivalWindow, movedBeyond, type ArrivalWindow } from './arrival-window.ts';
import { clockText, dayText } from './local-time.ts';
import { earliestSendAt } from './quiet-hours.ts';
import { countSegments } from './segments.ts';
import { smsConfig } from './sms-config.ts';
import { sendSms } from './sms-provider.ts';
import { listNames, renderTemplate } from './template.ts';
import { getTextSettings, quietHoursOf, windowSettingsOf } from './text-settings.ts';

type Db = Knex | Knex.Transaction;

export interface QueueResult {
  /** First texts for a visit. */
  queued: number;
  /** Update texts: the window moved beyond the practice's threshold. */
  updates: number;
  /** Visits whose window owners already have (or moved less than the threshold). */
  unchanged: number;
  /** Owners at a stop who get no text: no phone, no consent or opted out. */
  notTexted: number;
}

/** Prefix of the keys of one owner's visit to one barn on one day. */
export function visitKeyPrefix(practiceId: number, planDate: string, barnId: number, ownerId: number): string {
  return `arrival:${practiceId}:${planDate}:b${barnId}:o${ownerId}:`;
}

/** The full idempotency key of a text for a window. */
export function arrivalKey(prefix: string, w: ArrivalWindow): string {
  return `${prefix}${Math.round(w.startAt.getTime() / 60_000)}-${Math.round(w.endAt.getTime() / 60_000)}`;
}

/** The window a key names (the inverse of arrivalKey's suffix). */
export function windowOfKey(key: string): ArrivalWindow | null {
  const m = /:(\d+)-(\d+)$/.exec(key);
  return m ? { startAt: new Date(Number(m[1]) * 60_000), endAt: new Date(Number(m[2]) * 60_000) } : null;
}

interface StopRow {
  stop_id: number;
  position: number;
  barn_id: number;
  barn_name: string;
  arrival_at: Date;
  farrier_name: string;
}

interface HorseRow {
  stop_id: number;
  horse_name: string;
  owner_id: number;
  owner_phone: string | null;
  text_consent_at: Date | null;
  opted_out_at: Date | null;
}

/**
 * Computes every stop's arrival window for a published plan, writes it to stops.window_start_at /
 * window_end_at (the day sheet and the board show the same window the owner was told), and queues one
 * text per owner per stop for owners with a phone, text consent and no opt-out. Re-running it for the
 * same plan queues nothing new unless a window moved: beyond the practice's update threshold an update
 * text is queued, within it nothing. A first text still waiting (quiet hours) is replaced rather than
 * followed by an update. Call it inside the publish transaction; it does not send.
 */
export async function queueArrivalTexts(
  trx: Db,
  { practiceId, planId, userId }: { practiceId: number; planId: number; userId: number | null },
  now: Date = new Date(),
): Promise<QueueResult> {
  const plan = await trx('plans').where({ id: planId, practice_id: practiceId }).first<{ plan_date: string; state: string } | undefined>();
  if (!plan) throw new Error(`plan ${planId} not found in practice ${practiceId}`);
  const practice = await trx('practices').where({ id: practiceId }).first<{ name: string; time_zone: string }>();
  const settings = await getTextSettings(trx, practiceId);
  const tz = practice.time_zone;
  const sendAfter = earliestSendAt(now, tz, quietHoursOf(settings));
  const from = smsConfig()?.from ?? null;

  const stops: StopRow[] = await trx('stops as s')
    .join('routes as r', 'r.id', 's.route_id')
    .join('farriers as f', 'f.id', 'r.farrier_id')
    .join('barns as b', 'b.id', 's.barn_id')
    .where('r.plan_id', planId)
    .andWhere('s.practice_id', practiceId)
    .select('s.id as stop_id', 's.position', 's.barn_id', 'b.name as barn_name', 's.arrival_at', 'f.name as farrier_name')
    .orderBy([{ column: 'r.farrier_id' }, { column: 's.position' }]);
  const horses: HorseRow[] = stops.length
    ? await trx('stop_jobs as sj')
        .join('jobs as j', 'j.id', 'sj.job_id')
        .join('horses as h', 'h.id', 'j.horse_id')
        .join('owners as o', 'o.id', 'h.owner_id')
        .whereIn('sj.stop_id', stops.map((s) => s.stop_id))
        .whereNot('j.state', 'cancelled')
        .select('sj.stop_id', 'h.name as horse_name', 'o.id as owner_id', 'o.phone as owner_phone', 'o.text_consent_at', 'o.opted_out_at')
        .orderBy([{ column: 'sj.stop_id' }, { column: 'sj.position' }])
    : [];

  const result: QueueResult = { queued: 0, updates: 0, unchanged: 0, notTexted: 0 };
  for (const stop of stops) {
    const window = arrivalWindow(new Date(stop.arrival_at), stop.position, windowSettingsOf(settings));
    await trx('stops').where({ id: stop.stop_id }).update({ window_start_at: window.startAt, window_end_at: window.endAt });

    const byOwner = new Map<number, HorseRow[]>();
    for (const h of horses.filter((x) => x.stop_id === stop.stop_id)) {
      const list = byOwner.get(h.owner_id) ?? [];
      list.push(h);
      byOwner.set(h.owner_id, list);
    }
    for (const [ownerId, owned] of byOwner) {
      const owner = owned[0]!;
      if (!owner.owner_phone || !owner.text_consent_at || owner.opted_out_at) {
        result.notTexted += 1;
        continue;
      }
      const prefix = visitKeyPrefix(practiceId, plan.plan_date, stop.barn_id, ownerId);
      const key = arrivalKey(prefix, window);
      const earlier: { id: number; idempotency_key: string; state: string }[] = await trx('messages')
        .where('idempotency_key', 'like', `${prefix}%`)
        .select('id', 'idempotency_key', 'state')
        .orderBy('id', 'desc');
      // A text with this very key exists in any state (even failed or suppressed): never a second one.
      const told = earlier.find((m) => m.state === 'sent' || m.state === 'delivered');
      const pending = earlier.filter((m) => m.state === 'queued' && m.idempotency_key !== key);
      if (earlier.some((m) => m.idempotency_key === key)) {
        // Back to a window already given: anything still waiting for another window is dropped.
        if (pending.length) await trx('messages').whereIn('id', pending.map((m) => m.id)).update({ state: 'suppressed', error: 'Replaced by a newer window before sending', updated_at: trx.fn.now(3) });
        result.unchanged += 1;
        continue;
      }
      const toldWindow = told ? windowOfKey(told.idempotency_key) : null;
      const isUpdate = !!toldWindow;
      if (toldWindow && !movedBeyond(toldWindow, window, settings.updateThresholdMinutes)) {
        // The owner already holds a window close enough: nothing to say, and nothing still waiting.
        if (pending.length) await trx('messages').whereIn('id', pending.map((m) => m.id)).update({ state: 'suppressed', error: 'Owner already has a close enough window', updated_at: trx.fn.now(3) });
        result.unchanged += 1;
        continue;
      }
      if (pending.length) {
        await trx('messages').whereIn('id', pending.map((m) => m.id)).update({ state: 'suppressed', error: 'Replaced by a newer window before sending', updated_at: trx.fn.now(3) });
      }
      const values = {
        practice: practice.name,
        farrier: stop.farrier_name.split(' ')[0]!,
        barn: stop.barn_name,
        date: dayText(plan.plan_date, tz),
        start: clockText(window.startAt, tz),
        end: clockText(window.endAt, tz),
        horses: listNames(owned.map((h) => h.horse_name)),
        previous: toldWindow ? `${clockText(toldWindow.startAt, tz)}-${clockText(toldWindow.endAt, tz)}` : '',
      };
      const body = renderTemplate(isUpdate ? settings.updateTemplate : settings.arrivalTemplate, values);
      const count = countSegments(body);
      await trx('messages')
        .insert({
          practice_id: practiceId,
          channel: 'sms',
          direction: 'out',
          to_address: owner.owner_phone,
          from_address: from,
          body,
          segments: count.segments,
          encoding: count.encoding,
          state: 'queued',
          owner_id: ownerId,
          plan_id: planId,
          stop_id: stop.stop_id,
          idempotency_key: key,
          send_after: sendAfter,
        })
        .onConflict('idempotency_key')
        .ignore();
      if (isUpdate) result.updates += 1;
      else result.queued += 1;
    }
  }
  if (result.queued + result.updates > 0) {
    await trx('audit_log').insert({
      practice_id: practiceId,
      user_id: userId,
      action: 'texts.queue',
      entity: 'plan',
      entity_id: planId,
      detail: JSON.stringify(result),
    });
  }
  return result;
}

export interface SendResult {
  sent: number;
  /** Held back by quiet hours until their send_after. */
  deferred: number;
  /** Not sent: the owner opted out meanwhile, or the window has passed. */
  suppressed: number;
  failed: number;
}

interface DueRow {
  id: number;
  practice_id: number;
  to_address: string;
  body: string;
  owner_id: number | null;
  stop_id: number | null;
  time_zone: string;
  opted_out_at: Date | null;
  window_end_at: Date | null;
}

/**
 * Sends the queued outbound texts that are due at `now`: outside quiet hours on the practice's clock
 * (a text due inside them gets send_after = the end of the span, 08:00 by default), not to an owner who
 * opted out since it was queued, and not after the window it announces has ended. Each row is claimed
 * with a conditional update first, so two senders running at once never send the same text twice.
 * `planId` limits the run to one plan's texts (right after its publish).
 */
export async function sendDueMessages(db: Knex, now: Date = new Date(), options: { limit?: number; planId?: number } = {}): Promise<SendResult> {
  const limit = options.limit ?? 200;
  const result: SendResult = { sent: 0, deferred: 0, suppressed: 0, failed: 0 };
  const rows: DueRow[] = await db('messages as m')
    .join('practices as p', 'p.id', 'm.practice_id')
    .leftJoin('owners as o', 'o.id', 'm.owner_id')
    .leftJoin('stops as s', 's.id', 'm.stop_id')
    .where({ 'm.channel': 'sms', 'm.direction': 'out', 'm.state': 'queued' })
    .whereNull('m.provider_id')
    .andWhere((q) => q.whereNull('m.send_after').orWhere('m.send_after', '<=', now))
    .modify((q) => {
      if (options.planId) q.andWhere('m.plan_id', options.planId);
    })
    .select('m.id', 'm.practice_id', 'm.to_address', 'm.body', 'm.owner_id', 'm.stop_id', 'p.time_zone', 'o.opted_out_at', 's.window_end_at')
    .orderBy('m.id')
    .limit(limit);
  const settingsByPractice = new Map<number, Awaited<ReturnType<typeof getTextSettings>>>();
  for (const row of rows) {
    const claim = `claim:${randomUUID()}`;
    const claimed = await db('messages').where({ id: row.id, state: 'queued' }).whereNull('provider_id').update({ provider_id: claim });
    if (claimed !== 1) continue;
    const mine = () => db('messages').where({ id: row.id, provider_id: claim });
    if (row.opted_out_at) {
      await mine().update({ state: 'suppressed', provider_id: null, error: 'Owner opted out', updated_at: db.fn.now(3) });
      result.suppressed += 1;
      continue;
    }
    if (row.window_end_at && new Date(row.window_end_at).getTime() <= now.getTime()) {
      await mine().update({ state: 'suppressed', provider_id: null, error: 'The window had passed before the text could go', updated_at: db.fn.now(3) });
      result.suppressed += 1;
      continue;
    }
    let settings = settingsByPractice.get(row.practice_id);
    if (!settings) {
      settings = await getTextSettings(db, row.practice_id);
      settingsByPractice.set(row.practice_id, settings);
    }
    const allowedAt = earliestSendAt(now, row.time_zone, quietHoursOf(settings));
    if (allowedAt.getTime() > now.getTime()) {
      await mine().update({ provider_id: null, send_after: allowedAt, updated_at: db.fn.now(3) });
      result.deferred += 1;
      continue;
    }
    try {
      const sent = await sendSms(row.to_address, row.body);
      await mine().update({ state: 'sent', provider_id: sent.sid.slice(0, 64), from_address: sent.from, sent_at: now, error: null, updated_at: db.fn.now(3) });
      result.sent += 1;
    } catch (e) {
      await mine().update({ state: 'failed', provider_id: null, error: (e instanceof Error ? e.message : 'send failed').slice(0, 250), updated_at: db.fn.now(3) });
      result.failed += 1;
    }
  }
  return result;
}
