import { route } from '../../../lib/server/route.ts';
import { readBody, readParams } from '../../../lib/records/read.ts';
import { json } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { audit } from '../../../lib/db/audit.ts';
import { createWorkType, getWorkType, listWorkTypes } from '../../../lib/db/work-types.ts';
import { workTypeCreateSchema, workTypeListQuery } from '../../../schemas/work-types.ts';

/** One page of work types; farriers read them (their day sheet names the work). */
export const GET = route('signed-in', async (ctx, user) => json(await listWorkTypes(db(), user.practiceId, readParams(ctx.url, workTypeListQuery))));

/** Adds a work type; a name already used in the practice is a 409. */
export const POST = route('dispatcher', async (ctx, user) => {
  const input = await readBody(ctx.request, workTypeCreateSchema);
  const id = await db().transaction(async (trx) => {
    const newId = await createWorkType(trx, user.practiceId, input);
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: 'work_type.create', entity: 'work_type', entityId: newId, detail: input });
    return newId;
  });
  return json({ workType: await getWorkType(db(), user.practiceId, id) }, 201);
});
