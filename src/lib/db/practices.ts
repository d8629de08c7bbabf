import type { Knex } from 'knex';

/** A practice and its settings, in the app's camelCase. */
export interface Practice {
  id: number;
  name: string;
  timeZone: string;
  units: 'miles' | 'km';
  currency: string;
  mileageRate: number;
  overtimeWeeklyMinutes: number;
  overtimeWeeklyMultiplier: number;
  overtimeDailyMinutes: number | null;
  overtimeDailyMultiplier: number | null;
  overtimeDailyDoubleMinutes: number | null;
  overtimeDailyDoubleMultiplier: number | null;
  weekStart: number;
  planningHorizonDays: number;
  contactPhone: string | null;
  contactEmail: string | null;
}

interface PracticeRow {
  id: number;
  name: string;
  time_zone: string;
  units: 'miles' | 'km';
  currency: string;
  mileage_rate: number;
  overtime_weekly_minutes: number;
  overtime_weekly_multiplier: number;
  overtime_daily_minutes: number | null;
  overtime_daily_multiplier: number | null;
  overtime_daily_double_minutes: number | null;
  overtime_daily_double_multiplier: number | null;
  week_start: number;
  planning_horizon_days: number;
  contact_phone: string | null;
  contact_email: string | null;
}

function fromRow(r: PracticeRow): Practice {
  return {
    id: r.id,
    name: r.name,
    timeZone: r.time_zone,
    units: r.units,
    currency: r.currency,
    mileageRate: Number(r.mileage_rate),
    overtimeWeeklyMinutes: r.overtime_weekly_minutes,
    overtimeWeeklyMultiplier: Number(r.overtime_weekly_multiplier),
    overtimeDailyMinutes: r.overtime_daily_minutes,
    overtimeDailyMultiplier: r.overtime_daily_multiplier == null ? null : Number(r.overtime_daily_multiplier),
    overtimeDailyDoubleMinutes: r.overtime_daily_double_minutes,
    overtimeDailyDoubleMultiplier:
      r.overtime_daily_double_multiplier == null ? null : Number(r.overtime_daily_double_multiplier),
    weekStart: r.week_start,
    planningHorizonDays: r.planning_horizon_days,
    contactPhone: r.contact_phone,
    contactEmail: r.contact_email,
  };
}

/** Locks the practice's row for the rest of `trx`: serialises whole-practice writes such as an import. */
export async function lockPractice(trx: Knex.Transaction, practiceId: number): Promise<void> {
  await trx('practices').where({ id: practiceId }).forUpdate().first('id');
}

export async function getPractice(db: Knex | Knex.Transaction, practiceId: number): Promise<Practice | null> {
  const row = await db<PracticeRow>('practices').where({ id: practiceId }).first();
  return row ? fromRow(row) : null;
}

/** The settings a lead may change; every field optional, only those given are written. */
export interface PracticeSettingsPatch {
  name?: string;
  timeZone?: string;
  units?: 'miles' | 'km';
  mileageRate?: number;
  overtimeWeeklyMinutes?: number;
  overtimeWeeklyMultiplier?: number;
  overtimeDailyMinutes?: number | null;
  overtimeDailyMultiplier?: number | null;
  overtimeDailyDoubleMinutes?: number | null;
  overtimeDailyDoubleMultiplier?: number | null;
  weekStart?: number;
  planningHorizonDays?: number;
  contactPhone?: string | null;
  contactEmail?: string | null;
}

const COLUMNS: Record<keyof PracticeSettingsPatch, keyof PracticeRow> = {
  name: 'name',
  timeZone: 'time_zone',
  units: 'units',
  mileageRate: 'mileage_rate',
  overtimeWeeklyMinutes: 'overtime_weekly_minutes',
  overtimeWeeklyMultiplier: 'overtime_weekly_multiplier',
  overtimeDailyMinutes: 'overtime_daily_minutes',
  overtimeDailyMultiplier: 'overtime_daily_multiplier',
  overtimeDailyDoubleMinutes: 'overtime_daily_double_minutes',
  overtimeDailyDoubleMultiplier: 'overtime_daily_double_multiplier',
  weekStart: 'week_start',
  planningHorizonDays: 'planning_horizon_days',
  contactPhone: 'contact_phone',
  contactEmail: 'contact_email',
};

export async function updatePractice(db: Knex, practiceId: number, patch: PracticeSettingsPatch): Promise<void> {
  const row: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(patch)) {
    if (value !== undefined) row[COLUMNS[key as keyof PracticeSettingsPatch]] = value;
  }
  if (Object.keys(row).length === 0) return;
  row.updated_at = db.fn.now(3);
  await db('practices').where({ id: practiceId }).update(row);
}
