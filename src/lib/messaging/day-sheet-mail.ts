/**
 * E-mails each farrier of a published plan the link to their day sheet, through sendMail (so each
 * mail is logged in messages). Call it after the publish transaction has committed: the link must
 * open a published plan, and a mail cannot be taken back if the transaction rolled back.
 */
import type { Knex } from 'knex';
import { listPlanMails } from '../db/messages.ts';
import { getPlan } from '../db/plans.ts';
import { getPractice } from '../db/practices.ts';
import { listPlanFarrierAccounts } from '../db/users.ts';
import { sendMail } from './mail.ts';
import { dayText } from './local-time.ts';

export interface DaySheetMailResult {
  sent: number;
  failed: number;
  /** Farriers on the plan with no sign-in (no e-mail address to send to). */
  noAccount: number;
  /** Already mailed for this publication. */
  alreadySent: number;
}

function appBase(): string {
  return (process.env.APP_URL ?? 'http://localhost:4321').replace(/\/$/, '');
}

/**
 * One mail per farrier with a route on the plan. Repeating the call for the same publication sends
 * nothing new (a mail to that address for this plan since plans.published_at counts as sent); a
 * re-publish (a later published_at) mails again, worded as a change.
 */
export async function emailDaySheets(db: Knex, { practiceId, planId }: { practiceId: number; planId: number }): Promise<DaySheetMailResult> {
  const plan = await getPlan(db, practiceId, planId);
  if (!plan || plan.state !== 'published') throw new Error(`plan ${planId} is not a published plan of practice ${practiceId}`);
  // The plan belongs to the practice, so the practice row is there.
  const practice = (await getPractice(db, practiceId))!;
  const routes = await listPlanFarrierAccounts(db, planId);
  const earlierMails = await listPlanMails(db, planId);
  const publishedAt = plan.publishedAt ? plan.publishedAt.getTime() : 0;
  const earlierPublication = earlierMails.some((m) => m.createdAt.getTime() < publishedAt);
  const result: DaySheetMailResult = { sent: 0, failed: 0, noAccount: 0, alreadySent: 0 };
  const day = dayText(plan.date, practice.timeZone);
  for (const r of routes) {
    if (!r.email) {
      result.noAccount += 1;
      continue;
    }
    if (earlierMails.some((m) => m.to === r.email && m.createdAt.getTime() >= publishedAt)) {
      result.alreadySent += 1;
      continue;
    }
    const link = `${appBase()}/day/${plan.date}`;
    const first = (r.userName ?? r.farrierName).split(' ')[0];
    const subject = `${earlierPublication ? 'Changed: your' : 'Your'} day sheet for ${day}`;
    const text = [
      `Hello ${first},`,
      '',
      `${earlierPublication ? 'Your day has changed. ' : ''}Your day sheet for ${day} is ready: ${r.stops} stop${r.stops === 1 ? '' : 's'}, with directions and horse notes.`,
      '',
      link,
      '',
      'Open it on your phone before you set off and keep the page open: it keeps working without a signal, and marks you make offline are sent when you are back in range.',
      '',
      practice.name,
    ].join('\n');
    const sent = await sendMail(db, { practiceId, to: r.email, subject, text, planId });
    if (sent.sent) result.sent += 1;
    else result.failed += 1;
  }
  return result;
}
