/**
 * Quiet hours: no text to an owner between 21:00 and 08:00 on the owner's clock (the US calling-hours
 * rule of thumb under the TCPA; the practice may change the span). A text that falls inside them waits
 * until the end of the span on the next local morning.
 */
import { addDays, atLocal, localDate, localMinute } from './local-time.ts';

export interface QuietHours {
  /** Local minute the quiet span starts (1260 = 21:00). */
  startMinute: number;
  /** Local minute it ends (480 = 08:00). */
  endMinute: number;
}

export const DEFAULT_QUIET_HOURS: QuietHours = { startMinute: 21 * 60, endMinute: 8 * 60 };

/** Whether a local minute of the day is inside the quiet span (which may wrap past midnight). */
export function isQuietMinute(minute: number, quiet: QuietHours): boolean {
  if (quiet.startMinute === quiet.endMinute) return false;
  if (quiet.startMinute < quiet.endMinute) return minute >= quiet.startMinute && minute < quiet.endMinute;
  return minute >= quiet.startMinute || minute < quiet.endMinute;
}

/**
 * The earliest instant at or after `now` when a text may go: `now` itself outside quiet hours,
 * otherwise the end of the quiet span on the right local day (computed on the wall clock, so a night
 * with a daylight-saving change is an hour shorter or longer in UTC, as the owner lives it).
 */
export function earliestSendAt(now: Date, timeZone: string, quiet: QuietHours = DEFAULT_QUIET_HOURS): Date {
  const minute = localMinute(now, timeZone);
  if (!isQuietMinute(minute, quiet)) return now;
  const today = localDate(now, timeZone);
  // Before the end minute we are in the small hours: the quiet span ends today; otherwise tomorrow.
  const endDay = minute < quiet.endMinute ? today : addDays(today, 1);
  return atLocal(endDay, quiet.endMinute, timeZone);
}
