import { route } from '../../../lib/server/route.ts';
import { readBody, readParams } from '../../../lib/records/read.ts';
import { badRequest, json } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { audit } from '../../../lib/db/audit.ts';
import { createFarrierRecord, getFarrierRecord, linkUser, listFarrierRecords } from '../../../lib/db/farriers-records.ts';
import { farrierCreateSchema, farrierListQuery } from '../../../schemas/farriers.ts';

/** One page of the team's farriers (dispatchers plan with them). */
export const GET = route('dispatcher', async (ctx, user) => json(await listFarrierRecords(db(), user.practiceId, readParams(ctx.url, farrierListQuery))));

/** Adds a farrier to the team (the lead manages the team), optionally linked to a user account. */
export const POST = route('lead', async (ctx, user) => {
  const { userId, ...input } = await readBody(ctx.request, farrierCreateSchema);
  const id = await db().transaction(async (trx) => {
    const newId = await createFarrierRecord(trx, user.practiceId, { ...input });
    if (userId !== undefined) {
      const problem = await linkUser(trx, user.practiceId, newId, userId);
      if (problem) throw badRequest('Invalid body: check userId', { userId: problem });
    }
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: 'farrier.create', entity: 'farrier', entityId: newId, detail: { name: input.name, userId: userId ?? null } });
    return newId;
  });
  return json({ farrier: await getFarrierRecord(db(), user.practiceId, id) }, 201);
});
