/**
 * Wall-clock arithmetic in a practice's time zone (IANA names), on top of date-fns-tz, so that quiet
 * hours and arrival windows follow the owner's clock across daylight-saving changes.
 */
import { formatInTimeZone, fromZonedTime } from 'date-fns-tz';

/** The local calendar day (YYYY-MM-DD) of an instant. */
export function localDate(at: Date, timeZone: string): string {
  return formatInTimeZone(at, timeZone, 'yyyy-MM-dd');
}

/** Minutes since local midnight of an instant (0–1439), as the wall clock shows them. */
export function localMinute(at: Date, timeZone: string): number {
  const [h, m] = formatInTimeZone(at, timeZone, 'HH:mm').split(':').map(Number);
  return h! * 60 + m!;
}

/** The instant a local date and minute of the day name (the later one when a clock change skips it). */
export function atLocal(date: string, minute: number, timeZone: string): Date {
  const h = String(Math.floor(minute / 60)).padStart(2, '0');
  const m = String(minute % 60).padStart(2, '0');
  return fromZonedTime(`${date}T${h}:${m}:00`, timeZone);
}

/** A calendar day plus some days, as YYYY-MM-DD (pure date arithmetic, no time zone involved). */
export function addDays(date: string, days: number): string {
  const d = new Date(`${date}T12:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

/** "9:15am" in the zone, the short form texts and the day sheet use (ASCII only, so GSM-7). */
export function clockText(at: Date, timeZone: string): string {
  return formatInTimeZone(at, timeZone, 'h:mmaaa');
}

/** "Tue 5 Jan" in the zone. */
export function dayText(at: Date | string, timeZone: string): string {
  const instant = typeof at === 'string' ? atLocal(at, 720, timeZone) : at;
  return formatInTimeZone(instant, timeZone, 'EEE d MMM');
}
