import { route } from '../../../../lib/server/route.ts';
import { idParam, json, notFound } from '../../../../lib/server/http.ts';
import { db } from '../../../../lib/server/db.ts';
import { planView, routeLines } from '../../../../lib/dispatch/view.ts';

/** GET → one road-following line per farrier (home, stops, home), for the map. */
export const GET = route('dispatcher', async (ctx) => {
  const id = idParam(ctx.params.id, 'Plan');
  const view = await planView(db(), ctx.locals.practice!, id);
  if (!view) throw notFound('Plan');
  return json({ version: view.version, lines: routeLines(view) });
});
