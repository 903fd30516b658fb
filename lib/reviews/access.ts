// Who may review a job and from which side: the job's rider reviews the shop, the job's shop members review
// the rider. The job's sides come from the payments code's one answer to "who stands where on a job".
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { Forbidden } from '@/lib/errors';
import { requireSide, sideOf } from '@/lib/payments/jobAccess';
import type { JobRow } from '@/lib/payments/jobStates';
import { firstName } from './rows';
import type { ReviewSide } from './schema';
import { REVIEW_SETTINGS, addDays } from './settings';

export type ReviewViewerSide = ReviewSide | 'admin';

/** The viewer's side of the job, or NotFound for someone with no part in it. */
export function viewerSide(actor: SessionUser, job: Pick<JobRow, 'rider_id' | 'shop_id'>): ReviewViewerSide {
  const side = requireSide(actor, job, ['rider', 'builder', 'admin']);
  return side === 'builder' ? 'shop' : side;
}

/** The side the actor writes for; admins read reviews but do not write them. */
export function authorSide(actor: SessionUser, job: Pick<JobRow, 'rider_id' | 'shop_id'>): ReviewSide {
  const side = viewerSide(actor, job);
  if (side === 'admin') throw new Forbidden('Admins read reviews but do not write them.');
  return side;
}

export const isOnJob = (actor: SessionUser, job: Pick<JobRow, 'rider_id' | 'shop_id'>): boolean => sideOf(actor, job) !== null;

/** When the review period of a completed job ends: the last moment to write, and when hidden reviews open. */
export function reviewPeriodEnd(job: Pick<JobRow, 'completed_at'>): Date | null {
  return job.completed_at ? addDays(new Date(job.completed_at), REVIEW_SETTINGS.reviewPeriodDays) : null;
}

/** How an author is shown: a rider by first name, a shop by its name. */
export async function authorLabels(db: Knex, job: Pick<JobRow, 'rider_id' | 'shop_id'>): Promise<Record<ReviewSide, string>> {
  const rider = (await db('users').where({ id: job.rider_id }).first('name')) as { name: string } | undefined;
  const shop = (await db('shops').where({ id: job.shop_id }).first('name')) as { name: string } | undefined;
  return { rider: firstName(rider?.name), shop: shop?.name ?? 'The shop' };
}
