import { z } from 'zod';

/**
 * The practice's text settings as the template editor sends them (PUT /api/templates). Texts must
 * name the window and say how to opt out (CTIA asks every recurring programme to say so).
 */
const template = (what: string) =>
  z
    .string({ required_error: `Write the ${what} text` })
    .trim()
    .min(20, 'At least 20 characters')
    .max(480, 'At most 480 characters (about three segments)')
    .refine((t) => t.includes('{start}') && t.includes('{end}'), 'Include {start} and {end}: the window is the point of the text')
    .refine((t) => /\bSTOP\b/.test(t), 'Tell owners how to opt out, e.g. "Reply STOP to opt out."');

const minuteOfDay = z.number({ invalid_type_error: 'A whole number of minutes' }).int().min(0).max(1439);

export const textSettingsSchema = z
  .object({
    arrivalTemplate: template('arrival'),
    updateTemplate: template('update'),
    windowMinMinutes: z.number().int().min(30, 'At least 30 minutes').max(240, 'At most 240 minutes'),
    windowGrowthMinutes: z.number().int().min(0).max(60, 'At most 60 minutes per stop'),
    windowMaxMinutes: z.number().int().min(30).max(360, 'At most 360 minutes'),
    updateThresholdMinutes: z.number().int().min(5, 'At least 5 minutes').max(240),
    quietStartMinute: minuteOfDay,
    quietEndMinute: minuteOfDay,
  })
  .strict()
  .refine((s) => s.windowMaxMinutes >= s.windowMinMinutes, { message: 'The widest window must be at least the minimum', path: ['windowMaxMinutes'] });

export type TextSettingsInput = z.infer<typeof textSettingsSchema>;

/** POST /api/templates/preview: render any template text without saving it. */
export const previewSchema = z.object({ template: z.string().max(2000) }).strict();
