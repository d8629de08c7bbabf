import { z } from 'zod';

/** GET /api/messages?date=YYYY-MM-DD */
export const messagesQuerySchema = z
  .object({
    date: z
      .string({ required_error: 'Give the day as YYYY-MM-DD' })
      .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use YYYY-MM-DD')
      .refine((s) => !Number.isNaN(new Date(`${s}T00:00:00Z`).getTime()) && new Date(`${s}T00:00:00Z`).toISOString().slice(0, 10) === s, 'Not a calendar date'),
  })
  .strict();

/** One message as GET /api/messages answers it. */
export interface MessageItem {
  id: number;
  channel: 'sms' | 'email';
  to: string;
  body: string;
  segments: number | null;
  encoding: 'gsm7' | 'ucs2' | null;
  state: 'queued' | 'sent' | 'delivered' | 'failed' | 'received' | 'suppressed';
  stopId: number | null;
}
