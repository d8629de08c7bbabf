import { route } from '../../../lib/server/route.ts';
import { readBody } from '../../../lib/records/read.ts';
import { HttpError, json } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { audit } from '../../../lib/db/audit.ts';
import { loadImportContext, writeImport } from '../../../lib/db/import.ts';
import { lockPractice } from '../../../lib/db/practices.ts';
import { parseCsv, planImport } from '../../../lib/records/csv.ts';
import { localDate } from '../../../lib/records/due.ts';
import { importRequestSchema } from '../../../schemas/import.ts';

/**
 * Imports all rows or none: the rows are checked again inside one transaction (against the records as
 * they are now), any bad row refuses the whole file with the list, and rows already on record are
 * skipped, so importing the same file twice adds nothing the second time.
 */
export const POST = route('dispatcher', async (ctx, user) => {
  const { csv, mapping } = await readBody(ctx.request, importRequestSchema);
  const today = localDate(new Date(), ctx.locals.practice!.timeZone);
  const parsed = parseCsv(csv);
  const result = await db().transaction(async (trx) => {
    // Serialise imports of one practice: two at once could both see an owner as new.
    await lockPractice(trx, user.practiceId);
    const plan = planImport(parsed, mapping, await loadImportContext(trx, user.practiceId, today));
    if (plan.badRows.length > 0) {
      throw new HttpError(400, 'invalid_request', `${plan.badRows.length} of ${plan.rows} rows cannot be imported; nothing was changed`, { csv: `Fix line ${plan.badRows.map((b) => b.line).slice(0, 20).join(', ')} (see the preview)` });
    }
    const written = await writeImport(trx, user.practiceId, plan);
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: 'import.commit', entity: 'import', detail: { rows: plan.rows, owners: written.owners, barns: written.barns, horses: written.horses, unchanged: plan.unchanged.length } });
    return { ...written, unchanged: plan.unchanged.length, rows: plan.rows };
  });
  return json(result, 201);
});
