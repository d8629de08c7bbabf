import type { Knex } from 'knex';
import { queueArrivalTexts, type QueueResult } from '../messaging/arrival-texts.ts';

/**
 * Owner messages for a published plan. The messaging module is the one writer of arrival texts:
 * it stores each stop's window, and queues one text per owner and stop (state `queued`, idempotency
 * key per visit and window), or an update when a window moved. Dispatch calls it inside its own
 * transaction after publishing and after every edit of a published plan; sending happens later.
 */
export async function queueOwnerMessages(trx: Knex.Transaction, practiceId: number, planId: number, userId: number): Promise<QueueResult> {
  return queueArrivalTexts(trx, { practiceId, planId, userId });
}
