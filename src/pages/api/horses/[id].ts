import { route } from '../../../lib/server/route.ts';
import { readBody } from '../../../lib/records/read.ts';
import { badRequest, conflict, idParam, json, notFound } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { audit } from '../../../lib/db/audit.ts';
import { lockInPractice } from '../../../lib/db/records-lock.ts';
import { deleteHorse, getHorse, horseInUse, horseReferenceErrors, openJobOf, updateHorse } from '../../../lib/db/horses.ts';
import { horsePatchSchema } from '../../../schemas/horses.ts';

export const GET = route('signed-in', async (ctx, user) => {
  const horse = await getHorse(db(), user.practiceId, idParam(ctx.params.id, 'Horse'));
  if (!horse) throw notFound('Horse');
  return json({ horse });
});

/** Changes a horse, or archives it; a horse with an open job is not archived until the job is settled. */
export const PATCH = route('dispatcher', async (ctx, user) => {
  const id = idParam(ctx.params.id, 'Horse');
  const patch = await readBody(ctx.request, horsePatchSchema);
  await db().transaction(async (trx) => {
    if (!(await lockInPractice(trx, 'horses', user.practiceId, id, ['id']))) throw notFound('Horse');
    const errors = await horseReferenceErrors(trx, user.practiceId, patch);
    if (Object.keys(errors).length) throw badRequest(`Invalid body: check ${Object.keys(errors).join(', ')}`, errors);
    if (patch.archived === true) {
      const open = await openJobOf(trx, id);
      if (open) throw conflict(`This horse has an open job (${open.state}, due ${open.dueOn}); cancel it or let it be done before archiving.`);
    }
    await updateHorse(trx, user.practiceId, id, patch);
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: patch.archived === true ? 'horse.archive' : 'horse.update', entity: 'horse', entityId: id, detail: patch });
  });
  return json({ horse: await getHorse(db(), user.practiceId, id) });
});

/** Deletes a horse with no jobs, visits or uploads; otherwise 409 with the reason. */
export const DELETE = route('dispatcher', async (ctx, user) => {
  const id = idParam(ctx.params.id, 'Horse');
  await db().transaction(async (trx) => {
    const horse = await lockInPractice(trx, 'horses', user.practiceId, id, ['name']);
    if (!horse) throw notFound('Horse');
    const reason = await horseInUse(trx, id);
    if (reason) throw conflict(reason);
    await deleteHorse(trx, user.practiceId, id);
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: 'horse.delete', entity: 'horse', entityId: id, detail: { name: horse.name } });
  });
  return json({ deleted: true });
});
