import type { APIRoute } from 'astro';
import { endSession } from '../lib/server/auth.ts';

/** The navigation's sign-out form: ends the session server-side and returns to the sign-in page. */
export const POST = (async (ctx) => {
  await endSession(ctx.cookies, ctx.locals.session);
  return ctx.redirect('/sign-in', 303);
}) satisfies APIRoute;
