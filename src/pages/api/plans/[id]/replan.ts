import { route } from '../../../../lib/server/route.ts';
import { idParam, json, notFound, readJson } from '../../../../lib/server/http.ts';
import { db } from '../../../../lib/server/db.ts';
import { getPlan } from '../../../../lib/db/plans.ts';
import { planDay } from '../../../../lib/dispatch/service.ts';
import { planView } from '../../../../lib/dispatch/view.ts';
import { DEFAULT_BUDGET_SECONDS, replanSchema } from '../../../../schemas/plans.ts';

/** POST {version, budgetSeconds?} → the plan re-solved around its pinned jobs ("Re-plan the rest"). */
export const POST = route('dispatcher', async (ctx, user) => {
  const id = idParam(ctx.params.id, 'Plan');
  const input = await readJson(ctx.request, replanSchema);
  const practice = ctx.locals.practice!;
  const plan = await getPlan(db(), practice.id, id);
  if (!plan) throw notFound('Plan');
  await planDay(db(), practice, user, { date: plan.date, budgetSeconds: input.budgetSeconds ?? DEFAULT_BUDGET_SECONDS, replan: { planId: id, version: input.version } });
  return json(await planView(db(), practice, id));
});
