import { route } from '../../../lib/server/route.ts';
import { readBody, readParams } from '../../../lib/records/read.ts';
import { badRequest, json } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { audit } from '../../../lib/db/audit.ts';
import { createBarn, getBarn, listBarns, ownerBelongs } from '../../../lib/db/barns.ts';
import { barnCreateSchema, barnListQuery } from '../../../schemas/barns.ts';

/** One page of barns; farriers read them too (their day sheet shows barn notes and hours). */
export const GET = route('signed-in', async (ctx, user) => json(await listBarns(db(), user.practiceId, readParams(ctx.url, barnListQuery))));

/** Adds a barn with its pin, access hours and set-up minutes. */
export const POST = route('dispatcher', async (ctx, user) => {
  const input = await readBody(ctx.request, barnCreateSchema);
  const id = await db().transaction(async (trx) => {
    if (input.ownerId && !(await ownerBelongs(trx, user.practiceId, input.ownerId))) throw badRequest('Invalid body: check ownerId', { ownerId: 'Choose one of the practice’s owners' });
    const newId = await createBarn(trx, user.practiceId, input);
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: 'barn.create', entity: 'barn', entityId: newId, detail: { name: input.name } });
    return newId;
  });
  return json({ barn: await getBarn(db(), user.practiceId, id) }, 201);
});
