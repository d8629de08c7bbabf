import { splitOvertime, overtimeSecOf, payCents, type DaySplit, type OvertimeRule } from './overtime.ts';
import { distanceTenths, mileageCostCents, type Units } from './mileage.ts';
import { addDays, datesIn, elapsedSec, weekOf, type IsoDate } from './time.ts';

/** A farrier as the review needs them: name, colour, pay rate and break length. */
export interface ReviewFarrierInput {
  id: number;
  name: string;
  colour: string;
  costPerHourCents: number;
  breakMinutes: number;
  archived: boolean;
}

/** One published route, reduced to the figures the review compares. */
export interface PlannedDayInput {
  farrierId: number;
  date: IsoDate;
  startAt: Date;
  endAt: Date;
  driveSec: number;
  distanceM: number;
  hasBreak: boolean;
  stops: number;
  horses: number;
  revenueCents: number;
}

/** One day_logs row: the actual start and end of a farrier's day (end null while the day is open). */
export interface ActualDayInput {
  farrierId: number;
  date: IsoDate;
  startedAt: Date;
  endedAt: Date | null;
  distanceM: number | null;
  /**
   * Where distance_m came from: 'odometer' (the farrier's readings), 'planned' (no readings, so the
   * published route's distance), null or absent when not recorded (logs from before the day sheet's marks).
   */
  distanceSource?: 'odometer' | 'planned' | null;
}

/** One visit_logs row with its horses. */
export interface VisitInput {
  farrierId: number;
  date: IsoDate;
  state: 'arrived' | 'done' | 'skipped';
  distanceM: number | null;
  horsesDone: number;
  revenueCents: number;
}

/** Everything a review needs, already scoped to one practice. */
export interface ReviewInput {
  from: IsoDate;
  to: IsoDate;
  units: Units;
  mileageRate: number;
  currency: string;
  rule: OvertimeRule;
  farriers: ReviewFarrierInput[];
  /** Should cover the whole workweeks that hold `from` and `to`, so weekly overtime sees every day. */
  planned: PlannedDayInput[];
  actual: ActualDayInput[];
  visits: VisitInput[];
}

/** The figures of one farrier (or of the team) over the range. Money in currency units, 2 decimals. */
export interface ReviewFigures {
  plannedMinutes: number;
  actualMinutes: number;
  plannedOvertimeMinutes: number;
  overtimeMinutes: number;
  plannedOvertimeCost: number;
  overtimeCost: number;
  driveMinutes: number;
  plannedDistance: number;
  actualDistance: number;
  plannedMileageCost: number;
  mileageCost: number;
  stopsPlanned: number;
  stopsSkipped: number;
  horsesPlanned: number;
  horsesDone: number;
  plannedRevenue: number;
  revenue: number;
  daysPlanned: number;
  daysWorked: number;
  /** Days worked whose actual distance is the planned route's, because no odometer pair was given. */
  plannedDistanceDays: number;
}

export interface ReviewFarrier extends ReviewFigures {
  farrierId: number;
  name: string;
  colour: string;
}

/** One farrier's figures on one day, for the distance chart and the day list. */
export interface ReviewDayFarrier {
  farrierId: number;
  plannedMinutes: number;
  actualMinutes: number;
  overtimeMinutes: number;
  plannedDistance: number;
  actualDistance: number;
  /** Where the actual distance came from (see ActualDayInput.distanceSource); null with no day log. */
  actualDistanceSource: 'odometer' | 'planned' | null;
}

/** One farrier's whole workweek, for the chart of hours against the weekly overtime line. */
export interface ReviewWeekFarrier {
  farrierId: number;
  plannedMinutes: number;
  actualMinutes: number;
  overtimeMinutes: number;
}

export interface ReviewResult {
  from: IsoDate;
  to: IsoDate;
  units: Units;
  currency: string;
  mileageRate: number;
  rule: OvertimeRule;
  farriers: ReviewFarrier[];
  totals: ReviewFigures;
  weeks: { from: IsoDate; to: IsoDate; farriers: ReviewWeekFarrier[] }[];
  days: { date: IsoDate; farriers: ReviewDayFarrier[] }[];
}

const key = (farrierId: number, date: IsoDate) => `${farrierId}|${date}`;
const minutes = (sec: number) => Math.round(sec / 60);
const money = (cents: number) => cents / 100;
const units1 = (tenths: number) => tenths / 10;

/**
 * Working seconds of a day: end − start as real elapsed time (UTC difference, so a daylight-saving
 * change is counted as it happened), less the farrier's break when the published route has one.
 * Actual breaks are not logged, so the actual day is charged the same break as the plan of that day;
 * a day worked without a published route, or whose route has no break, is charged none.
 */
export function workingSec(start: Date, end: Date, breakSec: number): number {
  return Math.max(0, elapsedSec(start, end) - breakSec);
}

/**
 * Computes the review of a date range: per farrier planned and actual working time, overtime under
 * the practice's rule (counted over whole workweeks, summed over the days in range), planned drive
 * time, planned and actual distance and their mileage cost, stops and horses, and revenue; team totals
 * are the sums of the farrier rows exactly as shown (rounded minutes, tenths, cents).
 */
export function computeReview(input: ReviewInput): ReviewResult {
  const { rule, units, mileageRate } = input;
  const inRange = (d: IsoDate) => d >= input.from && d <= input.to;
  const plannedByDay = new Map(input.planned.map((p) => [key(p.farrierId, p.date), p]));
  const actualByDay = new Map(input.actual.filter((a) => a.endedAt).map((a) => [key(a.farrierId, a.date), a]));
  const visitsByDay = new Map<string, VisitInput[]>();
  for (const v of input.visits) {
    const k = key(v.farrierId, v.date);
    visitsByDay.set(k, [...(visitsByDay.get(k) ?? []), v]);
  }

  const rows: ReviewFarrier[] = [];
  const perDay = new Map<IsoDate, ReviewDayFarrier[]>();
  const weekRows = new Map<IsoDate, ReviewWeekFarrier[]>();

  for (const farrier of input.farriers) {
    const breakSec = farrier.breakMinutes * 60;
    const plannedDays = input.planned.filter((p) => p.farrierId === farrier.id);
    const actualDays = input.actual.filter((a) => a.farrierId === farrier.id && a.endedAt);
    const plannedSplit = splitOvertime(
      plannedDays.map((p) => ({ date: p.date, workedSec: workingSec(p.startAt, p.endAt, p.hasBreak ? breakSec : 0) })),
      rule,
    );
    const actualSplit = splitOvertime(
      actualDays.map((a) => ({
        date: a.date,
        workedSec: workingSec(a.startedAt, a.endedAt!, plannedByDay.get(key(farrier.id, a.date))?.hasBreak ? breakSec : 0),
      })),
      rule,
    );
    const visits = input.visits.filter((v) => v.farrierId === farrier.id && inRange(v.date));
    const plannedIn = plannedDays.filter((p) => inRange(p.date));
    const actualIn = actualDays.filter((a) => inRange(a.date));
    const pSplitIn = plannedSplit.filter((s) => inRange(s.date));
    const aSplitIn = actualSplit.filter((s) => inRange(s.date));
    if (farrier.archived && plannedIn.length === 0 && actualIn.length === 0 && visits.length === 0) continue;

    const actualDistanceM = (a: ActualDayInput) =>
      a.distanceM ?? (visitsByDay.get(key(a.farrierId, a.date)) ?? []).reduce((s, v) => s + (v.distanceM ?? 0), 0);
    const plannedTenths = plannedIn.reduce((s, p) => s + distanceTenths(p.distanceM, units), 0);
    const actualTenths = actualIn.reduce((s, a) => s + distanceTenths(actualDistanceM(a), units), 0);
    const sum = (xs: DaySplit[], f: (s: DaySplit) => number) => xs.reduce((t, s) => t + f(s), 0);

    rows.push({
      farrierId: farrier.id,
      name: farrier.name,
      colour: farrier.colour,
      plannedMinutes: minutes(sum(pSplitIn, (s) => s.workedSec)),
      actualMinutes: minutes(sum(aSplitIn, (s) => s.workedSec)),
      plannedOvertimeMinutes: minutes(sum(pSplitIn, overtimeSecOf)),
      overtimeMinutes: minutes(sum(aSplitIn, overtimeSecOf)),
      plannedOvertimeCost: money(payCents(pSplitIn, rule, farrier.costPerHourCents).overtimeCents),
      overtimeCost: money(payCents(aSplitIn, rule, farrier.costPerHourCents).overtimeCents),
      driveMinutes: minutes(plannedIn.reduce((s, p) => s + p.driveSec, 0)),
      plannedDistance: units1(plannedTenths),
      actualDistance: units1(actualTenths),
      plannedMileageCost: money(mileageCostCents(plannedTenths, mileageRate)),
      mileageCost: money(mileageCostCents(actualTenths, mileageRate)),
      stopsPlanned: plannedIn.reduce((s, p) => s + p.stops, 0),
      stopsSkipped: visits.filter((v) => v.state === 'skipped').length,
      horsesPlanned: plannedIn.reduce((s, p) => s + p.horses, 0),
      horsesDone: visits.reduce((s, v) => s + (v.state === 'done' ? v.horsesDone : 0), 0),
      plannedRevenue: money(plannedIn.reduce((s, p) => s + p.revenueCents, 0)),
      revenue: money(visits.reduce((s, v) => s + (v.state === 'done' ? v.revenueCents : 0), 0)),
      daysPlanned: plannedIn.length,
      daysWorked: actualIn.length,
      plannedDistanceDays: actualIn.filter((a) => a.distanceSource === 'planned').length,
    });

    // Per day (in range) and per whole workweek (for the chart against the weekly line).
    const pByDate = new Map(plannedSplit.map((s) => [s.date, s]));
    const aByDate = new Map(actualSplit.map((s) => [s.date, s]));
    const dates = new Set([...pByDate.keys(), ...aByDate.keys()]);
    for (const date of [...dates].sort()) {
      const p = pByDate.get(date);
      const a = aByDate.get(date);
      const week = weekOf(date, rule.weekStart).from;
      const list = weekRows.get(week) ?? [];
      let w = list.find((x) => x.farrierId === farrier.id);
      if (!w) {
        w = { farrierId: farrier.id, plannedMinutes: 0, actualMinutes: 0, overtimeMinutes: 0 };
        list.push(w);
        weekRows.set(week, list);
      }
      // Summed in seconds first would be finer; minutes per day keep the chart equal to the day list.
      w.plannedMinutes += minutes(p?.workedSec ?? 0);
      w.actualMinutes += minutes(a?.workedSec ?? 0);
      w.overtimeMinutes += minutes(a ? overtimeSecOf(a) : 0);
      if (!inRange(date)) continue;
      const plannedRow = plannedByDay.get(key(farrier.id, date));
      const actualRow = actualByDay.get(key(farrier.id, date));
      const dayList = perDay.get(date) ?? [];
      dayList.push({
        farrierId: farrier.id,
        plannedMinutes: minutes(p?.workedSec ?? 0),
        actualMinutes: minutes(a?.workedSec ?? 0),
        overtimeMinutes: minutes(a ? overtimeSecOf(a) : 0),
        plannedDistance: units1(plannedRow ? distanceTenths(plannedRow.distanceM, units) : 0),
        actualDistance: units1(actualRow ? distanceTenths(actualDistanceM(actualRow), units) : 0),
        actualDistanceSource: actualRow?.distanceSource ?? null,
      });
      perDay.set(date, dayList);
    }
  }

  const totals = {} as ReviewFigures;
  const figureKeys: (keyof ReviewFigures)[] = [
    'plannedMinutes', 'actualMinutes', 'plannedOvertimeMinutes', 'overtimeMinutes', 'plannedOvertimeCost', 'overtimeCost',
    'driveMinutes', 'plannedDistance', 'actualDistance', 'plannedMileageCost', 'mileageCost', 'stopsPlanned', 'stopsSkipped',
    'horsesPlanned', 'horsesDone', 'plannedRevenue', 'revenue', 'daysPlanned', 'daysWorked', 'plannedDistanceDays',
  ];
  const scale: Partial<Record<keyof ReviewFigures, number>> = {
    plannedOvertimeCost: 100, overtimeCost: 100, plannedMileageCost: 100, mileageCost: 100, plannedRevenue: 100, revenue: 100,
    plannedDistance: 10, actualDistance: 10,
  };
  for (const k of figureKeys) {
    const f = scale[k] ?? 1;
    totals[k] = Math.round(rows.reduce((s, r) => s + Math.round(r[k] * f), 0)) / f;
  }

  const weeks: ReviewResult['weeks'] = [];
  for (let w = weekOf(input.from, rule.weekStart).from; w <= input.to; w = addDays(w, 7)) {
    weeks.push({ from: w, to: addDays(w, 6), farriers: weekRows.get(w) ?? [] });
  }
  return {
    from: input.from,
    to: input.to,
    units,
    currency: input.currency,
    mileageRate,
    rule,
    farriers: rows,
    totals,
    weeks,
    days: datesIn(input.from, input.to).map((date) => ({ date, farriers: perDay.get(date) ?? [] })),
  };
}
