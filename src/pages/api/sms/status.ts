import { route } from '../../../lib/server/route.ts';
import { db } from '../../../lib/server/db.ts';
import { readSignedForm, emptyTwiml } from '../../../lib/messaging/webhook.ts';
import { applyStatus } from '../../../lib/messaging/replies.ts';

/** Delivery reports for texts we sent (public, signature checked). */
export const POST = route('public', async (ctx) => {
  const form = await readSignedForm(ctx.request, ctx.url);
  const sid = form.MessageSid ?? form.SmsSid;
  const status = form.MessageStatus ?? form.SmsStatus;
  if (sid && status) await applyStatus(db(), sid, status, form.ErrorCode ?? null);
  return emptyTwiml();
});
