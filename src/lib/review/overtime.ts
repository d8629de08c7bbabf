import { weekOf, type IsoDate } from './time.ts';

/**
 * The practice's overtime rule, from its settings (practices.overtime_*). Daily thresholds are
 * optional: null switches a tier off.
 */
export interface OvertimeRule {
  weeklyMinutes: number;
  weeklyMultiplier: number;
  dailyMinutes: number | null;
  dailyMultiplier: number | null;
  dailyDoubleMinutes: number | null;
  dailyDoubleMultiplier: number | null;
  /** First day of the workweek, 0 = Sunday … 6 = Saturday. */
  weekStart: number;
}

/** One tier of overtime pay: seconds paid at a multiplier of the regular rate. */
export interface OvertimeTier {
  multiplier: number;
  sec: number;
}

/** One day's working time, split into regular time and overtime tiers. */
export interface DaySplit {
  date: IsoDate;
  workedSec: number;
  regularSec: number;
  /** Overtime under the weekly threshold (hours of the week beyond it, in day order). */
  weeklySec: number;
  /** Daily overtime between the daily threshold and the double-time threshold. */
  dailySec: number;
  /** Daily overtime beyond the double-time threshold. */
  doubleSec: number;
}

/**
 * Splits one farrier's working days into regular time and overtime under the practice's rule.
 *
 * The rule, applied the way California Labor Code §510 combines daily and weekly overtime:
 * 1. With daily thresholds on, a day's hours beyond the double-time threshold are double-time
 *    hours, and hours between the daily threshold and that are daily overtime.
 * 2. The remaining (regular) hours of each day count toward the weekly threshold; hours already paid
 *    as daily overtime are not counted again. The regular hours of the week beyond the weekly
 *    threshold are weekly overtime, taken in day order: the day on which the week crosses the threshold
 *    and the days after it carry the weekly overtime.
 * 3. Each workweek (seven days from the practice's week start) stands alone, as the FLSA requires
 *    (29 CFR 778.104): no averaging across weeks.
 * With daily thresholds off this is plain FLSA weekly overtime (29 CFR 778.104).
 *
 * Days are split per day, so any date range (a month) can sum the days it holds while the weekly
 * threshold is still counted over the whole week, including days outside the range.
 */
export function splitOvertime(days: { date: IsoDate; workedSec: number }[], rule: OvertimeRule): DaySplit[] {
  const weeklyThresholdSec = rule.weeklyMinutes * 60;
  const dailySec = rule.dailyMinutes != null && rule.dailyMultiplier != null ? rule.dailyMinutes * 60 : null;
  const doubleSec =
    rule.dailyDoubleMinutes != null && rule.dailyDoubleMultiplier != null ? rule.dailyDoubleMinutes * 60 : null;
  const sorted = [...days].sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : 0));
  const regularInWeek = new Map<IsoDate, number>();
  const out: DaySplit[] = [];
  for (const day of sorted) {
    const worked = Math.max(0, day.workedSec);
    const double = doubleSec == null ? 0 : Math.max(0, worked - doubleSec);
    const daily = dailySec == null ? 0 : Math.max(0, Math.min(worked, doubleSec ?? Infinity) - dailySec);
    const regularCandidate = worked - double - daily;
    const week = weekOf(day.date, rule.weekStart).from;
    const before = regularInWeek.get(week) ?? 0;
    const after = before + regularCandidate;
    const weekly = Math.max(0, after - weeklyThresholdSec) - Math.max(0, before - weeklyThresholdSec);
    regularInWeek.set(week, after);
    out.push({ date: day.date, workedSec: worked, regularSec: regularCandidate - weekly, weeklySec: weekly, dailySec: daily, doubleSec: double });
  }
  return out;
}

/** Overtime seconds of a split day, all tiers together. */
export function overtimeSecOf(split: DaySplit): number {
  return split.weeklySec + split.dailySec + split.doubleSec;
}

/**
 * What a set of split days costs at a farrier's hourly rate: regular pay, overtime pay (the overtime
 * hours at rate × their multiplier, in full, not only the premium) and the total, in cents, each
 * rounded once to the cent.
 */
export function payCents(
  splits: DaySplit[],
  rule: OvertimeRule,
  costPerHourCents: number,
): { regularCents: number; overtimeCents: number; totalCents: number } {
  let regular = 0;
  let overtime = 0;
  for (const s of splits) {
    regular += s.regularSec * costPerHourCents;
    overtime += s.weeklySec * costPerHourCents * rule.weeklyMultiplier;
    overtime += s.dailySec * costPerHourCents * (rule.dailyMultiplier ?? 0);
    overtime += s.doubleSec * costPerHourCents * (rule.dailyDoubleMultiplier ?? 0);
  }
  const regularCents = Math.round(regular / 3600);
  const overtimeCents = Math.round(overtime / 3600);
  return { regularCents, overtimeCents, totalCents: regularCents + overtimeCents };
}
