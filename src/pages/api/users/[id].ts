import { z } from 'zod';
import { route } from '../../../lib/server/route.ts';
import { badRequest, idParam, json, notFound, readJson } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { audit } from '../../../lib/db/audit.ts';
import { listUsers } from '../../../lib/db/users.ts';

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
    const row = await trx('users').where({ id, practice_id: lead.practiceId }).forUpdate().first('id');
    if (!row) throw notFound('User');
    const change: Record<string, unknown> = { updated_at: trx.fn.now(3) };
    if (input.role) change.role = input.role;
    if (input.active !== undefined) change.active = input.active;
    await trx('users').where({ id }).update(change);
    if (input.active === false) await trx('user_sessions').where({ user_id: id }).delete();
    await audit(trx, { practiceId: lead.practiceId, userId: lead.id, action: 'user.update', entity: 'user', entityId: id, detail: input });
  });
  const user = (await listUsers(knex, lead.practiceId)).find((u) => u.id === id);
  return json({ user });
});
