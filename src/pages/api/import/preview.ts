import { route } from '../../../lib/server/route.ts';
import { readBody } from '../../../lib/records/read.ts';
import { json } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { loadImportContext } from '../../../lib/db/import.ts';
import { parseCsv, planImport, planSummary } from '../../../lib/records/csv.ts';
import { localDate } from '../../../lib/records/due.ts';
import { importRequestSchema } from '../../../schemas/import.ts';

/** Checks every row without writing anything: bad rows with their reasons, and what a commit would add. */
export const POST = route('dispatcher', async (ctx, user) => {
  const { csv, mapping } = await readBody(ctx.request, importRequestSchema);
  const today = localDate(new Date(), ctx.locals.practice!.timeZone);
  const plan = planImport(parseCsv(csv), mapping, await loadImportContext(db(), user.practiceId, today));
  return json(planSummary(plan));
});
