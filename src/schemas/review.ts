import { z } from 'zod';
import { daysBetween, isIsoDate } from '../lib/review/time.ts';

/** Longest range one review covers: about a quarter (13 weeks + a day), enough for any month. */
export const REVIEW_MAX_DAYS = 92;

const isoDate = z.string().refine(isIsoDate, 'Use a calendar date, YYYY-MM-DD');

/** The review's date range, both days inclusive, in the practice's local calendar. */
export const reviewQuerySchema = z
  .object({ from: isoDate, to: isoDate })
  .superRefine((q, ctx) => {
    if (!isIsoDate(q.from) || !isIsoDate(q.to)) return;
    if (q.to < q.from) ctx.addIssue({ code: 'custom', path: ['to'], message: 'Must not be before the first day' });
    else if (daysBetween(q.from, q.to) + 1 > REVIEW_MAX_DAYS) ctx.addIssue({ code: 'custom', path: ['to'], message: `At most ${REVIEW_MAX_DAYS} days at once` });
  });
export type ReviewQuery = z.infer<typeof reviewQuerySchema>;
