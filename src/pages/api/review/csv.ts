import { route } from '../../../lib/server/route.ts';
import { readQuery, notFound } from '../../../lib/server/http.ts';
import { db } from '../../../lib/server/db.ts';
import { reviewQuerySchema } from '../../../schemas/review.ts';
import { loadReviewInput } from '../../../lib/db/review.ts';
import { computeReview } from '../../../lib/review/compute.ts';
import { reviewCsv } from '../../../lib/review/table.ts';

/** GET ?from&to → the review table as a CSV download: the same columns and figures as the page. Lead only. */
export const GET = route('lead', async (ctx, user) => {
  const { from, to } = readQuery(ctx.url, reviewQuerySchema);
  const practice = ctx.locals.practice;
  if (!practice || practice.id !== user.practiceId) throw notFound('Practice');
  const review = computeReview(await loadReviewInput(db(), practice, from, to));
  return new Response(reviewCsv(review), {
    status: 200,
    headers: {
      'content-type': 'text/csv; charset=utf-8',
      'content-disposition': `attachment; filename="review-${from}-to-${to}.csv"`,
      'cache-control': 'no-store',
    },
  });
});
