import { route } from '../../../lib/server/route.ts';
import { readBody } from '../../../lib/records/read.ts';
import { badRequest, conflict, idParam, json, notFound } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { audit } from '../../../lib/db/audit.ts';
import { lockInPractice } from '../../../lib/db/records-lock.ts';
import { deleteFarrierRecord, farrierInUse, getFarrierRecord, linkUser, updateFarrierRecord } from '../../../lib/db/farriers-records.ts';
import { farrierPatchSchema } from '../../../schemas/farriers.ts';

export const GET = route('dispatcher', async (ctx, user) => {
  const farrier = await getFarrierRecord(db(), user.practiceId, idParam(ctx.params.id, 'Farrier'));
  if (!farrier) throw notFound('Farrier');
  return json({ farrier });
});

/** Changes a farrier (pattern, skills, truck, cost, user link) or archives them. */
export const PATCH = route('lead', async (ctx, user) => {
  const id = idParam(ctx.params.id, 'Farrier');
  const { userId, ...patch } = await readBody(ctx.request, farrierPatchSchema);
  await db().transaction(async (trx) => {
    const current = await getFarrierRecord(trx, user.practiceId, id);
    if (!current) throw notFound('Farrier');
    // Cross-field rules against the stored values for the fields not sent.
    const start = patch.shiftStartMinute ?? current.shiftStartMinute;
    const end = patch.shiftEndMinute ?? current.shiftEndMinute;
    if (end <= start) throw badRequest('Invalid body: check shiftEndMinute', { shiftEndMinute: 'The day must end after it starts' });
    if ((patch.apprentice ?? current.apprentice) && (patch.qualifiedTherapeutic ?? current.qualifiedTherapeutic)) throw badRequest('Invalid body: check qualifiedTherapeutic', { qualifiedTherapeutic: 'An apprentice does not take therapeutic work' });
    await updateFarrierRecord(trx, user.practiceId, id, patch);
    if (userId !== undefined) {
      const problem = await linkUser(trx, user.practiceId, id, userId);
      if (problem) throw badRequest('Invalid body: check userId', { userId: problem });
    }
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: patch.archived === true ? 'farrier.archive' : 'farrier.update', entity: 'farrier', entityId: id, detail: { ...patch, userId } });
  });
  return json({ farrier: await getFarrierRecord(db(), user.practiceId, id) });
});

/** Deletes a farrier with no routes, recorded work, pins or linked user; otherwise 409 with the reason. */
export const DELETE = route('lead', async (ctx, user) => {
  const id = idParam(ctx.params.id, 'Farrier');
  await db().transaction(async (trx) => {
    const row = await lockInPractice(trx, 'farriers', user.practiceId, id, ['name']);
    if (!row) throw notFound('Farrier');
    const reason = await farrierInUse(trx, id);
    if (reason) throw conflict(reason);
    await deleteFarrierRecord(trx, user.practiceId, id);
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: 'farrier.delete', entity: 'farrier', entityId: id, detail: { name: row.name } });
  });
  return json({ deleted: true });
});
