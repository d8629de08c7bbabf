import { route } from '../../../lib/server/route.ts';
import { idParam, json, notFound, readJson } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { discardDraft, editPlan } from '../../../lib/dispatch/service.ts';
import { planView } from '../../../lib/dispatch/view.ts';
import { patchPlanSchema } from '../../../schemas/plans.ts';

/** GET → the plan with routes, stops and unplanned jobs. */
export const GET = route('dispatcher', async (ctx) => {
  const id = idParam(ctx.params.id, 'Plan');
  const view = await planView(db(), ctx.locals.practice!, id);
  if (!view) throw notFound('Plan');
  return json(view);
});

/**
 * PATCH {version, moves:[{jobId, toFarrierId, position?, pin?}]} → the re-timed plan. A stale version
 * is a 409 (stale_version) and changes nothing; what a move breaks comes back as warnings in words.
 */
export const PATCH = route('dispatcher', async (ctx, user) => {
  const id = idParam(ctx.params.id, 'Plan');
  const input = await readJson(ctx.request, patchPlanSchema);
  const practice = ctx.locals.practice!;
  const retimeMs = await editPlan(db(), practice, user, id, input);
  const view = await planView(db(), practice, id);
  return json({ ...view, retimeMs: Math.round(retimeMs * 10) / 10 }, 200, { 'server-timing': `retime;dur=${retimeMs.toFixed(1)}` });
});

/** DELETE → discards a draft (its jobs go back to due); a published plan answers 409. */
export const DELETE = route('dispatcher', async (ctx, user) => {
  const id = idParam(ctx.params.id, 'Plan');
  await discardDraft(db(), ctx.locals.practice!, user, id);
  return new Response(null, { status: 204 });
});
