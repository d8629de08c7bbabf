import { route } from '../../../lib/server/route.ts';
import { readBody, readParams } from '../../../lib/records/read.ts';
import { json } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { audit } from '../../../lib/db/audit.ts';
import { createOwner, getOwner, listOwners } from '../../../lib/db/owners.ts';
import { ownerCreateSchema, ownerListQuery } from '../../../schemas/owners.ts';

/** One page of owners: search, sort, archived filter. */
export const GET = route('dispatcher', async (ctx, user) => json(await listOwners(db(), user.practiceId, readParams(ctx.url, ownerListQuery))));

/** Adds an owner; the phone is stored in E.164. */
export const POST = route('dispatcher', async (ctx, user) => {
  const input = await readBody(ctx.request, ownerCreateSchema);
  const id = await db().transaction(async (trx) => {
    const newId = await createOwner(trx, user.practiceId, input);
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: 'owner.create', entity: 'owner', entityId: newId, detail: { name: input.name } });
    return newId;
  });
  return json({ owner: await getOwner(db(), user.practiceId, id) }, 201);
});
