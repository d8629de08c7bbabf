import { route } from '../../../lib/server/route.ts';
import { readBody, readParams } from '../../../lib/records/read.ts';
import { badRequest, json } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { audit } from '../../../lib/db/audit.ts';
import { createHorse, getHorse, horseReferenceErrors, listHorses } from '../../../lib/db/horses.ts';
import { horseCreateSchema, horseListQuery } from '../../../schemas/horses.ts';

/** One page of horses; farriers read them too (their day sheet shows horse notes). */
export const GET = route('signed-in', async (ctx, user) => json(await listHorses(db(), user.practiceId, readParams(ctx.url, horseListQuery))));

/** Adds a horse at one of the practice's barns, with its owner, cycle and usual work. */
export const POST = route('dispatcher', async (ctx, user) => {
  const input = await readBody(ctx.request, horseCreateSchema);
  const id = await db().transaction(async (trx) => {
    const errors = await horseReferenceErrors(trx, user.practiceId, input);
    if (Object.keys(errors).length) throw badRequest(`Invalid body: check ${Object.keys(errors).join(', ')}`, errors);
    const newId = await createHorse(trx, user.practiceId, input);
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: 'horse.create', entity: 'horse', entityId: newId, detail: { name: input.name } });
    return newId;
  });
  return json({ horse: await getHorse(db(), user.practiceId, id) }, 201);
});
