import type { ZodError } from 'zod';
import { ApiError } from './api.ts';

/** Field errors of a failed client-side parse, first message per field ("_" for the whole form). */
export function zodErrors(error: ZodError): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of error.issues) out[issue.path.join('.') || '_'] ??= issue.message;
  return out;
}

/** Field errors of a failed API call, with the overall message under "_". */
export function apiErrors(error: unknown): Record<string, string> {
  if (error instanceof ApiError) return { ...error.fields, _: error.message };
  return { _: 'Could not reach the server; try again.' };
}
