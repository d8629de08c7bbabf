import { route } from '../../lib/server/route.ts';
import { json, notFound } from '../../lib/server/http.ts';

/** GET → {user, practice}: who is signed in and the practice's basic settings. */
export const GET = route('signed-in', async (ctx, user) => {
  const practice = ctx.locals.practice;
  if (!practice) throw notFound('Practice');
  return json({
    user: { id: user.id, email: user.email, name: user.name, role: user.role, farrierId: user.farrierId },
    practice: { id: practice.id, name: practice.name, timeZone: practice.timeZone, units: practice.units },
  });
});
