import { z } from 'zod';

const timeZone = z.string().refine((tz) => {
  try {
    new Intl.DateTimeFormat('en-US', { timeZone: tz });
    return true;
  } catch {
    return false;
  }
}, 'Not a known IANA time zone (e.g. America/New_York)');

const minutes = z.number().int().min(0).max(24 * 60 * 7);
const multiplier = z.number().min(1, 'At least 1.0').max(5, 'At most 5.0');

/**
 * The practice settings a lead may change. Daily overtime is optional: both its threshold and
 * multiplier, or neither; the double-time threshold must lie above the daily one.
 */
export const settingsSchema = z
  .object({
    name: z.string().trim().min(1, 'Enter the practice name').max(120),
    timeZone,
    units: z.enum(['miles', 'km']),
    mileageRate: z.number().min(0).max(100),
    overtimeWeeklyMinutes: minutes.min(60, 'At least 1 hour'),
    overtimeWeeklyMultiplier: multiplier,
    overtimeDailyMinutes: minutes.max(24 * 60).nullable(),
    overtimeDailyMultiplier: multiplier.nullable(),
    overtimeDailyDoubleMinutes: minutes.max(24 * 60).nullable(),
    overtimeDailyDoubleMultiplier: multiplier.nullable(),
    weekStart: z.number().int().min(0).max(6),
    planningHorizonDays: z.number().int().min(0).max(60),
    contactPhone: z.string().trim().regex(/^\+[1-9]\d{6,14}$/, 'Use E.164, e.g. +15025550100').nullable(),
    contactEmail: z.string().trim().email().max(254).nullable(),
  })
  .partial()
  .superRefine((s, ctx) => {
    if (Object.keys(s).length === 0) ctx.addIssue({ code: 'custom', path: [], message: 'Give at least one setting to change' });
    if ((s.overtimeDailyMinutes == null) !== (s.overtimeDailyMultiplier == null) && (s.overtimeDailyMinutes !== undefined || s.overtimeDailyMultiplier !== undefined)) {
      ctx.addIssue({ code: 'custom', path: ['overtimeDailyMultiplier'], message: 'Give both the daily threshold and its multiplier, or neither' });
    }
    if (s.overtimeDailyDoubleMinutes != null && s.overtimeDailyMinutes != null && s.overtimeDailyDoubleMinutes <= s.overtimeDailyMinutes) {
      ctx.addIssue({ code: 'custom', path: ['overtimeDailyDoubleMinutes'], message: 'Must be above the daily threshold' });
    }
  });
export type SettingsInput = z.infer<typeof settingsSchema>;
