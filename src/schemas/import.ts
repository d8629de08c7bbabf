import { z } from 'zod';

/** The fields a CSV column can be mapped to; owner name, barn name and horse name are required. */
export const IMPORT_FIELDS = [
  { key: 'ownerName', label: 'Owner name', required: true },
  { key: 'ownerPhone', label: 'Owner phone', required: false },
  { key: 'ownerEmail', label: 'Owner e-mail', required: false },
  { key: 'textConsent', label: 'Text consent (yes/no)', required: false },
  { key: 'barnName', label: 'Barn name', required: true },
  { key: 'barnAddress', label: 'Barn address', required: false },
  { key: 'barnLat', label: 'Barn latitude', required: false },
  { key: 'barnLon', label: 'Barn longitude', required: false },
  { key: 'horseName', label: 'Horse name', required: true },
  { key: 'cycleWeeks', label: 'Cycle weeks', required: false },
  { key: 'lastVisitOn', label: 'Last visit', required: false },
  { key: 'work', label: 'Usual work (separated by ;)', required: false },
  { key: 'shoeSize', label: 'Shoe size', required: false },
  { key: 'horseNotes', label: 'Horse notes', required: false },
] as const;
export type ImportField = (typeof IMPORT_FIELDS)[number]['key'];

/** Largest CSV accepted in one request (2 MB of text, some 20,000 rows). */
export const MAX_CSV_CHARS = 2_000_000;

const fieldKeys = IMPORT_FIELDS.map((f) => f.key) as [ImportField, ...ImportField[]];

/** Which CSV column (by its header) feeds which field; unmapped fields are left out. */
export const importMappingSchema = z
  .record(z.enum(fieldKeys), z.string().max(200))
  .superRefine((m, ctx) => {
    for (const f of IMPORT_FIELDS) {
      if (f.required && !m[f.key]) ctx.addIssue({ code: 'custom', path: [f.key], message: `Choose the column for ${f.label.toLowerCase()}` });
    }
  });
export type ImportMapping = z.infer<typeof importMappingSchema>;

/** A CSV file's text and its column mapping, for the preview and for the commit alike. */
export const importRequestSchema = z.object({
  csv: z.string({ required_error: 'Choose a CSV file' }).min(1, 'The file is empty').max(MAX_CSV_CHARS, 'The file is larger than 2 MB'),
  mapping: importMappingSchema,
});
export type ImportRequest = z.infer<typeof importRequestSchema>;

/** Just the text, to read the header row for the mapping step. */
export const importHeaderSchema = z.object({ csv: importRequestSchema.shape.csv });
