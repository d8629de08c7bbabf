import { route } from '../../../lib/server/route.ts';
import { readBody } from '../../../lib/records/read.ts';
import { badRequest, conflict, json, notFound } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { audit } from '../../../lib/db/audit.ts';
import { createJob } from '../../../lib/db/jobs-due.ts';
import { getHorse, openJobOf } from '../../../lib/db/horses.ts';
import { localDate } from '../../../lib/records/due.ts';
import { jobCreateSchema } from '../../../schemas/jobs.ts';

/** Creates the job of one horse (due on its next due date unless given); 409 when it already has one open. */
export const POST = route('dispatcher', async (ctx, user) => {
  const input = await readBody(ctx.request, jobCreateSchema);
  const today = localDate(new Date(), ctx.locals.practice!.timeZone);
  const job = await db().transaction(async (trx) => {
    const horse = await getHorse(trx, user.practiceId, input.horseId);
    if (!horse || horse.archivedAt) throw notFound('Horse');
    const result = await createJob(trx, user.practiceId, horse.id, input.dueOn ?? horse.nextDueOn ?? today);
    if (result === 'open') {
      const open = await openJobOf(trx, horse.id);
      throw conflict(`${horse.name} already has an open job${open ? ` (${open.state}, due ${open.dueOn})` : ''}`);
    }
    if (result === 'no_work') throw badRequest('Invalid body: check horseId', { horseId: `${horse.name} has no usual work types, so the job has no minutes` });
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: 'job.create', entity: 'job', entityId: result.id, detail: { horseId: horse.id } });
    return { id: result.id, horseId: horse.id };
  });
  return json({ job }, 201);
});
