import { route } from '../../../lib/server/route.ts';
import { json, readJson, readQuery, HttpError } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { markSchema, progressQuerySchema } from '../../../schemas/visits.ts';
import { recordMark, dayProgress, MarkRefused } from '../../../lib/day-sheet/visits.ts';

/**
 * Marks a stop arrived, done or skipped. A replay of a mark already recorded (same clientKey) answers
 * 200 with replayed: true and changes nothing; a new mark answers 201.
 */
export const POST = route('signed-in', async (ctx, user) => {
  const input = await readJson(ctx.request, markSchema);
  try {
    const result = await recordMark(db(), user, input);
    return json(result, result.replayed ? 200 : 201);
  } catch (e) {
    if (e instanceof MarkRefused) {
      const code = e.status === 404 ? 'not_found' : e.status === 409 ? 'conflict' : 'invalid_request';
      throw new HttpError(e.status, code, e.message);
    }
    throw e;
  }
});

/**
 * Progress of a published day: every stop's planned, actual and re-estimated times. A farrier sees
 * only their own route; dispatcher and lead every route, or one with ?farrier=.
 */
export const GET = route('signed-in', async (ctx, user) => {
  const query = readQuery(ctx.url, progressQuerySchema);
  const farrierId = user.role === 'farrier' ? (user.farrierId ?? -1) : query.farrier;
  const routes = await dayProgress(db(), user.practiceId, query.date, farrierId);
  return json({ date: query.date, routes });
});
