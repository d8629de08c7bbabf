import { z } from 'zod';
import { idFilter, listQuerySchema } from '../lib/records/list-query.ts';
import { blankToNull, id, isoDate, optionalText, patchOf } from '../lib/records/fields.ts';

const horseShape = {
  name: z.string({ required_error: 'Enter a name' }).trim().min(1, 'Enter a name').max(80),
  ownerId: id,
  barnId: id,
  cycleWeeks: z.number({ invalid_type_error: 'Enter weeks' }).int('Whole weeks').min(1, 'At least 1 week').max(26, 'At most 26 weeks'),
  lastVisitOn: z.preprocess(blankToNull, isoDate.nullable()).optional(),
  shoeSize: optionalText(20),
  notes: optionalText(2000),
  needsSecondPerson: z.boolean().optional(),
  workTypeIds: z.array(z.number().int().positive()).min(1, 'Choose at least one usual work type').max(12),
};

/** A horse: who owns it, where it lives, how often it is due, and the work it usually gets. */
export const horseCreateSchema = z.object(horseShape);
export type HorseCreate = z.infer<typeof horseCreateSchema>;
export const horsePatchSchema = patchOf(horseShape);
export type HorsePatch = z.infer<typeof horsePatchSchema>;
export const horseListQuery = listQuerySchema(['name', 'owner', 'barn', 'cycleWeeks', 'lastVisitOn', 'nextDueOn'], 'name').extend({
  barnId: idFilter,
  ownerId: idFilter,
  workTypeId: idFilter,
});

/** What an upload is, as the person uploading it says. */
export const uploadKind = z.enum(['photo', 'radiograph', 'document']);
export type UploadKind = z.infer<typeof uploadKind>;
