/**
 * The Messages page's and GET /api/messages' read of the messages log: every text and e-mail of one
 * local day. A message tied to a plan belongs to the plan's day (texts go out the evening before);
 * one without a plan (replies, confirmations, invitations) belongs to the local day it was written.
 */
import type { Knex } from 'knex';
import { addDays, atLocal } from './local-time.ts';

export interface LoggedMessage {
  id: number;
  channel: 'sms' | 'email';
  direction: 'out' | 'in';
  to: string;
  from: string | null;
  subject: string | null;
  body: string;
  segments: number | null;
  encoding: 'gsm7' | 'ucs2' | null;
  state: 'queued' | 'sent' | 'delivered' | 'failed' | 'received' | 'suppressed';
  stopId: number | null;
  ownerId: number | null;
  ownerName: string | null;
  planId: number | null;
  sendAfter: string | null;
  sentAt: string | null;
  createdAt: string;
  error: string | null;
}

const iso = (d: Date | null) => (d ? new Date(d).toISOString() : null);

export async function listMessages(db: Knex, practiceId: number, date: string, timeZone: string): Promise<LoggedMessage[]> {
  const dayStart = atLocal(date, 0, timeZone);
  const dayEnd = atLocal(addDays(date, 1), 0, timeZone);
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
