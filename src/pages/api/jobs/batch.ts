import { route } from '../../../lib/server/route.ts';
import { readBody } from '../../../lib/records/read.ts';
import { json } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { audit } from '../../../lib/db/audit.ts';
import { createJobsForRange } from '../../../lib/db/jobs-due.ts';
import { localDate } from '../../../lib/records/due.ts';
import { jobBatchSchema } from '../../../schemas/jobs.ts';

/**
 * Creates jobs for every horse due in a date range, in one transaction and one audit row. Horses that
 * already have an open job are counted and left alone (never a second open job).
 */
export const POST = route('dispatcher', async (ctx, user) => {
  const input = await readBody(ctx.request, jobBatchSchema);
  const today = localDate(new Date(), ctx.locals.practice!.timeZone);
  const result = await db().transaction(async (trx) => {
    const r = await createJobsForRange(trx, user.practiceId, today, input);
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: 'job.create_batch', entity: 'job', detail: { ...input, created: r.created, alreadyOpen: r.alreadyOpen, withoutWork: r.withoutWork, jobIds: r.jobIds } });
    return r;
  });
  return json(result, 201);
});
