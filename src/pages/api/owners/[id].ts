import { route } from '../../../lib/server/route.ts';
import { readBody } from '../../../lib/records/read.ts';
import { conflict, idParam, json, notFound } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { audit } from '../../../lib/db/audit.ts';
import { lockInPractice } from '../../../lib/db/records-lock.ts';
import { deleteOwner, getOwner, ownerInUse, updateOwner } from '../../../lib/db/owners.ts';
import { ownerPatchSchema } from '../../../schemas/owners.ts';

export const GET = route('dispatcher', async (ctx, user) => {
  const owner = await getOwner(db(), user.practiceId, idParam(ctx.params.id, 'Owner'));
  if (!owner) throw notFound('Owner');
  return json({ owner });
});

/** Changes an owner, or archives it (`archived: true`) keeping its horses' history. */
export const PATCH = route('dispatcher', async (ctx, user) => {
  const id = idParam(ctx.params.id, 'Owner');
  const patch = await readBody(ctx.request, ownerPatchSchema);
  await db().transaction(async (trx) => {
    if (!(await updateOwner(trx, user.practiceId, id, patch))) throw notFound('Owner');
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: patch.archived === true ? 'owner.archive' : 'owner.update', entity: 'owner', entityId: id, detail: patch });
  });
  return json({ owner: await getOwner(db(), user.practiceId, id) });
});

/** Deletes an owner nothing refers to; otherwise 409 with the reason. */
export const DELETE = route('dispatcher', async (ctx, user) => {
  const id = idParam(ctx.params.id, 'Owner');
  await db().transaction(async (trx) => {
    const owner = await lockInPractice(trx, 'owners', user.practiceId, id, ['name']);
    if (!owner) throw notFound('Owner');
    const reason = await ownerInUse(trx, id);
    if (reason) throw conflict(reason);
    await deleteOwner(trx, user.practiceId, id);
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: 'owner.delete', entity: 'owner', entityId: id, detail: { name: owner.name } });
  });
  return json({ deleted: true });
});
