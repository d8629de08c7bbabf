import { route } from '../../../lib/server/route.ts';
import { db } from '../../../lib/server/db.ts';
import { readSignedForm, emptyTwiml } from '../../../lib/messaging/webhook.ts';
import { handleInbound } from '../../../lib/messaging/replies.ts';
import { ensureMessageTicker } from '../../../lib/messaging/ticker.ts';

/** Owners' replies, posted by the messaging service (public, signature checked). */
export const POST = route('public', async (ctx) => {
  ensureMessageTicker();
  const form = await readSignedForm(ctx.request, ctx.url);
  if (form.From && typeof form.Body === 'string') {
    await handleInbound(db(), { from: form.From, to: form.To ?? '', body: form.Body, providerId: form.MessageSid ?? null });
  }
  return emptyTwiml();
});
