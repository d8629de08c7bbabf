import { route } from '../../../lib/server/route.ts';
import { json, readJson, idParam } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { dayLogCorrectionSchema } from '../../../schemas/day-logs.ts';
import { correctDayLog, DayMarkRefused, refusal } from '../../../lib/day-sheet/day-logs.ts';

/**
 * A dispatcher's or lead's correction of a farrier's day (start, end, odometer readings) with a
 * reason; the distance is worked out again from the readings and an audit row keeps before and after.
 */
export const PATCH = route('dispatcher', async (ctx, user) => {
  const id = idParam(ctx.params.id, 'Day log');
  const input = await readJson(ctx.request, dayLogCorrectionSchema);
  const practice = ctx.locals.practice!;
  try {
    return json({ dayLog: await correctDayLog(db(), user, id, input, { units: practice.units, timeZone: practice.timeZone }) });
  } catch (e) {
    if (e instanceof DayMarkRefused) throw refusal(e);
    throw e;
  }
});
