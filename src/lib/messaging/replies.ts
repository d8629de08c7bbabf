/**
 * Replies from owners and delivery reports from the provider. STOP-type words opt the owner out at
 * once (recorded with the time, queued texts dropped, one confirmation and nothing after); START or
 * UNSTOP opts back in; HELP answers with the practice's contact. Confirmations answer a message the
 * owner just sent, so quiet hours do not hold them back.
 */
import type { Knex } from 'knex';
import { audit } from '../db/audit.ts';
import { applyDeliveryState, insertConfirmation, insertInboundText, markConfirmationFailed, markConfirmationSent, suppressQueuedTextsOfOwner } from '../db/messages.ts';
import { findOwnersByPhone, optInOwner, optOutOwner, type TextingOwner } from '../db/owners.ts';
import { keywordOf, type Keyword } from './keywords.ts';
import { countSegments } from './segments.ts';
import { sendSms } from './sms-provider.ts';

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
async function sendConfirmation(db: Knex, owner: TextingOwner, to: string, body: string): Promise<void> {
  const count = countSegments(body);
  const id = await insertConfirmation(db, { practiceId: owner.practiceId, ownerId: owner.id, to, body, segments: count.segments, encoding: count.encoding });
  try {
    const sent = await sendSms(to, body);
    await markConfirmationSent(db, id, { providerId: sent.sid.slice(0, 64), from: sent.from });
  } catch (e) {
    await markConfirmationFailed(db, id, (e instanceof Error ? e.message : 'send failed').slice(0, 250));
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
  const owners = await findOwnersByPhone(db, text.from);
  let confirmations = 0;
  for (const owner of owners) {
    const count = countSegments(text.body);
    await insertInboundText(db, {
      practiceId: owner.practiceId,
      ownerId: owner.id,
      to: text.to,
      from: text.from,
      body: text.body.slice(0, 1600),
      segments: count.segments,
      encoding: count.encoding,
      providerId: text.providerId?.slice(0, 64) ?? null,
    });
    const practice = { name: owner.practiceName, contactPhone: owner.contactPhone, contactEmail: owner.contactEmail };
    if (keyword === 'stop') {
      if (owner.optedOutAt) continue; // confirmed once already: nothing after
      await db.transaction(async (trx) => {
        await optOutOwner(trx, owner.id);
        await suppressQueuedTextsOfOwner(trx, owner.id, 'Owner opted out');
        await audit(trx, { practiceId: owner.practiceId, userId: null, action: 'owner.opt_out', entity: 'owner', entityId: owner.id, detail: { word: text.body.trim().slice(0, 20) } });
      });
      await sendConfirmation(db, owner, text.from, confirmationText('stop', practice));
      confirmations += 1;
    } else if (keyword === 'start') {
      // Texting START is the owner's own request for texts: it counts as consent when none was recorded.
      await optInOwner(db, owner.id, owner.textConsentAt);
      await audit(db, { practiceId: owner.practiceId, userId: null, action: 'owner.opt_in', entity: 'owner', entityId: owner.id, detail: { word: text.body.trim().slice(0, 20) } });
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
  const changed = await applyDeliveryState(db, providerId, state, state === 'failed' ? `Provider reported ${status}${errorCode ? ` (${errorCode})` : ''}` : null);
  return changed > 0;
}
