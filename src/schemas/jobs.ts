import { z } from 'zod';
import { id, isoDate } from '../lib/records/fields.ts';
import { idFilter, MAX_PAGE_SIZE } from '../lib/records/list-query.ts';

/** The due list's filters (query string). */
export const dueListQuery = z.object({
  bucket: z.enum(['all', 'overdue', 'this_week', 'later']).optional().default('all'),
  barnId: idFilter,
  farrierId: idFilter,
  workTypeId: idFilter,
  q: z.string().trim().max(100).optional().default(''),
  page: z.coerce.number().int().min(1).max(100_000).optional().default(1),
  pageSize: z.coerce.number().int().min(5).max(MAX_PAGE_SIZE).optional().default(50),
});
export type DueListQuery = z.infer<typeof dueListQuery>;

/** One job for one horse, due on its next due date unless another is given. */
export const jobCreateSchema = z.object({ horseId: id, dueOn: isoDate.optional() });

/**
 * Jobs for every horse due in a date range (optionally narrowed like the due list) that has no open
 * job yet, in one action; overdue horses are included unless asked not to.
 */
export const jobBatchSchema = z
  .object({
    from: isoDate,
    to: isoDate,
    includeOverdue: z.boolean().optional().default(true),
    barnId: z.number().int().positive().optional(),
    farrierId: z.number().int().positive().optional(),
    workTypeId: z.number().int().positive().optional(),
  })
  .refine((v) => v.to >= v.from, { path: ['to'], message: 'The range must end on or after its start' })
  .refine((v) => Date.parse(v.to) - Date.parse(v.from) <= 92 * 86_400_000, { path: ['to'], message: 'At most 92 days at once' });
export type JobBatch = z.infer<typeof jobBatchSchema>;

/** Cancelling a job needs a reason, kept in the audit log. */
export const jobCancelSchema = z.object({ reason: z.string({ required_error: 'Give a reason' }).trim().min(1, 'Give a reason').max(255) });
