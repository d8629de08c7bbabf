import { route } from '../../../../lib/server/route.ts';
import { idParam, json, readJson } from '../../../../lib/server/http.ts';
import { db } from '../../../../lib/server/db.ts';
import { publishPlan } from '../../../../lib/dispatch/service.ts';
import { planView } from '../../../../lib/dispatch/view.ts';
import { publishPlanSchema } from '../../../../schemas/plans.ts';
import { emailDaySheets } from '../../../../lib/messaging/day-sheet-mail.ts';
import { sendDueMessages } from '../../../../lib/messaging/arrival-texts.ts';

/**
 * POST {version} → the published plan: jobs booked and owners' arrival-window texts queued in one
 * transaction; then, outside it, each farrier gets the day sheet link by e-mail and the texts that may
 * go now (outside quiet hours) are sent. A failed send is recorded on its message row and retried by
 * the ticker; it never undoes the publish.
 */
export const POST = route('dispatcher', async (ctx, user) => {
  const id = idParam(ctx.params.id, 'Plan');
  const { version } = await readJson(ctx.request, publishPlanSchema);
  const practice = ctx.locals.practice!;
  await publishPlan(db(), practice, user, id, version);
  try {
    await emailDaySheets(db(), { practiceId: practice.id, planId: id });
    await sendDueMessages(db(), new Date(), { planId: id });
  } catch (error) {
    console.error('[publish] sending after publish failed; the ticker retries texts:', error instanceof Error ? error.message : error);
  }
  return json(await planView(db(), practice, id));
});
