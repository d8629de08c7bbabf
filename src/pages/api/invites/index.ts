import { route } from '../../../lib/server/route.ts';
import { json, readJson } from '../../../lib/server/http.ts';
import { inviteSchema } from '../../../schemas/auth.ts';
import { invite } from '../../../lib/server/team.ts';
import { listInvites } from '../../../lib/db/invites.ts';
import { db } from '../../../lib/server/db.ts';

/** GET → {invites}: the practice's invitations, newest first. */
export const GET = route('lead', async (_ctx, user) => json({ invites: await listInvites(db(), user.practiceId) }));

/** POST {email, name, role, farrierId?} → 201: creates the invite and e-mails its link. */
export const POST = route('lead', async (ctx, user) => {
  const input = await readJson(ctx.request, inviteSchema);
  const created = await invite(user, input, process.env.APP_URL ?? ctx.url.origin);
  return json({ invite: created }, 201);
});
