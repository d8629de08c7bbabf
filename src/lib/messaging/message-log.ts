/**
 * The Messages page's and GET /api/messages' read of the messages log: every text and e-mail of one
 * local day. A message tied to a plan belongs to the plan's day (texts go out the evening before);
 * one without a plan (replies, confirmations, invitations) belongs to the local day it was written.
 */
import type { Knex } from 'knex';
import { listMessagesOfDay } from '../db/messages.ts';
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

export async function listMessages(db: Knex, practiceId: number, date: string, timeZone: string): Promise<LoggedMessage[]> {
  const dayStart = atLocal(date, 0, timeZone);
  const dayEnd = atLocal(addDays(date, 1), 0, timeZone);
  return listMessagesOfDay(db, practiceId, date, dayStart, dayEnd);
}
