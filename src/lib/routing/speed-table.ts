import { readFileSync } from 'node:fs';
import { z } from 'zod';
import { DRIVABLE_CLASSES, resolveSpeeds, type RoadClass, type SpeedOverrides } from './speeds';

const MPH = 1.609344;
const speed = z.number().positive().max(200);

/**
 * The practice's speed table, tiles/source/speeds.json beside the roads it applies to:
 * `{"units": "mph" | "km/h", "classes": {"tertiary": 40, "track": 8, …}, "access": 10}` — each
 * entry replaces the default speed of that OpenStreetMap highway class; anything left out keeps its
 * default. Speeds are in the table's own units, as a practice thinks of its roads.
 */
export const speedTableSchema = z
  .object({
    units: z.enum(['mph', 'km/h']),
    classes: z.record(z.string(), speed).default({}),
    access: speed.optional(),
  })
  .strict()
  .superRefine((t, ctx) => {
    for (const name of Object.keys(t.classes)) {
      if (!(DRIVABLE_CLASSES as readonly string[]).includes(name)) {
        ctx.addIssue({ code: 'custom', path: ['classes', name], message: `not a drivable highway class (${DRIVABLE_CLASSES.join(', ')})` });
      }
    }
  });
export type SpeedTable = z.infer<typeof speedTableSchema>;

/** The table as overrides in km/h, validated against the model's own limits too. */
export function speedTableOverrides(table: SpeedTable): SpeedOverrides {
  const factor = table.units === 'mph' ? MPH : 1;
  const classKmh: Partial<Record<RoadClass, number>> = {};
  for (const [name, value] of Object.entries(table.classes)) classKmh[name as RoadClass] = value * factor;
  const overrides: SpeedOverrides = { classKmh };
  if (table.access !== undefined) overrides.accessKmh = table.access * factor;
  resolveSpeeds(overrides);
  return overrides;
}

/**
 * Reads a speed table file; a missing file means the defaults (undefined). A malformed file is an
 * error that names the file and every bad entry, so a typo never silently falls back to the defaults.
 */
export function readSpeedTable(file: string): SpeedOverrides | undefined {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return undefined;
    throw err;
  }
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    throw new Error(`${file}: not valid JSON`);
  }
  const parsed = speedTableSchema.safeParse(raw);
  if (!parsed.success) {
    throw new Error(`${file}: ${parsed.error.issues.map((i) => `${i.path.join('.') || '(top)'} ${i.message}`).join('; ')}`);
  }
  return speedTableOverrides(parsed.data);
}
