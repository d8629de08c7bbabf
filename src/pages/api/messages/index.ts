import { route } from '../../../lib/server/route.ts';
import { json, readQuery } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { messagesQuerySchema, type MessageItem } from '../../../schemas/messages.ts';
import { listMessages } from '../../../lib/messaging/message-log.ts';
import { ensureMessageTicker } from '../../../lib/messaging/ticker.ts';

/** Every text and e-mail of a day (GET /api/messages?date=YYYY-MM-DD). */
export const GET = route('dispatcher', async (ctx, user) => {
  ensureMessageTicker();
  const { date } = readQuery(ctx.url, messagesQuerySchema);
  const rows = await listMessages(db(), user.practiceId, date, ctx.locals.practice!.timeZone);
  const messages: (MessageItem & Record<string, unknown>)[] = rows.map((m) => ({
    id: m.id,
    channel: m.channel,
    to: m.to,
    body: m.body,
    segments: m.segments,
    encoding: m.encoding,
    state: m.state,
    stopId: m.stopId,
    direction: m.direction,
    from: m.from,
    subject: m.subject,
    ownerId: m.ownerId,
    ownerName: m.ownerName,
    sendAfter: m.sendAfter,
    sentAt: m.sentAt,
    createdAt: m.createdAt,
    error: m.error,
  }));
  return json({ messages });
});
