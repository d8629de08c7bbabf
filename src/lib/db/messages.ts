import type { Db } from './connection.ts';
import type { LoggedMessage } from '../messaging/message-log.ts';
import type { SmsEncoding } from '../messaging/segments.ts';

/**
 * The messages log: every text and e-mail, in and out, with its state. Outbound texts move
 * queued → sent → delivered (or failed / suppressed); a sender claims a queued text by writing a
 * `claim:` token into provider_id before it calls the provider, and every later change to that text
 * is conditional on still holding the claim.
 */

/** An e-mail as sent (or tried): the log row is written after the attempt, in its final state. */
export async function insertMail(
  db: Db,
  mail: {
    practiceId: number;
    to: string;
    from: string;
    subject: string;
    body: string;
    state: 'sent' | 'failed';
    planId: number | null;
    providerId: string | null;
    error: string | null;
  },
): Promise<number> {
  const [id] = await db('messages').insert({
    practice_id: mail.practiceId,
    channel: 'email',
    direction: 'out',
    to_address: mail.to,
    from_address: mail.from,
    subject: mail.subject,
    body: mail.body,
    state: mail.state,
    plan_id: mail.planId,
    provider_id: mail.providerId,
    sent_at: mail.state === 'sent' ? db.fn.now() : null,
    error: mail.error,
  });
  return Number(id);
}

/** Who was e-mailed about a plan and when, so a repeated call can tell this publication's mails from earlier ones. */
export async function listPlanMails(db: Db, planId: number): Promise<{ to: string; createdAt: Date }[]> {
  const rows: { to_address: string; created_at: Date }[] = await db('messages').where({ plan_id: planId, channel: 'email' }).select('to_address', 'created_at');
  return rows.map((r) => ({ to: r.to_address, createdAt: new Date(r.created_at) }));
}

/**
 * Every text of one owner's visit (all keys starting with `keyPrefix`), newest first, in any state: the
 * prefix already names the practice, plan day, barn and owner.
 */
export async function listVisitTexts(db: Db, keyPrefix: string): Promise<{ id: number; idempotencyKey: string; state: string }[]> {
  const rows: { id: number; idempotency_key: string; state: string }[] = await db('messages')
    .where('idempotency_key', 'like', `${keyPrefix}%`)
    .select('id', 'idempotency_key', 'state')
    .orderBy('id', 'desc');
  return rows.map((r) => ({ id: r.id, idempotencyKey: r.idempotency_key, state: r.state }));
}

/** Drops texts that should no longer go, keeping them in the log with the reason. */
export async function suppressTexts(db: Db, ids: number[], reason: string): Promise<void> {
  await db('messages').whereIn('id', ids).update({ state: 'suppressed', error: reason, updated_at: db.fn.now(3) });
}

/**
 * Queues an arrival text. The idempotency key is unique, so a text already written for the same key
 * (by an earlier or concurrent publish) makes this a no-op instead of a second text.
 */
export async function insertQueuedText(
  db: Db,
  text: {
    practiceId: number;
    to: string;
    from: string | null;
    body: string;
    segments: number;
    encoding: SmsEncoding;
    ownerId: number;
    planId: number;
    stopId: number;
    idempotencyKey: string;
    sendAfter: Date;
  },
): Promise<void> {
  await db('messages')
    .insert({
      practice_id: text.practiceId,
      channel: 'sms',
      direction: 'out',
      to_address: text.to,
      from_address: text.from,
      body: text.body,
      segments: text.segments,
      encoding: text.encoding,
      state: 'queued',
      owner_id: text.ownerId,
      plan_id: text.planId,
      stop_id: text.stopId,
      idempotency_key: text.idempotencyKey,
      send_after: text.sendAfter,
    })
    .onConflict('idempotency_key')
    .ignore();
}

/** A queued text with what the sender needs to decide whether it may go now. */
export interface DueText {
  id: number;
  practiceId: number;
  to: string;
  body: string;
  ownerId: number | null;
  stopId: number | null;
  timeZone: string;
  optedOutAt: Date | null;
  windowEndAt: Date | null;
}

/**
 * Unclaimed queued texts whose send_after has come, oldest first, across practices (the sender serves
 * them all); `planId` narrows the run to one plan's texts.
 */
export async function listDueTexts(db: Db, now: Date, options: { limit: number; planId?: number }): Promise<DueText[]> {
  const rows: {
    id: number;
    practice_id: number;
    to_address: string;
    body: string;
    owner_id: number | null;
    stop_id: number | null;
    time_zone: string;
    opted_out_at: Date | null;
    window_end_at: Date | null;
  }[] = await db('messages as m')
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
    .limit(options.limit);
  return rows.map((r) => ({
    id: r.id,
    practiceId: r.practice_id,
    to: r.to_address,
    body: r.body,
    ownerId: r.owner_id,
    stopId: r.stop_id,
    timeZone: r.time_zone,
    optedOutAt: r.opted_out_at,
    windowEndAt: r.window_end_at,
  }));
}

/**
 * Claims a queued text for one sender with a conditional update; false when another sender got it
 * first, so two senders running at once never send the same text twice.
 */
export async function claimText(db: Db, id: number, claim: string): Promise<boolean> {
  const claimed = await db('messages').where({ id, state: 'queued' }).whereNull('provider_id').update({ provider_id: claim });
  return claimed === 1;
}

/** The text `id` as long as this sender still holds its claim. */
const claimedText = (db: Db, id: number, claim: string) => db('messages').where({ id, provider_id: claim });

/** Ends a claimed text without a provider id: suppressed (it must not go) or failed (the provider refused it). */
export async function closeClaimedText(db: Db, id: number, claim: string, state: 'suppressed' | 'failed', error: string): Promise<void> {
  await claimedText(db, id, claim).update({ state, provider_id: null, error, updated_at: db.fn.now(3) });
}

/** Gives a claimed text back to the queue until `sendAfter` (quiet hours). */
export async function deferClaimedText(db: Db, id: number, claim: string, sendAfter: Date): Promise<void> {
  await claimedText(db, id, claim).update({ provider_id: null, send_after: sendAfter, updated_at: db.fn.now(3) });
}

/** Records the provider's acceptance; its id replaces the claim so delivery reports find the text. */
export async function markClaimedTextSent(db: Db, id: number, claim: string, sent: { providerId: string; from: string; sentAt: Date }): Promise<void> {
  await claimedText(db, id, claim).update({
    state: 'sent',
    provider_id: sent.providerId,
    from_address: sent.from,
    sent_at: sent.sentAt,
    error: null,
    updated_at: db.fn.now(3),
  });
}

/** Logs one text an owner sent us, in the practice of the owner it came from. */
export async function insertInboundText(
  db: Db,
  text: { practiceId: number; ownerId: number; to: string; from: string; body: string; segments: number; encoding: SmsEncoding; providerId: string | null },
): Promise<void> {
  await db('messages').insert({
    practice_id: text.practiceId,
    channel: 'sms',
    direction: 'in',
    to_address: text.to,
    from_address: text.from,
    body: text.body,
    segments: text.segments,
    encoding: text.encoding,
    state: 'received',
    owner_id: text.ownerId,
    provider_id: text.providerId,
  });
}

/** Logs a confirmation (STOP, START, HELP) before it is sent, so a failed send still shows in the log. */
export async function insertConfirmation(
  db: Db,
  text: { practiceId: number; ownerId: number; to: string; body: string; segments: number; encoding: SmsEncoding },
): Promise<number> {
  const [id] = await db('messages').insert({
    practice_id: text.practiceId,
    channel: 'sms',
    direction: 'out',
    to_address: text.to,
    body: text.body,
    segments: text.segments,
    encoding: text.encoding,
    state: 'queued',
    owner_id: text.ownerId,
  });
  return Number(id);
}

export async function markConfirmationSent(db: Db, id: number, sent: { providerId: string; from: string }): Promise<void> {
  await db('messages').where({ id }).update({ state: 'sent', provider_id: sent.providerId, from_address: sent.from, sent_at: db.fn.now(), updated_at: db.fn.now(3) });
}

export async function markConfirmationFailed(db: Db, id: number, error: string): Promise<void> {
  await db('messages').where({ id }).update({ state: 'failed', error, updated_at: db.fn.now(3) });
}

/** Drops every text still queued for an owner (all plans): after an opt-out nothing more may go. */
export async function suppressQueuedTextsOfOwner(db: Db, ownerId: number, reason: string): Promise<void> {
  await db('messages')
    .where({ owner_id: ownerId, state: 'queued', channel: 'sms', direction: 'out' })
    .update({ state: 'suppressed', error: reason, updated_at: db.fn.now(3) });
}

/**
 * Applies a delivery report's state to the outbound text with that provider id. Reports arrive out of
 * order, so `sent` only touches a text still sent, and delivered or failed only one still sent or
 * queued: a delivered or failed text never goes back. Returns the number of texts changed.
 */
export async function applyDeliveryState(db: Db, providerId: string, state: 'sent' | 'delivered' | 'failed', error: string | null): Promise<number> {
  const q = db('messages').where({ provider_id: providerId, channel: 'sms', direction: 'out' });
  if (state === 'sent') q.where('state', 'sent');
  else q.whereIn('state', ['sent', 'queued']);
  const changed = await q.update({ state, error, updated_at: db.fn.now(3) });
  return changed;
}

const iso = (d: Date | null) => (d ? new Date(d).toISOString() : null);

/**
 * A practice's messages of one day: those tied to a plan of `date`, and those tied to no plan that were
 * written between `dayStart` and `dayEnd` (the local day's bounds in UTC).
 */
export async function listMessagesOfDay(db: Db, practiceId: number, date: string, dayStart: Date, dayEnd: Date): Promise<LoggedMessage[]> {
  const rows = await db('messages as m')
    .leftJoin('plans as p', 'p.id', 'm.plan_id')
    .leftJoin('owners as o', 'o.id', 'm.owner_id')
    .where('m.practice_id', practiceId)
    .andWhere((q) =>
      q.where('p.plan_date', date).orWhere((q2) => q2.whereNull('m.plan_id').andWhere('m.created_at', '>=', dayStart).andWhere('m.created_at', '<', dayEnd)),
    )
    .select('m.*', 'o.name as owner_name')
    .orderBy('m.id');
  return rows.map((r) => ({
    id: r.id,
    channel: r.channel,
    direction: r.direction,
    to: r.to_address,
    from: r.from_address,
    subject: r.subject,
    body: r.body,
    segments: r.segments,
    encoding: r.encoding,
    state: r.state,
    stopId: r.stop_id,
    ownerId: r.owner_id,
    ownerName: r.owner_name,
    planId: r.plan_id,
    sendAfter: iso(r.send_after),
    sentAt: iso(r.sent_at),
    createdAt: iso(r.created_at)!,
    error: r.error,
  }));
}
