import { route } from '../../../../lib/server/route.ts';
import { readBody } from '../../../../lib/records/read.ts';
import { conflict, idParam, json, notFound } from '../../../../lib/server/http.ts';
import { db } from '../../../../lib/server/db.ts';
import { audit } from '../../../../lib/db/audit.ts';
import { lockInPractice } from '../../../../lib/db/records-lock.ts';
import { cancelJob, getJob } from '../../../../lib/db/jobs-due.ts';
import { jobCancelSchema } from '../../../../schemas/jobs.ts';

/** Cancels a job that is still only due (planned or booked jobs are taken off their plan in Dispatch first). */
export const POST = route('dispatcher', async (ctx, user) => {
  const id = idParam(ctx.params.id, 'Job');
  const { reason } = await readBody(ctx.request, jobCancelSchema);
  await db().transaction(async (trx) => {
    const job = await lockInPractice(trx, 'jobs', user.practiceId, id, ['state']);
    if (!job) throw notFound('Job');
    if (job.state !== 'due') throw conflict(`This job is ${job.state.replace('_', ' ')}; only a job that is still due can be cancelled here`);
    await cancelJob(trx, user.practiceId, id);
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: 'job.cancel', entity: 'job', entityId: id, detail: { reason } });
  });
  return json({ job: await getJob(db(), user.practiceId, id) });
});
