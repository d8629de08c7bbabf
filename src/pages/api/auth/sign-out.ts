import { route } from '../../../lib/server/route.ts';
import { endSession } from '../../../lib/server/auth.ts';

/** POST → 204: ends the session in the database and clears the cookie. */
export const POST = route('signed-in', async (ctx) => {
  await endSession(ctx.cookies, ctx.locals.session);
  return new Response(null, { status: 204 });
});
