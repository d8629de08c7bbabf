import { z } from 'zod';

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use YYYY-MM-DD');

/**
 * POST /api/visits: one mark from the day sheet. The phone makes clientKey (a random id per mark)
 * and keeps it across retries, so that a replay is recognised.
 */
export const markSchema = z
  .object({
    clientKey: z.string({ required_error: 'Give the mark key' }).regex(/^[A-Za-z0-9_-]{8,64}$/, '8 to 64 letters, digits, - or _'),
    stopId: z.number({ required_error: 'Give the stop' }).int().positive(),
    state: z.enum(['arrived', 'done', 'skipped'], { required_error: 'Say arrived, done or skipped' }),
    at: z.string({ required_error: 'Give the time of the mark' }).datetime({ message: 'An ISO time', offset: true }),
    skipReason: z.string().trim().max(255, 'At most 255 characters').nullable().optional(),
  })
  .strict()
  .refine((m) => m.state !== 'skipped' || !!m.skipReason, { message: 'Give a reason for skipping', path: ['skipReason'] });

export type MarkBody = z.infer<typeof markSchema>;

/** GET /api/visits?date=&farrier= */
export const progressQuerySchema = z
  .object({ date: isoDate, farrier: z.coerce.number().int().positive().optional() })
  .strict();

/** Reasons a farrier can pick when skipping a stop (free text is allowed too). */
export const SKIP_REASONS = ['Owner cancelled on arrival', 'Horse could not be caught', 'Barn locked or no access', 'Weather', 'Ran out of time', 'Horse lame: vet to see first'] as const;
