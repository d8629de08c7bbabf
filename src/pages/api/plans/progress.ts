import { route } from '../../../lib/server/route.ts';
import { json, readQuery } from '../../../lib/server/http.ts';
import { runProgress } from '../../../lib/dispatch/progress.ts';
import { planDateQuerySchema } from '../../../schemas/plans.ts';

/** GET ?date= → how far the engine has got planning that day (polled by the board while it works). */
export const GET = route('dispatcher', async (ctx) => {
  const { date } = readQuery(ctx.url, planDateQuerySchema);
  return json(runProgress(ctx.locals.practice!.id, date));
});
