import { route } from '../../../lib/server/route.ts';
import { readBody } from '../../../lib/records/read.ts';
import { badRequest, conflict, idParam, json, notFound } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { audit } from '../../../lib/db/audit.ts';
import { lockInPractice } from '../../../lib/db/records-lock.ts';
import { barnInUse, deleteBarn, getBarn, ownerBelongs, updateBarn } from '../../../lib/db/barns.ts';
import { barnPatchSchema } from '../../../schemas/barns.ts';

export const GET = route('signed-in', async (ctx, user) => {
  const barn = await getBarn(db(), user.practiceId, idParam(ctx.params.id, 'Barn'));
  if (!barn) throw notFound('Barn');
  return json({ barn });
});

/** Changes a barn (moving its pin, hours, notes), or archives it keeping its visit history. */
export const PATCH = route('dispatcher', async (ctx, user) => {
  const id = idParam(ctx.params.id, 'Barn');
  const patch = await readBody(ctx.request, barnPatchSchema);
  await db().transaction(async (trx) => {
    if (patch.ownerId && !(await ownerBelongs(trx, user.practiceId, patch.ownerId))) throw badRequest('Invalid body: check ownerId', { ownerId: 'Choose one of the practice’s owners' });
    if (!(await updateBarn(trx, user.practiceId, id, patch))) throw notFound('Barn');
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: patch.archived === true ? 'barn.archive' : 'barn.update', entity: 'barn', entityId: id, detail: patch });
  });
  return json({ barn: await getBarn(db(), user.practiceId, id) });
});

/** Deletes a barn nothing refers to; otherwise 409 with the reason. */
export const DELETE = route('dispatcher', async (ctx, user) => {
  const id = idParam(ctx.params.id, 'Barn');
  await db().transaction(async (trx) => {
    const barn = await lockInPractice(trx, 'barns', user.practiceId, id, ['name']);
    if (!barn) throw notFound('Barn');
    const reason = await barnInUse(trx, id);
    if (reason) throw conflict(reason);
    await deleteBarn(trx, user.practiceId, id);
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: 'barn.delete', entity: 'barn', entityId: id, detail: { name: barn.name } });
  });
  return json({ deleted: true });
});
