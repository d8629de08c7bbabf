/**
 * Due dates of horses. A horse's last visit is a calendar date in the practice's own time zone, and
 * its next visit is due a whole number of weeks later: that is calendar arithmetic on dates, never
 * "add 7 × 24 hours to an instant", which lands on the wrong day when a daylight-saving change falls in
 * between. Only "today" depends on the clock, and it is taken in the practice's zone.
 */
import { DUE_SOON_DAYS } from '../map/due-state.ts';

/** The three groups of the due list. */
export type DueBucket = 'overdue' | 'this_week' | 'later';

/** Days ahead that count as "due this week": the same span the map calls due soon. */
export const DUE_THIS_WEEK_DAYS = DUE_SOON_DAYS;

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

/** True for a real calendar date written YYYY-MM-DD (no 2026-02-30). */
export function isIsoDate(value: string): boolean {
  const m = ISO_DATE.exec(value);
  if (!m) return false;
  const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
  return d.getUTCFullYear() === Number(m[1]) && d.getUTCMonth() === Number(m[2]) - 1 && d.getUTCDate() === Number(m[3]);
}

/** Adds days to a YYYY-MM-DD date in the proleptic Gregorian calendar (UTC arithmetic, no zone). */
export function addDays(isoDate: string, days: number): string {
  if (!isIsoDate(isoDate)) throw new RangeError(`Not a date: ${isoDate}`);
  const d = new Date(`${isoDate}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

/** Next due date: last visit + cycle weeks; null when no visit has been recorded yet. */
export function nextDueOn(lastVisitOn: string | null, cycleWeeks: number): string | null {
  if (lastVisitOn === null) return null;
  return addDays(lastVisitOn, cycleWeeks * 7);
}

/** The calendar date an instant falls on in a time zone (YYYY-MM-DD). */
export function localDate(instant: Date, timeZone: string): string {
  // en-CA formats as YYYY-MM-DD.
  return new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(instant);
}

/**
 * Which group a due date belongs to on a given local day: before today is overdue; today up to
 * DUE_THIS_WEEK_DAYS ahead is due this week; later is later. A horse never visited is due now.
 */
export function dueBucket(nextDue: string | null, today: string): DueBucket {
  if (nextDue === null) return 'this_week';
  if (nextDue < today) return 'overdue';
  if (nextDue <= addDays(today, DUE_THIS_WEEK_DAYS)) return 'this_week';
  return 'later';
}

/** Whole days from today to the due date (negative when overdue). */
export function daysUntil(nextDue: string, today: string): number {
  return Math.round((Date.parse(`${nextDue}T00:00:00Z`) - Date.parse(`${today}T00:00:00Z`)) / 86_400_000);
}
