/**
 * Replies from owners and delivery reports from the provider. STOP-type words opt the owner out at
 * once (recorded with the time, queued texts dropped, one confirmation and nothing after); START or
 * UNSTOP opts back in; HELP answers with the practice's contact. Confirmations answer a message the
 * owner just sent, so quiet hours do not hold them back.
 */
import type { Knex } from 'knex';
import { keywordOf, type Keyword } from './keywords.ts';
import { countSegments } from './segments.ts';
import { sendSms } from './sms-provider.ts';

interface OwnerRow {
  id: number;
  practice_id: number;
  opted_out_at: Date | null;
  text_consent_at: Date | null;
  practice_name: string;
  contact_phone: string | null;
  contact_email: string | null;
}

/** The confirmation texts, in our words. */
export function confirmationText(keyword: Keyword, practice: { name: string; contactPhone: string | null; contactEmail: string | null }): string {
  const contact = [practice.contactPhone, practice.contactEmail].filter(Boolean).join(' or ');
  switch (keyword) {
    case 'stop':
      return `${practice.name}: you will get no more texts from us. Reply START to get arrival times again.`;
    case 'start':
      return `${practice.name}: arrival-time texts are back on. Reply STOP to opt out, HELP for help.`;
    case 'help':
      return `${practice.name}: texts with your farrier's arrival times.${contact ? ` Contact us at ${contact}.` : ''} Reply STOP to opt out.`;
  }
}

/** Sends a confirmation now and logs it as a text of its own. */
async function sendConfirmation(db: Knex, owner: OwnerRow, to: string, body: string): Promise<void> {
  const count = countSegments(body);
  const [id] = await db('messages').insert({
    practice_id: owner.practice_id,
    channel: 'sms',
    direction: 'out',
    to_address: to,
    body,
    segments: count.segments,
    encoding: count.encoding,
    state: 'queued',
    owner_id: owner.id,
  });
  try {
    const sent = await sendSms(to, body);
    await db('messages').where({ id }).update({ state: 'sent', provider_id: sent.sid.slice(0, 64), from_address: sent.from, sent_at: db.fn.now(), updated_at: db.fn.now(3) });
  } catch (e) {
    await db('messages').where({ id }).update({ state: 'failed', error: (e instanceof Error ? e.message : 'send failed').slice(0, 250), updated_at: db.fn.now(3) });
  }
}

export interface InboundResult {
  keyword: Keyword | null;
  /** Owners (in any practice) the number belongs to. */
  owners: number;
  confirmations: number;
}

/**
 * Handles one inbound text. The number may belong to owners of several practices that share the
 * sender number: each is handled in its own practice, and each practice logs the reply.
 */
export async function handleInbound(db: Knex, text: { from: string; to: string; body: string; providerId: string | null }): Promise<InboundResult> {
  const keyword = keywordOf(text.body);
  const owners: OwnerRow[] = await db('owners as o')
    .join('practices as p', 'p.id', 'o.practice_id')
    .where('o.phone', text.from)
    .whereNull('o.archived_at')
    .select('o.id', 'o.practice_id', 'o.opted_out_at', 'o.text_consent_at', 'p.name as practice_name', 'p.contact_phone', 'p.contact_email');
  let confirmations = 0;
  for (const owner of owners) {
    const count = countSegments(text.body);
    await db('messages').insert({
      practice_id: owner.practice_id,
      channel: 'sms',
      direction: 'in',
      to_address: text.to,
      from_address: text.from,
      body: text.body.slice(0, 1600),
      segments: count.segments,
      encoding: count.encoding,
      state: 'received',
      owner_id: owner.id,
      provider_id: text.providerId?.slice(0, 64) ?? null,
    });
    const practice = { name: owner.practice_name, contactPhone: owner.contact_phone, contactEmail: owner.contact_email };
    if (keyword === 'stop') {
      if (owner.opted_out_at) continue; // confirmed once already: nothing after
      await db.transaction(async (trx) => {
        await trx('owners').where({ id: owner.id }).update({ opted_out_at: trx.fn.now(), updated_at: trx.fn.now(3) });
        await trx('messages')
          .where({ owner_id: owner.id, state: 'queued', channel: 'sms', direction: 'out' })
          .update({ state: 'suppressed', error: 'Owner opted out', updated_at: trx.fn.now(3) });
        await trx('audit_log').insert({ practice_id: owner.practice_id, user_id: null, action: 'owner.opt_out', entity: 'owner', entity_id: owner.id, detail: JSON.stringify({ word: text.body.trim().slice(0, 20) }) });
      });
      await sendConfirmation(db, owner, text.from, confirmationText('stop', practice));
      confirmations += 1;
    } else if (keyword === 'start') {
      // Texting START is the owner's own request for texts: it counts as consent when none was recorded.
      await db('owners')
        .where({ id: owner.id })
        .update({ opted_out_at: null, text_consent_at: owner.text_consent_at ?? db.fn.now(), updated_at: db.fn.now(3) });
      await db('audit_log').insert({ practice_id: owner.practice_id, user_id: null, action: 'owner.opt_in', entity: 'owner', entity_id: owner.id, detail: JSON.stringify({ word: text.body.trim().slice(0, 20) }) });
      await sendConfirmation(db, owner, text.from, confirmationText('start', practice));
      confirmations += 1;
    } else if (keyword === 'help') {
      await sendConfirmation(db, owner, text.from, confirmationText('help', practice));
      confirmations += 1;
    }
  }
  return { keyword, owners: owners.length, confirmations };
}

const STATUS: Record<string, 'sent' | 'delivered' | 'failed' | undefined> = {
  sent: 'sent',
  delivered: 'delivered',
  undelivered: 'failed',
  failed: 'failed',
};

/**
 * Applies a delivery report to the text with that provider id. Reports can arrive out of order, so a
 * delivered or failed text never goes back to sent.
 */
export async function applyStatus(db: Knex, providerId: string, status: string, errorCode?: string | null): Promise<boolean> {
  const state = STATUS[status];
  if (!state) return false;
  const q = db('messages').where({ provider_id: providerId, channel: 'sms', direction: 'out' });
  if (state === 'sent') q.where('state', 'sent');
  else q.whereIn('state', ['sent', 'queued']);
  const changed = await q.update({ state, error: state === 'failed' ? `Provider reported ${status}${errorCode ? ` (${errorCode})` : ''}` : null, updated_at: db.fn.now(3) });
  return changed > 0;
}
