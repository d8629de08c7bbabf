/**
 * Arrival-window texts to owners, queued when a plan is published and sent by sendDueMessages. This is
 * the single place that writes them: publish calls queueArrivalTexts inside its transaction, and
 * sendDueMessages after it (and a ticker every half minute, for texts held back by quiet hours).
 *
 * Idempotency key of a text: `arrival:{practiceId}:{planDate}:b{barnId}:o{ownerId}:{startMin}-{endMin}`
 * (window ends in minutes since the epoch, UTC). The prefix names one owner's visit at one barn on one
 * day whatever the stop's row id (re-publishing may write new stop rows), and the suffix is the window:
 * publishing the same window again inserts nothing, a new window is a new key. When the plan visits
 * the owner's horses at one barn more than once that day (the barn's horses split between farriers,
 * or one farrier back later), the visits are counted in order of arrival and the second and later
 * ones carry `v{n}:` after the owner, so each visit gets its own text instead of replacing another's.
 */
import type { Knex } from 'knex';
import { randomUUID } from 'node:crypto';
import { listStopHorses, listTextStops, setStopWindow, type StopHorse } from '../db/arrival-texts.ts';
import { audit } from '../db/audit.ts';
import {
  claimText,
  closeClaimedText,
  deferClaimedText,
  insertQueuedText,
  listDueTexts,
  listVisitTexts,
  markClaimedTextSent,
  suppressTexts,
} from '../db/messages.ts';
import { getPlan } from '../db/plans.ts';
import { getPractice } from '../db/practices.ts';
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

/** Prefix of the keys of one owner's visit to one barn on one day (`visit`: the day's first, second, … there). */
export function visitKeyPrefix(practiceId: number, planDate: string, barnId: number, ownerId: number, visit = 1): string {
  return `arrival:${practiceId}:${planDate}:b${barnId}:o${ownerId}:${visit > 1 ? `v${visit}:` : ''}`;
}

/** Whether a key is this very visit's (a first visit's prefix is also the start of its later visits' keys). */
function ofVisit(key: string, prefix: string): boolean {
  return /^\d+-\d+$/.test(key.slice(prefix.length));
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
  const plan = await getPlan(trx, practiceId, planId);
  if (!plan) throw new Error(`plan ${planId} not found in practice ${practiceId}`);
  // The plan belongs to the practice, so the practice row is there.
  const practice = (await getPractice(trx, practiceId))!;
  const settings = await getTextSettings(trx, practiceId);
  const tz = practice.timeZone;
  const sendAfter = earliestSendAt(now, tz, quietHoursOf(settings));
  const from = smsConfig()?.from ?? null;

  const stops = await listTextStops(trx, practiceId, planId);
  const horses = await listStopHorses(trx, stops.map((s) => s.stopId));

  const result: QueueResult = { queued: 0, updates: 0, unchanged: 0, notTexted: 0 };
  // the k-th visit of the day to an owner's horses at one barn, in order of arrival
  const visits = new Map<string, number>();
  const visitOf = new Map<string, number>();
  for (const stop of [...stops].sort((a, b) => a.arrivalAt.getTime() - b.arrivalAt.getTime() || a.stopId - b.stopId)) {
    for (const ownerId of new Set(horses.filter((h) => h.stopId === stop.stopId).map((h) => h.ownerId))) {
      const k = `${stop.barnId}:${ownerId}`;
      const n = (visits.get(k) ?? 0) + 1;
      visits.set(k, n);
      visitOf.set(`${stop.stopId}:${ownerId}`, n);
    }
  }
  for (const stop of stops) {
    const window = arrivalWindow(stop.arrivalAt, stop.position, windowSettingsOf(settings));
    await setStopWindow(trx, stop.stopId, window);

    const byOwner = new Map<number, StopHorse[]>();
    for (const h of horses.filter((x) => x.stopId === stop.stopId)) {
      const list = byOwner.get(h.ownerId) ?? [];
      list.push(h);
      byOwner.set(h.ownerId, list);
    }
    for (const [ownerId, owned] of byOwner) {
      const owner = owned[0]!;
      if (!owner.ownerPhone || !owner.textConsentAt || owner.optedOutAt) {
        result.notTexted += 1;
        continue;
      }
      const prefix = visitKeyPrefix(practiceId, plan.date, stop.barnId, ownerId, visitOf.get(`${stop.stopId}:${ownerId}`));
      const key = arrivalKey(prefix, window);
      const earlier = (await listVisitTexts(trx, prefix)).filter((m) => ofVisit(m.idempotencyKey, prefix));
      // A text with this very key exists in any state (even failed or suppressed): never a second one.
      const told = earlier.find((m) => m.state === 'sent' || m.state === 'delivered');
      const pending = earlier.filter((m) => m.state === 'queued' && m.idempotencyKey !== key);
      if (earlier.some((m) => m.idempotencyKey === key)) {
        // Back to a window already given: anything still waiting for another window is dropped.
        if (pending.length) await suppressTexts(trx, pending.map((m) => m.id), 'Replaced by a newer window before sending');
        result.unchanged += 1;
        continue;
      }
      const toldWindow = told ? windowOfKey(told.idempotencyKey) : null;
      const isUpdate = !!toldWindow;
      if (toldWindow && !movedBeyond(toldWindow, window, settings.updateThresholdMinutes)) {
        // The owner already holds a window close enough: nothing to say, and nothing still waiting.
        if (pending.length) await suppressTexts(trx, pending.map((m) => m.id), 'Owner already has a close enough window');
        result.unchanged += 1;
        continue;
      }
      if (pending.length) await suppressTexts(trx, pending.map((m) => m.id), 'Replaced by a newer window before sending');
      const values = {
        practice: practice.name,
        farrier: stop.farrierName.split(' ')[0]!,
        barn: stop.barnName,
        date: dayText(plan.date, tz),
        start: clockText(window.startAt, tz),
        end: clockText(window.endAt, tz),
        horses: listNames(owned.map((h) => h.horseName)),
        previous: toldWindow ? `${clockText(toldWindow.startAt, tz)}-${clockText(toldWindow.endAt, tz)}` : '',
      };
      const body = renderTemplate(isUpdate ? settings.updateTemplate : settings.arrivalTemplate, values);
      const count = countSegments(body);
      await insertQueuedText(trx, {
        practiceId,
        to: owner.ownerPhone,
        from,
        body,
        segments: count.segments,
        encoding: count.encoding,
        ownerId,
        planId,
        stopId: stop.stopId,
        idempotencyKey: key,
        sendAfter,
      });
      if (isUpdate) result.updates += 1;
      else result.queued += 1;
    }
  }
  if (result.queued + result.updates > 0) {
    await audit(trx, { practiceId, userId, action: 'texts.queue', entity: 'plan', entityId: planId, detail: result });
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
  const rows = await listDueTexts(db, now, { limit, planId: options.planId });
  const settingsByPractice = new Map<number, Awaited<ReturnType<typeof getTextSettings>>>();
  for (const row of rows) {
    const claim = `claim:${randomUUID()}`;
    if (!(await claimText(db, row.id, claim))) continue;
    if (row.optedOutAt) {
      await closeClaimedText(db, row.id, claim, 'suppressed', 'Owner opted out');
      result.suppressed += 1;
      continue;
    }
    if (row.windowEndAt && row.windowEndAt.getTime() <= now.getTime()) {
      await closeClaimedText(db, row.id, claim, 'suppressed', 'The window had passed before the text could go');
      result.suppressed += 1;
      continue;
    }
    let settings = settingsByPractice.get(row.practiceId);
    if (!settings) {
      settings = await getTextSettings(db, row.practiceId);
      settingsByPractice.set(row.practiceId, settings);
    }
    const allowedAt = earliestSendAt(now, row.timeZone, quietHoursOf(settings));
    if (allowedAt.getTime() > now.getTime()) {
      await deferClaimedText(db, row.id, claim, allowedAt);
      result.deferred += 1;
      continue;
    }
    try {
      const sent = await sendSms(row.to, row.body);
      await markClaimedTextSent(db, row.id, claim, { providerId: sent.sid.slice(0, 64), from: sent.from, sentAt: now });
      result.sent += 1;
    } catch (e) {
      await closeClaimedText(db, row.id, claim, 'failed', (e instanceof Error ? e.message : 'send failed').slice(0, 250));
      result.failed += 1;
    }
  }
  return result;
}
