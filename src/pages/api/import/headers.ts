import { route } from '../../../lib/server/route.ts';
import { readBody } from '../../../lib/records/read.ts';
import { badRequest, json } from '../../../lib/server/http.ts';
import { guessMapping, parseCsv } from '../../../lib/records/csv.ts';
import { importHeaderSchema } from '../../../schemas/import.ts';

/** Reads a CSV's header row and guesses the column mapping, for the mapping step. */
export const POST = route('dispatcher', async (ctx) => {
  const { csv } = await readBody(ctx.request, importHeaderSchema);
  const parsed = parseCsv(csv);
  if (parsed.headers.length === 0) throw badRequest('Invalid body: check csv', { csv: 'The file has no header row' });
  return json({ headers: parsed.headers, rows: parsed.rows.length, mapping: guessMapping(parsed.headers), sample: parsed.rows.slice(0, 3) });
});
