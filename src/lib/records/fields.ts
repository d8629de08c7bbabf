import { z } from 'zod';
import { toE164 } from './phone.ts';
import { isIsoDate } from './due.ts';

/** Empty text from a form field means "none". */
export const blankToNull = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? null : v);

/** Optional free text: trimmed, empty → null. */
export const optionalText = (max: number) => z.preprocess(blankToNull, z.string().trim().max(max, `At most ${max} characters`).nullable()).optional();

/** A phone number stored as E.164; typed forms such as "(859) 555-0142" are converted. */
export const phoneField = z.preprocess(
  blankToNull,
  z
    .string()
    .transform((v, ctx) => {
      const e164 = toE164(v);
      if (!e164) {
        ctx.addIssue({ code: 'custom', message: 'Not a phone number we can text: use e.g. +18595550142 or (859) 555-0142' });
        return z.NEVER;
      }
      return e164;
    })
    .nullable(),
);

export const emailField = z.preprocess(blankToNull, z.string().trim().email('Not an e-mail address').max(254).nullable());

/** A calendar date YYYY-MM-DD. */
export const isoDate = z.string().refine(isIsoDate, 'Use a date like 2026-03-08');

/** A database id sent in a body. */
export const id = z.number({ invalid_type_error: 'Choose one' }).int().positive();

/** Makes a PATCH schema: every field optional, at least one given. */
export function patchOf<T extends z.ZodRawShape>(shape: T) {
  return z
    .object(shape)
    .partial()
    .extend({ archived: z.boolean().optional() })
    .refine((v) => Object.values(v).some((x) => x !== undefined), { message: 'Give at least one field to change', path: [] });
}
