import { route } from '../../../lib/server/route.ts';
import { json, readQuery, notFound } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { reviewQuerySchema } from '../../../schemas/review.ts';
import { loadReviewInput } from '../../../lib/db/review.ts';
import { computeReview } from '../../../lib/review/compute.ts';

/**
 * GET ?from=YYYY-MM-DD&to=YYYY-MM-DD → the review of that range: per farrier planned and actual
 * hours, overtime under the practice's rule, drive time, distance and mileage cost, horses, skipped
 * stops and revenue; team totals; per-week and per-day figures for the charts. Lead only.
 */
export const GET = route('lead', async (ctx, user) => {
  const { from, to } = readQuery(ctx.url, reviewQuerySchema);
  const practice = ctx.locals.practice;
  if (!practice || practice.id !== user.practiceId) throw notFound('Practice');
  const review = computeReview(await loadReviewInput(db(), practice, from, to));
  return json(review);
});
