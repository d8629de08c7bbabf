import { z } from 'zod';
import { route } from '../../../lib/server/route.ts';
import { badRequest, idParam, json, notFound, readJson } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { audit } from '../../../lib/db/audit.ts';
import { lockInPractice } from '../../../lib/db/records-lock.ts';
import { listUsers, updateUserAccount } from '../../../lib/db/users.ts';

const patchSchema = z
  .object({ role: z.enum(['lead', 'dispatcher', 'farrier']), active: z.boolean() })
  .partial()
  .refine((v) => v.role !== undefined || v.active !== undefined, 'Give role or active');

/** PATCH {role?, active?} → the user: the lead changes a role or (de)activates an account. */
export const PATCH = route('lead', async (ctx, lead) => {
  const id = idParam(ctx.params.id, 'User');
  const input = await readJson(ctx.request, patchSchema);
  if (id === lead.id) throw badRequest('You cannot change your own account here', { role: 'Ask another lead' });
  const knex = db();
  await knex.transaction(async (trx) => {
    if (!(await lockInPractice(trx, 'users', lead.practiceId, id, ['id']))) throw notFound('User');
    await updateUserAccount(trx, id, input);
    await audit(trx, { practiceId: lead.practiceId, userId: lead.id, action: 'user.update', entity: 'user', entityId: id, detail: input });
  });
  const user = (await listUsers(knex, lead.practiceId)).find((u) => u.id === id);
  return json({ user });
});
