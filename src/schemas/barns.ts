import { z } from 'zod';
import { idFilter, listQuerySchema } from '../lib/records/list-query.ts';
import { blankToNull, optionalText, patchOf } from '../lib/records/fields.ts';

const span = z
  .tuple([z.number().int().min(0).max(1440), z.number().int().min(0).max(1440)])
  .refine(([a, b]) => b > a, 'Closing time must be after opening time');

/** Access hours: seven days, Monday first, each a list of open [startMinute, endMinute] spans (local time). */
export const accessHoursSchema = z
  .array(z.array(span).max(4, 'At most 4 spans a day'), { invalid_type_error: 'Give the hours of each day' })
  .length(7, 'Give all seven days, Monday first')
  .superRefine((days, ctx) => {
    days.forEach((spans, day) => {
      const sorted = [...spans].sort((a, b) => a[0] - b[0]);
      for (let i = 1; i < sorted.length; i += 1) {
        if (sorted[i]![0] < sorted[i - 1]![1]) ctx.addIssue({ code: 'custom', path: [day], message: 'Spans of one day overlap' });
      }
    });
  });
export type AccessHours = z.infer<typeof accessHoursSchema>;

const barnShape = {
  name: z.string({ required_error: 'Enter a name' }).trim().min(1, 'Enter a name').max(120),
  ownerId: z.preprocess(blankToNull, z.number().int().positive().nullable()).optional(),
  address: z.string({ required_error: 'Enter the address' }).trim().min(1, 'Enter the address').max(255),
  addressPointId: z.preprocess(blankToNull, z.string().max(40).nullable()).optional(),
  lat: z.number({ required_error: 'Place the pin on the map', invalid_type_error: 'Place the pin on the map' }).min(-90).max(90),
  lon: z.number({ required_error: 'Place the pin on the map', invalid_type_error: 'Place the pin on the map' }).min(-180).max(180),
  accessHours: accessHoursSchema,
  setupMinutes: z.number({ invalid_type_error: 'Enter minutes' }).int('Whole minutes').min(0).max(120, 'At most 120 minutes').optional(),
  notes: optionalText(2000),
};

/** A barn: where horses are kept and visited, with its pin, opening hours and set-up time per stop. */
export const barnCreateSchema = z.object(barnShape);
export type BarnCreate = z.infer<typeof barnCreateSchema>;
export const barnPatchSchema = patchOf(barnShape);
export type BarnPatch = z.infer<typeof barnPatchSchema>;
export const barnListQuery = listQuerySchema(['name', 'address', 'horses', 'owner'], 'name').extend({ ownerId: idFilter });

/** Address look-up among the region's address points. */
export const addressQuery = z.object({ q: z.string().trim().max(120).optional().default('') });

/** Default hours for a new barn: 07:00–19:00 Monday to Saturday, Sunday closed. */
export const DEFAULT_ACCESS_HOURS: AccessHours = [[[420, 1140]], [[420, 1140]], [[420, 1140]], [[420, 1140]], [[420, 1140]], [[420, 1140]], []];
