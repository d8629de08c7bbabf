import { route } from '../../../lib/server/route.ts';
import { json, notFound, readJson, readQuery } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { getPlanByDate } from '../../../lib/db/plans.ts';
import { planDay, type PlanTimings } from '../../../lib/dispatch/service.ts';
import { planView } from '../../../lib/dispatch/view.ts';
import { createPlanSchema, DEFAULT_BUDGET_SECONDS, planDateQuerySchema } from '../../../schemas/plans.ts';

/** POST {date, budgetSeconds?} → 201 with the new draft: the engine plans the day in a worker thread. */
export const POST = route('dispatcher', async (ctx, user) => {
  const input = await readJson(ctx.request, createPlanSchema);
  const practice = ctx.locals.practice!;
  const timings: PlanTimings = {};
  const id = await planDay(db(), practice, user, { date: input.date, budgetSeconds: input.budgetSeconds ?? DEFAULT_BUDGET_SECONDS, timings });
  const t0 = performance.now();
  const view = await planView(db(), practice, id);
  const viewMs = performance.now() - t0;
  // Server-Timing names each phase of the request (read, matrix, problem, solve, engine, check, write, view).
  const serverTiming = [...Object.entries(timings), ['viewMs', viewMs] as const]
    .map(([k, ms]) => `${k.replace(/Ms$/, '')};dur=${(ms as number).toFixed(1)}`)
    .join(', ');
  return json(view, 201, { 'server-timing': serverTiming });
});

/** GET ?date=YYYY-MM-DD → the plan of that day, or 404. */
export const GET = route('dispatcher', async (ctx) => {
  const { date } = readQuery(ctx.url, planDateQuerySchema);
  const practice = ctx.locals.practice!;
  const plan = await getPlanByDate(db(), practice.id, date);
  if (!plan) throw notFound('Plan');
  return json(await planView(db(), practice, plan.id));
});
