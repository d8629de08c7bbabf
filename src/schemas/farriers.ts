import { z } from 'zod';
import { listQuerySchema } from '../lib/records/list-query.ts';
import { blankToNull, patchOf, phoneField } from '../lib/records/fields.ts';

const minuteOfDay = z.number({ invalid_type_error: 'Enter a time' }).int().min(0).max(1440);
const minutes = (max: number) => z.number({ invalid_type_error: 'Enter minutes' }).int('Whole minutes').min(0).max(max, `At most ${max} minutes`);

const farrierShape = {
  name: z.string({ required_error: 'Enter a name' }).trim().min(1, 'Enter a name').max(120),
  phone: phoneField.optional(),
  homeAddress: z.string({ required_error: 'Enter the home base address' }).trim().min(1, 'Enter the home base address').max(255),
  homeLat: z.number({ required_error: 'Place the home base on the map', invalid_type_error: 'Place the home base on the map' }).min(-90).max(90),
  homeLon: z.number({ required_error: 'Place the home base on the map', invalid_type_error: 'Place the home base on the map' }).min(-180).max(180),
  qualifiedTherapeutic: z.boolean().optional(),
  apprentice: z.boolean().optional(),
  hasForge: z.boolean().optional(),
  workingDays: z.array(z.number().int().min(1).max(7)).min(1, 'Choose at least one working day').max(7),
  shiftStartMinute: minuteOfDay,
  shiftEndMinute: minuteOfDay,
  breakMinutes: minutes(120).optional(),
  breakWindowStartMinute: minuteOfDay.optional(),
  breakWindowEndMinute: minuteOfDay.optional(),
  normalWorkMinutes: minutes(1440).optional(),
  maxOvertimeMinutes: minutes(600).optional(),
  costPerHourCents: z.number({ invalid_type_error: 'Enter a cost' }).int('Whole cents').min(0).max(100_000).optional(),
  colour: z.string().regex(/^#[0-9a-fA-F]{6}$/, 'Use a colour like #445a76').optional(),
  /** The user account this farrier signs in with (a farrier-role user of the same practice), or none. */
  userId: z.preprocess(blankToNull, z.number().int().positive().nullable()).optional(),
};

type Shape = { [K in keyof typeof farrierShape]?: unknown };

function rules(v: Shape & Record<string, unknown>, ctx: z.RefinementCtx) {
  const n = (k: string) => (typeof v[k] === 'number' ? (v[k] as number) : undefined);
  const start = n('shiftStartMinute');
  const end = n('shiftEndMinute');
  if (start !== undefined && end !== undefined && end <= start) ctx.addIssue({ code: 'custom', path: ['shiftEndMinute'], message: 'The day must end after it starts' });
  const bs = n('breakWindowStartMinute');
  const be = n('breakWindowEndMinute');
  if (bs !== undefined && be !== undefined && be <= bs) ctx.addIssue({ code: 'custom', path: ['breakWindowEndMinute'], message: 'The break window must end after it starts' });
  if (v.apprentice === true && v.qualifiedTherapeutic === true) ctx.addIssue({ code: 'custom', path: ['qualifiedTherapeutic'], message: 'An apprentice does not take therapeutic work' });
  if (Array.isArray(v.workingDays) && new Set(v.workingDays).size !== v.workingDays.length) ctx.addIssue({ code: 'custom', path: ['workingDays'], message: 'A day is given twice' });
}

const shape = farrierShape;

/** A farrier of the team: home base, working pattern, skills, truck and cost, optionally linked to a user. */
export const farrierCreateSchema = z.object(shape).superRefine(rules);
export type FarrierCreate = z.infer<typeof farrierCreateSchema>;
export const farrierPatchSchema = patchOf(shape).superRefine(rules);
export type FarrierPatch = z.infer<typeof farrierPatchSchema>;
export const farrierListQuery = listQuerySchema(['name', 'costPerHourCents', 'shiftStartMinute'], 'name');
