import { route } from '../../../lib/server/route.ts';
import { json, readJson } from '../../../lib/server/http.ts';
import { acceptInviteSchema } from '../../../schemas/auth.ts';
import { acceptInvite } from '../../../lib/server/team.ts';

/** POST {token, password, name?} → 201: sets the invited person's password once. */
export const POST = route('public', async (ctx) => {
  const input = await readJson(ctx.request, acceptInviteSchema);
  const account = await acceptInvite(input.token, input.password, input.name);
  return json({ account }, 201);
});
