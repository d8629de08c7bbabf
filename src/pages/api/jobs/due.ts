import { route } from '../../../lib/server/route.ts';
import { readParams } from '../../../lib/records/read.ts';
import { json } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { listDue } from '../../../lib/db/jobs-due.ts';
import { localDate } from '../../../lib/records/due.ts';
import { dueListQuery } from '../../../schemas/jobs.ts';

/** The due list: horses by next due date in the practice's time zone, with group counts. */
export const GET = route('dispatcher', async (ctx, user) => {
  const today = localDate(new Date(), ctx.locals.practice!.timeZone);
  return json({ today, ...(await listDue(db(), user.practiceId, today, readParams(ctx.url, dueListQuery))) });
});
