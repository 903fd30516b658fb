import { db } from '@/lib/db';
import { route, withStatus } from '@/lib/http/route';
import { getJobReviews } from '@/lib/reviews/jobReviews';
import { jobReviewsQuerySchema, reviewInputSchema } from '@/lib/reviews/schema';
import { createReview } from '@/lib/reviews/writeReview';

// A job's reviews as the viewer may see them, and writing one's own side's review.
export const GET = route({ access: 'signed-in' }, async ({ req, user }) => {
  const { jobId } = jobReviewsQuerySchema.parse({ jobId: new URL(req.url).searchParams.get('jobId') });
  return getJobReviews(db, user!, jobId);
});

export const POST = route({ access: { roles: ['rider', 'builder'] }, body: reviewInputSchema }, async ({ user, body }) => withStatus(201, await createReview(db, user!, body)));
