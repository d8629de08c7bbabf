import { z } from 'zod';

const isoDate = z.string({ required_error: 'Give the day' }).regex(/^\d{4}-\d{2}-\d{2}$/, 'Use YYYY-MM-DD');
const isoTime = (what: string) => z.string({ required_error: `Give ${what}` }).datetime({ message: 'An ISO time', offset: true });

/** An odometer reading in whole miles or km (the practice's units), as a farrier writes it in the mileage log. */
export const odometerReading = z
  .number({ invalid_type_error: 'Whole miles or km, digits only' })
  .int('Whole miles or km, no decimals')
  .min(0, 'Not below 0')
  .max(9_999_999, 'At most 7 digits');

/**
 * POST /api/day-logs: "Start the day" (leaving home) or "Back home" from the day sheet. The phone
 * makes clientKey once per mark and keeps it across retries, so a replay is recognised. A dispatcher
 * or lead marking for a farrier names them with farrierId; a farrier marks only their own day.
 */
export const dayMarkSchema = z
  .object({
    clientKey: z.string({ required_error: 'Give the mark key' }).regex(/^[A-Za-z0-9_-]{8,64}$/, '8 to 64 letters, digits, - or _'),
    kind: z.enum(['start', 'end'], { required_error: 'Say start or end', invalid_type_error: 'Say start or end' }),
    date: isoDate,
    at: isoTime('the time of the mark'),
    odometer: odometerReading.nullable().optional(),
    farrierId: z.number().int().positive().optional(),
  })
  .strict();

export type DayMarkBody = z.infer<typeof dayMarkSchema>;

/**
 * PATCH /api/day-logs/{id}: a dispatcher's or lead's correction of a farrier's day, always with a
 * reason (kept in the audit log). Odometer readings may be cleared with null; endedAt null reopens the day.
 */
export const dayLogCorrectionSchema = z
  .object({
    reason: z.string({ required_error: 'Say why the day is corrected' }).trim().min(3, 'Say why the day is corrected').max(255, 'At most 255 characters'),
    startedAt: isoTime('the start').optional(),
    endedAt: isoTime('the end').nullable().optional(),
    startOdometer: odometerReading.nullable().optional(),
    endOdometer: odometerReading.nullable().optional(),
  })
  .strict()
  .refine((b) => b.startedAt !== undefined || b.endedAt !== undefined || b.startOdometer !== undefined || b.endOdometer !== undefined, {
    message: 'Change at least one of startedAt, endedAt, startOdometer, endOdometer',
    path: ['_'],
  });

export type DayLogCorrectionBody = z.infer<typeof dayLogCorrectionSchema>;

/** GET /api/day-logs?date=&farrier= */
export const dayLogQuerySchema = z.object({ date: isoDate, farrier: z.coerce.number().int().positive().optional() }).strict();
