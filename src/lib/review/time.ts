import { formatInTimeZone, fromZonedTime } from 'date-fns-tz';

/**
 * Calendar and clock arithmetic for the review. Dates are the practice's local calendar days as
 * 'YYYY-MM-DD' strings (the way plans.plan_date and day_logs.work_date store them), so week
 * boundaries never depend on the server's own time zone. Durations are always differences of UTC
 * instants, so a day that contains a daylight-saving change counts the hours that really passed.
 */

/** A local calendar date, 'YYYY-MM-DD'. */
export type IsoDate = string;

const DATE_RE = /^\d{4}-\d{2}-\d{2}$/;

/** True for a real calendar date in 'YYYY-MM-DD' form (rejects 2026-02-30). */
export function isIsoDate(value: string): boolean {
  if (!DATE_RE.test(value)) return false;
  const d = new Date(`${value}T00:00:00Z`);
  return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === value;
}

/** The date `days` calendar days after `date` (negative goes back). */
export function addDays(date: IsoDate, days: number): IsoDate {
  const d = new Date(`${date}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

/** Weekday of a date, 0 = Sunday … 6 = Saturday (the convention of practices.week_start). */
export function weekdayOf(date: IsoDate): number {
  return new Date(`${date}T00:00:00Z`).getUTCDay();
}

/** Whole calendar days from `a` to `b` (b − a). */
export function daysBetween(a: IsoDate, b: IsoDate): number {
  return Math.round((Date.parse(`${b}T00:00:00Z`) - Date.parse(`${a}T00:00:00Z`)) / 86_400_000);
}

/**
 * The workweek holding `date`, for a practice whose week starts on `weekStart` (0 = Sunday …
 * 6 = Saturday): seven local calendar days, first and last inclusive. Overtime is counted per such
 * week, and each week stands alone.
 */
export function weekOf(date: IsoDate, weekStart: number): { from: IsoDate; to: IsoDate } {
  const back = (weekdayOf(date) - weekStart + 7) % 7;
  const from = addDays(date, -back);
  return { from, to: addDays(from, 6) };
}

/** The calendar month holding `date`, first and last day inclusive. */
export function monthOf(date: IsoDate): { from: IsoDate; to: IsoDate } {
  const from = `${date.slice(0, 7)}-01`;
  const next = new Date(`${from}T00:00:00Z`);
  next.setUTCMonth(next.getUTCMonth() + 1);
  return { from, to: addDays(next.toISOString().slice(0, 10), -1) };
}

/** Every date from `from` to `to`, both inclusive. */
export function datesIn(from: IsoDate, to: IsoDate): IsoDate[] {
  const out: IsoDate[] = [];
  for (let d = from; d <= to; d = addDays(d, 1)) out.push(d);
  return out;
}

/** Today's date in the practice's time zone. */
export function todayIn(timeZone: string, now: Date = new Date()): IsoDate {
  return formatInTimeZone(now, timeZone, 'yyyy-MM-dd');
}

/**
 * The UTC instants where a local calendar day begins and ends (the next day's midnight) in a time
 * zone. Their difference is the day's real length: 23 h or 25 h on a daylight-saving change.
 */
export function dayBoundsUtc(date: IsoDate, timeZone: string): { start: Date; end: Date } {
  return { start: fromZonedTime(`${date}T00:00:00`, timeZone), end: fromZonedTime(`${addDays(date, 1)}T00:00:00`, timeZone) };
}

/** Seconds that really passed between two instants (UTC difference, never wall-clock). */
export function elapsedSec(start: Date, end: Date): number {
  return Math.round((end.getTime() - start.getTime()) / 1000);
}

/** A clock time of an instant in the practice's zone, 'HH:mm'. */
export function localClock(at: Date, timeZone: string): string {
  return formatInTimeZone(at, timeZone, 'HH:mm');
}
