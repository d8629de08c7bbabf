import { route } from '../../../lib/server/route.ts';
import { readBody } from '../../../lib/records/read.ts';
import { conflict, idParam, json, notFound } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { audit } from '../../../lib/db/audit.ts';
import { lockInPractice } from '../../../lib/db/records-lock.ts';
import { deleteWorkType, getWorkType, updateWorkType, workTypeInUse } from '../../../lib/db/work-types.ts';
import { workTypePatchSchema } from '../../../schemas/work-types.ts';

export const GET = route('signed-in', async (ctx, user) => {
  const workType = await getWorkType(db(), user.practiceId, idParam(ctx.params.id, 'Work type'));
  if (!workType) throw notFound('Work type');
  return json({ workType });
});

/** Changes a work type (new jobs take the new minutes; existing jobs keep theirs) or archives it. */
export const PATCH = route('dispatcher', async (ctx, user) => {
  const id = idParam(ctx.params.id, 'Work type');
  const patch = await readBody(ctx.request, workTypePatchSchema);
  await db().transaction(async (trx) => {
    if (!(await updateWorkType(trx, user.practiceId, id, patch))) throw notFound('Work type');
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: patch.archived === true ? 'work_type.archive' : 'work_type.update', entity: 'work_type', entityId: id, detail: patch });
  });
  return json({ workType: await getWorkType(db(), user.practiceId, id) });
});

/** Deletes a work type no horse or job uses; otherwise 409 with the reason. */
export const DELETE = route('dispatcher', async (ctx, user) => {
  const id = idParam(ctx.params.id, 'Work type');
  await db().transaction(async (trx) => {
    const row = await lockInPractice(trx, 'work_types', user.practiceId, id, ['name']);
    if (!row) throw notFound('Work type');
    const reason = await workTypeInUse(trx, id);
    if (reason) throw conflict(reason);
    await deleteWorkType(trx, user.practiceId, id);
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: 'work_type.delete', entity: 'work_type', entityId: id, detail: { name: row.name } });
  });
  return json({ deleted: true });
});
