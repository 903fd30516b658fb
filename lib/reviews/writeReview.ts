// Writing and changing a review. Each runs in one transaction holding the job row's lock, so the two
// sides' writes are seen in order: the second one opens both reviews to view at once.
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { Conflict, Forbidden, Invalid, NotFound } from '@/lib/errors';
import { lockJob, type JobRow } from '@/lib/payments/jobStates';
import { authorLabels, authorSide, reviewPeriodEnd } from './access';
import { aspectColumn, isEditable, toReviewView, type ReviewRow, type ReviewView } from './rows';
import { ASPECTS, otherSide, type ReviewEdit, type ReviewInput, type ReviewSide } from './schema';
import { REVIEW_SETTINGS, addDays } from './settings';

const day = (d: Date) => d.toISOString().slice(0, 10);
const UNIQUE_VIOLATION = '23505';
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

const SIDE_WORDS: Record<ReviewSide, string> = { rider: 'the rider', shop: 'the shop' };

/** The job must be completed and still inside its review period. */
function assertReviewable(job: JobRow, now: Date): void {
  const periodEnd = reviewPeriodEnd(job);
  if (job.status !== 'completed' || !periodEnd) throw new Conflict('A job can be reviewed once it is completed.');
  if (now.getTime() >= periodEnd.getTime()) throw new Conflict(`The review period for this job ended on ${day(periodEnd)} (UTC).`);
}

/** The rider reviews the shop, or a member of the shop reviews the rider: once per side per job. */
export async function createReview(db: Knex, actor: SessionUser, input: ReviewInput, now = new Date()): Promise<ReviewView> {
  try {
    return await db.transaction(async (trx) => {
      const job = await lockJob(trx, input.jobId);
      const side = authorSide(actor, job);
      if (side !== input.side) throw new Forbidden(`You are ${SIDE_WORDS[side]} on this job, so you review it as ${SIDE_WORDS[side]}.`);
      assertReviewable(job, now);
      if (await trx('reviews').where({ job_id: job.id, author_side: side }).first('id')) {
        throw new Conflict(side === 'rider' ? 'You have already reviewed this job; change that review instead.' : 'Your shop has already reviewed this job; change that review instead.');
      }
      const other = (await trx('reviews').where({ job_id: job.id, author_side: otherSide(side) }).first('id')) as { id: string } | undefined;
      // Both have written: both open to view now. Otherwise this one stays hidden until the period ends.
      const hiddenUntil = other ? now : reviewPeriodEnd(job)!;
      const aspects = input.aspects as Record<string, number>;
      const [row] = (await trx('reviews')
        .insert({
          job_id: job.id,
          author_side: side,
          author_id: actor.id,
          subject_shop_id: side === 'rider' ? job.shop_id : null,
          subject_rider_id: side === 'shop' ? job.rider_id : null,
          overall: input.overall,
          ...Object.fromEntries(ASPECTS[side].map((a) => [aspectColumn(a.key), aspects[a.key]])),
          body: input.text,
          editable_until: addDays(now, REVIEW_SETTINGS.editWindowDays),
          hidden_until: hiddenUntil,
          created_at: now,
          updated_at: now,
        })
        .returning('*')) as ReviewRow[];
      if (other) await trx('reviews').where({ id: other.id }).andWhere('hidden_until', '>', now).update({ hidden_until: now });
      const labels = await authorLabels(trx, job);
      return toReviewView(row, labels[side], isEditable(row, now));
    });
  } catch (err) {
    // Two writes for the same side that got past the check together: the unique index keeps one.
    if ((err as { code?: string }).code === UNIQUE_VIOLATION) throw new Conflict('This job already has a review from your side; change that review instead.');
    throw err;
  }
}

/** Changes the stars or text of one's own side's review, inside the edit window and while still hidden. */
export async function editReview(db: Knex, actor: SessionUser, reviewId: string, edit: ReviewEdit, now = new Date()): Promise<ReviewView> {
  if (!UUID.test(reviewId)) throw new NotFound('Review not found.');
  return db.transaction(async (trx) => {
    const found = (await trx('reviews').where({ id: reviewId }).first('job_id')) as { job_id: string } | undefined;
    if (!found) throw new NotFound('Review not found.');
    // Same lock order as createReview: the job first, then the review.
    const job = await lockJob(trx, found.job_id);
    const review = (await trx('reviews').where({ id: reviewId }).first().forUpdate()) as ReviewRow;
    let side: ReviewSide;
    try {
      side = authorSide(actor, job);
    } catch (err) {
      if (err instanceof NotFound) throw new NotFound('Review not found.');
      throw err;
    }
    if (side !== review.author_side) throw new Forbidden(`Only ${SIDE_WORDS[review.author_side]} can change this review.`);
    if (now.getTime() >= review.editable_until.getTime()) throw new Conflict(`This review could be changed until ${day(review.editable_until)} (UTC); that time has passed.`);
    if (now.getTime() >= review.hidden_until.getTime()) throw new Conflict('The other side can read this review now, so it can no longer change.');

    const changes: Record<string, unknown> = {};
    if (edit.overall !== undefined) changes.overall = edit.overall;
    if (edit.text !== undefined) changes.body = edit.text;
    const allowed = new Set<string>(ASPECTS[side].map((a) => a.key));
    const fieldErrors: Record<string, string[]> = {};
    for (const [key, stars] of Object.entries(edit.aspects ?? {})) {
      if (stars === undefined) continue;
      if (!allowed.has(key)) fieldErrors[`aspects.${key}`] = [`A review by ${SIDE_WORDS[side]} does not rate this.`];
      else changes[aspectColumn(key)] = stars;
    }
    if (Object.keys(fieldErrors).length) throw new Invalid('Some fields need attention.', fieldErrors);

    const [row] = (await trx('reviews')
      .where({ id: review.id })
      .update({ ...changes, updated_at: now })
      .returning('*')) as ReviewRow[];
    const labels = await authorLabels(trx, job);
    return toReviewView(row, labels[side], isEditable(row, now));
  });
}
