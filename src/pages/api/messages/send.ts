import { route } from '../../../lib/server/route.ts';
import { json } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { sendDueMessages } from '../../../lib/messaging/arrival-texts.ts';

/**
 * Sends the texts that are due now (the ticker does this every half minute; the Messages page offers
 * it as a button). Texts in quiet hours stay queued whatever the caller wants.
 */
export const POST = route('dispatcher', async () => {
  const result = await sendDueMessages(db(), new Date());
  return json(result);
});
