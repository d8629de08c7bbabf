import { z } from 'zod';
import { patchOf } from '../lib/records/fields.ts';
import { listQuerySchema } from '../lib/records/list-query.ts';

const workTypeShape = {
  name: z.string({ required_error: 'Enter a name' }).trim().min(1, 'Enter a name').max(80),
  minutesPerHorse: z.number({ required_error: 'Enter minutes', invalid_type_error: 'Enter minutes' }).int('Whole minutes').min(1, 'At least 1 minute').max(480, 'At most 480 minutes'),
  needsForge: z.boolean().optional(),
  needsQualified: z.boolean().optional(),
  priceCents: z.number({ invalid_type_error: 'Enter a price' }).int('Whole cents').min(0, 'Not negative').max(10_000_00, 'At most 10,000').optional(),
};

/** A kind of hoof work: its minutes per horse feed job durations; forge and qualification limit who may do it. */
export const workTypeCreateSchema = z.object(workTypeShape);
export type WorkTypeCreate = z.infer<typeof workTypeCreateSchema>;
export const workTypePatchSchema = patchOf(workTypeShape);
export type WorkTypePatch = z.infer<typeof workTypePatchSchema>;
export const workTypeListQuery = listQuerySchema(['name', 'minutesPerHorse', 'priceCents', 'horses'], 'name');
