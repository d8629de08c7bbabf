/**
 * E-mails each farrier of a published plan the link to their day sheet, through sendMail (so each
 * mail is logged in messages). Call it after the publish transaction has committed: the link must
 * open a published plan, and a mail cannot be taken back if the transaction rolled back.
 */
import type { Knex } from 'knex';
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
  const plan = await db('plans').where({ id: planId, practice_id: practiceId }).first<{ plan_date: string; state: string; published_at: Date | null; version: number } | undefined>();
  if (!plan || plan.state !== 'published') throw new Error(`plan ${planId} is not a published plan of practice ${practiceId}`);
  const practice = await db('practices').where({ id: practiceId }).first<{ name: string; time_zone: string }>();
  const routes: { farrier_id: number; farrier_name: string; stops: number; email: string | null; user_name: string | null }[] = await db('routes as r')
    .join('farriers as f', 'f.id', 'r.farrier_id')
    .leftJoin('users as u', function () {
      this.on('u.farrier_id', '=', 'r.farrier_id').andOn('u.practice_id', '=', 'r.practice_id');
    })
    .where('r.plan_id', planId)
    .select('r.farrier_id', 'f.name as farrier_name', 'u.email', 'u.name as user_name')
    .select(db.raw('(SELECT COUNT(*) FROM stops s WHERE s.route_id = r.id) AS stops'));
  const earlierMails = await db('messages').where({ plan_id: planId, channel: 'email' }).select('to_address', 'created_at');
  const publishedAt = plan.published_at ? new Date(plan.published_at).getTime() : 0;
  const earlierPublication = earlierMails.some((m) => new Date(m.created_at).getTime() < publishedAt);
  const result: DaySheetMailResult = { sent: 0, failed: 0, noAccount: 0, alreadySent: 0 };
  const day = dayText(plan.plan_date, practice.time_zone);
  for (const r of routes) {
    if (!r.email) {
      result.noAccount += 1;
      continue;
    }
    if (earlierMails.some((m) => m.to_address === r.email && new Date(m.created_at).getTime() >= publishedAt)) {
      result.alreadySent += 1;
      continue;
    }
    const link = `${appBase()}/day/${plan.plan_date}`;
    const first = (r.user_name ?? r.farrier_name).split(' ')[0];
    const subject = `${earlierPublication ? 'Changed: your' : 'Your'} day sheet for ${day}`;
    const text = [
      `Hello ${first},`,
      '',
      `${earlierPublication ? 'Your day has changed. ' : ''}Your day sheet for ${day} is ready: ${Number(r.stops)} stop${Number(r.stops) === 1 ? '' : 's'}, with directions and horse notes.`,
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
