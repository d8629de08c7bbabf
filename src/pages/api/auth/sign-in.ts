import { route } from '../../../lib/server/route.ts';
import { json, readJson } from '../../../lib/server/http.ts';
import { signInSchema } from '../../../schemas/auth.ts';
import { signIn } from '../../../lib/server/sign-in.ts';

/** POST {email, password} → 200 {user} with the session cookie; 401 for any wrong pair; 429 when limited. */
export const POST = route('public', async (ctx) => {
  const input = await readJson(ctx.request, signInSchema);
  const user = await signIn(ctx.cookies, input, ctx.clientAddress);
  return json({ user: { id: user.id, email: user.email, name: user.name, role: user.role } });
});
