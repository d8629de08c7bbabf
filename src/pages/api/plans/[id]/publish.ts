import { route } from '../../../../lib/server/route.ts';
import { idParam, json, readJson } from '../../../../lib/server/http.ts';
import { db } from '../../../../lib/server/db.ts';
import { publishPlan } from '../../../../lib/dispatch/service.ts';
import { planView } from '../../../../lib/dispatch/view.ts';
import { publishPlanSchema } from '../../../../schemas/plans.ts';

/** POST {version} → the published plan: jobs booked, owners' arrival-window messages queued. */
export const POST = route('dispatcher', async (ctx, user) => {
  const id = idParam(ctx.params.id, 'Plan');
  const { version } = await readJson(ctx.request, publishPlanSchema);
  const practice = ctx.locals.practice!;
  await publishPlan(db(), practice, user, id, version);
  return json(await planView(db(), practice, id));
});
