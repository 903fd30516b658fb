import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { reviewEditSchema, type ReviewEdit } from '@/lib/reviews/schema';
import { editReview } from '@/lib/reviews/writeReview';

// Changing one's own side's review while the edit window is open and the other side cannot read it yet.
export const PATCH = route<ReviewEdit, { id: string }>({ access: { roles: ['rider', 'builder'] }, body: reviewEditSchema }, async ({ user, params, body }) =>
  editReview(db, user!, params.id, body),
);
