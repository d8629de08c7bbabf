import { route } from '../../lib/server/route.ts';
import { json, readJson, notFound } from '../../lib/server/http.ts';
import { settingsSchema } from '../../schemas/settings.ts';
import { getPractice, updatePractice } from '../../lib/db/practices.ts';
import { audit } from '../../lib/db/audit.ts';
import { db } from '../../lib/server/db.ts';

/** GET → {settings}: the practice's settings. */
export const GET = route('lead', async (_ctx, user) => {
  const practice = await getPractice(db(), user.practiceId);
  if (!practice) throw notFound('Practice');
  return json({ settings: practice });
});

/** PATCH {…any settings} → {settings}: writes the given settings in one transaction with its audit row. */
export const PATCH = route('lead', async (ctx, user) => {
  const input = await readJson(ctx.request, settingsSchema);
  await db().transaction(async (trx) => {
    await updatePractice(trx, user.practiceId, input);
    await audit(trx, { practiceId: user.practiceId, userId: user.id, action: 'settings.update', entity: 'practice', entityId: user.practiceId, detail: input });
  });
  return json({ settings: await getPractice(db(), user.practiceId) });
});
