import { formatInTimeZone, fromZonedTime, toZonedTime } from 'date-fns-tz';

/**
 * Clock arithmetic for a plan day. The engine counts seconds since local midnight on the wall clock;
 * the database stores UTC; the API speaks ISO 8601 with the practice's offset. Converting through the
 * wall clock (not by adding seconds to midnight) keeps working hours right on the days the clocks change.
 */

const pad = (n: number) => String(n).padStart(2, '0');

/** The UTC instant of `sec` wall-clock seconds after local midnight of `date` in `timeZone`. */
export function localSecToDate(date: string, sec: number, timeZone: string): Date {
  const days = Math.floor(sec / 86400);
  const rest = sec - days * 86400;
  const day = days === 0 ? date : addDays(date, days);
  const h = Math.floor(rest / 3600), m = Math.floor((rest % 3600) / 60), s = Math.round(rest % 60);
  return fromZonedTime(`${day}T${pad(h)}:${pad(m)}:${pad(s)}`, timeZone);
}

/** Wall-clock seconds after local midnight of `date` for a UTC instant (may exceed a day, or be negative). */
export function dateToLocalSec(date: string, instant: Date, timeZone: string): number {
  const local = formatInTimeZone(instant, timeZone, 'yyyy-MM-dd HH:mm:ss');
  const [d, t] = local.split(' ') as [string, string];
  const [h, m, s] = t.split(':').map(Number) as [number, number, number];
  const dayDiff = Math.round((Date.parse(`${d}T00:00:00Z`) - Date.parse(`${date}T00:00:00Z`)) / 86400000);
  return dayDiff * 86400 + h * 3600 + m * 60 + s;
}

/** ISO 8601 with the zone's offset, to the second (e.g. 2026-12-02T08:15:00-05:00). */
export function isoLocal(instant: Date, timeZone: string): string {
  return formatInTimeZone(instant, timeZone, "yyyy-MM-dd'T'HH:mm:ssXXX");
}

/** HH:mm on the practice's clock. */
export function clockLocal(instant: Date, timeZone: string): string {
  return formatInTimeZone(instant, timeZone, 'HH:mm');
}

/** ISO weekday of a calendar date: 1 = Monday … 7 = Sunday. */
export function isoWeekday(date: string): number {
  const d = new Date(`${date}T12:00:00Z`).getUTCDay();
  return d === 0 ? 7 : d;
}

export function addDays(date: string, days: number): string {
  const d = new Date(`${date}T12:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

/** Today's calendar date in a time zone. */
export function todayIn(timeZone: string, now = new Date()): string {
  return formatInTimeZone(now, timeZone, 'yyyy-MM-dd');
}

/** The first day after `from` on which at least one of the given working patterns works. */
export function nextWorkingDay(from: string, workingDays: number[][]): string {
  for (let i = 1; i <= 7; i++) {
    const d = addDays(from, i);
    if (workingDays.some((days) => days.includes(isoWeekday(d)))) return d;
  }
  return addDays(from, 1);
}

/** Local hour and minute of an instant, for display-only rounding. */
export function localParts(instant: Date, timeZone: string): { hours: number; minutes: number } {
  const z = toZonedTime(instant, timeZone);
  return { hours: z.getHours(), minutes: z.getMinutes() };
}
