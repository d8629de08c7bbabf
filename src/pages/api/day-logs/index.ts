import { route } from '../../../lib/server/route.ts';
import { json, readJson, readQuery } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { dayMarkSchema, dayLogQuerySchema } from '../../../schemas/day-logs.ts';
import { recordDayMark, dayLogsOf, DayMarkRefused, refusal } from '../../../lib/day-sheet/day-logs.ts';

/**
 * "Start the day" or "Back home" from the day sheet, with an optional odometer reading. A replay of a
 * mark already recorded (same clientKey) answers 200 with replayed: true and changes nothing; a new
 * mark answers 201 with the day log. Out of order (back home before a start, a second start) is a 409.
 */
export const POST = route('signed-in', async (ctx, user) => {
  const input = await readJson(ctx.request, dayMarkSchema);
  const practice = ctx.locals.practice!;
  try {
    const result = await recordDayMark(db(), user, input, { units: practice.units, timeZone: practice.timeZone });
    return json(result, result.replayed ? 200 : 201);
  } catch (e) {
    if (e instanceof DayMarkRefused) throw refusal(e);
    throw e;
  }
});

/**
 * The day logs of a date: a farrier sees only their own; dispatcher and lead every farrier's, or one
 * with ?farrier=.
 */
export const GET = route('signed-in', async (ctx, user) => {
  const query = readQuery(ctx.url, dayLogQuerySchema);
  const farrierId = user.role === 'farrier' ? (user.farrierId ?? -1) : query.farrier;
  return json({ date: query.date, dayLogs: await dayLogsOf(db(), user.practiceId, query.date, farrierId) });
});
