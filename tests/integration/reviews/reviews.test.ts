// Two-way reviews of a completed job: who may write, one per side, the edit window and double-blind visibility.
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Conflict, Forbidden, Invalid, NotFound } from '@/lib/errors';
import { getJobReviews } from '@/lib/reviews/jobReviews';
import { REVIEW_SETTINGS } from '@/lib/reviews/settings';
import { createReview, editReview } from '@/lib/reviews/writeReview';
import { testDb } from '../../support/db';
import { addMember, daysAfter, makeAdmin, makeJob, makeRider, makeShop, riderReviewInput, shopReviewInput } from './support';

let db: Knex;
beforeAll(() => {
  db = testDb();
});
afterAll(() => db?.destroy());

/** A rider, a shop with a builder, and a job that completed at `completedAt`. */
async function completedJob(completedAt = new Date()) {
  const rider = await makeRider(db);
  const builder = await makeShop(db);
  const { jobId } = await makeJob(db, rider, builder.shopId, { completedAt });
  return { rider, builder, jobId, completedAt };
}

describe('who may write a review', () => {
  it('the rider reviews the shop and a member of the shop reviews the rider, once the job is completed', async () => {
    const { rider, builder, jobId } = await completedJob();
    const byRider = await createReview(db, rider, shopReviewInput(jobId, 5));
    expect(byRider).toMatchObject({ side: 'rider', overall: 5, authorLabel: 'Ottilie', canEdit: true });
    expect(byRider.aspects.map((a) => a.key)).toEqual(['buildQuality', 'communication', 'onTime']);
    const colleague = await addMember(db, builder.shopId);
    const byShop = await createReview(db, colleague, riderReviewInput(jobId, 4));
    expect(byShop).toMatchObject({ side: 'shop', overall: 4, aspects: [{ key: 'clearSpec' }, { key: 'communication' }, { key: 'payment' }] });
    const rows = await db('reviews').where({ job_id: jobId }).orderBy('author_side');
    expect(rows.map((r) => [r.author_side, r.subject_shop_id, r.subject_rider_id])).toEqual([
      ['rider', builder.shopId, null],
      ['shop', null, rider.id],
    ]);
  });

  it('refuses a job that is not completed yet', async () => {
    const rider = await makeRider(db);
    const builder = await makeShop(db);
    for (const status of ['funded', 'shipped', 'disputed']) {
      const { jobId } = await makeJob(db, rider, builder.shopId, { status });
      await expect(createReview(db, rider, shopReviewInput(jobId))).rejects.toThrow(Conflict);
      await expect(createReview(db, builder, riderReviewInput(jobId))).rejects.toThrow(/once it is completed/);
    }
  });

  it('hides the job from outsiders (404), refuses admins (403) and a writer posing as the other side (403)', async () => {
    const { rider, builder, jobId } = await completedJob();
    const stranger = await makeRider(db);
    const otherShop = await makeShop(db);
    await expect(createReview(db, stranger, shopReviewInput(jobId))).rejects.toThrow(NotFound);
    await expect(createReview(db, otherShop, riderReviewInput(jobId))).rejects.toThrow(NotFound);
    await expect(createReview(db, await makeAdmin(db), shopReviewInput(jobId))).rejects.toThrow(Forbidden);
    await expect(createReview(db, rider, { ...riderReviewInput(jobId) })).rejects.toThrow(Forbidden);
    await expect(createReview(db, builder, { ...shopReviewInput(jobId) })).rejects.toThrow(Forbidden);
    await expect(getJobReviews(db, stranger, jobId)).rejects.toThrow(NotFound);
    expect(await db('reviews').where({ job_id: jobId })).toHaveLength(0);
  });

  it('closes writing when the review period after completion ends', async () => {
    const completedAt = daysAfter(new Date(), -(REVIEW_SETTINGS.reviewPeriodDays + 1));
    const { rider, jobId } = await completedJob(completedAt);
    await expect(createReview(db, rider, shopReviewInput(jobId))).rejects.toThrow(/review period for this job ended/);
    expect((await getJobReviews(db, rider, jobId)).canWrite).toBe(false);
  });
});

describe('one review per side per job', () => {
  it('answers a second review from the same side with 409', async () => {
    const { rider, builder, jobId } = await completedJob();
    await createReview(db, rider, shopReviewInput(jobId));
    await expect(createReview(db, rider, shopReviewInput(jobId, 1))).rejects.toThrow(Conflict);
    await createReview(db, builder, riderReviewInput(jobId));
    const colleague = await addMember(db, builder.shopId);
    await expect(createReview(db, colleague, riderReviewInput(jobId, 2))).rejects.toThrow(/already reviewed/);
    expect(await db('reviews').where({ job_id: jobId })).toHaveLength(2);
  });

  it('keeps one row when two writes for the same side race', async () => {
    const { builder, jobId } = await completedJob();
    const colleague = await addMember(db, builder.shopId);
    const results = await Promise.allSettled([createReview(db, builder, riderReviewInput(jobId, 5)), createReview(db, colleague, riderReviewInput(jobId, 2))]);
    expect(results.filter((r) => r.status === 'fulfilled')).toHaveLength(1);
    const failed = results.find((r) => r.status === 'rejected') as PromiseRejectedResult;
    expect(failed.reason).toBeInstanceOf(Conflict);
    expect(await db('reviews').where({ job_id: jobId, author_side: 'shop' })).toHaveLength(1);
  });

  it('the database refuses a second row for the same side even without the domain check', async () => {
    const { rider, builder, jobId } = await completedJob();
    await createReview(db, rider, shopReviewInput(jobId));
    const row = await db('reviews').where({ job_id: jobId }).first();
    const { id: _id, ...copy } = row;
    void _id;
    await expect(db('reviews').insert(copy)).rejects.toThrow(/reviews_one_per_side/);
    await expect(db('reviews').insert({ ...copy, author_side: 'shop' })).rejects.toThrow(/reviews_subject_check|reviews_aspects_check/);
    void builder;
  });
});

describe('double-blind visibility', () => {
  it('neither side sees the other’s review until both have written; then both do', async () => {
    const { rider, builder, jobId } = await completedJob();
    await createReview(db, rider, shopReviewInput(jobId, 2, 'Wobbly rear.'));

    const shopView = await getJobReviews(db, builder, jobId);
    expect(shopView).toMatchObject({ viewerSide: 'shop', canWrite: true, byRider: null, byShop: null, written: { rider: true, shop: false } });
    const riderView = await getJobReviews(db, rider, jobId);
    expect(riderView).toMatchObject({ viewerSide: 'rider', canWrite: false, byRider: { overall: 2, text: 'Wobbly rear.', canEdit: true }, byShop: null });

    await createReview(db, builder, riderReviewInput(jobId, 5));
    const after = await getJobReviews(db, builder, jobId);
    expect(after.byRider).toMatchObject({ overall: 2, text: 'Wobbly rear.', canEdit: false });
    expect(after.byShop).toMatchObject({ overall: 5, canEdit: false });
    expect((await getJobReviews(db, rider, jobId)).byShop).toMatchObject({ overall: 5 });
  });

  it('opens a lone review to the other side once the review period has passed', async () => {
    const completedAt = new Date();
    const { rider, builder, jobId } = await completedJob(completedAt);
    await createReview(db, rider, shopReviewInput(jobId, 4), daysAfter(completedAt, 1));
    const justBefore = daysAfter(completedAt, REVIEW_SETTINGS.reviewPeriodDays - 0.01);
    const periodOver = daysAfter(completedAt, REVIEW_SETTINGS.reviewPeriodDays);
    expect((await getJobReviews(db, builder, jobId, justBefore)).byRider).toBeNull();
    expect((await getJobReviews(db, builder, jobId, periodOver)).byRider).toMatchObject({ overall: 4 });
    expect((await getJobReviews(db, builder, jobId, periodOver)).canWrite).toBe(false);
  });

  it('lets an admin read both reviews while they are still hidden from the sides', async () => {
    const { rider, builder, jobId } = await completedJob();
    await createReview(db, rider, shopReviewInput(jobId, 3));
    const adminView = await getJobReviews(db, await makeAdmin(db), jobId);
    expect(adminView).toMatchObject({ viewerSide: 'admin', canWrite: false, byRider: { overall: 3, canEdit: false } });
    expect((await getJobReviews(db, builder, jobId)).byRider).toBeNull();
  });
});

describe('changing a review', () => {
  it('lets the author’s side change stars and text inside the edit window', async () => {
    const { rider, jobId, completedAt } = await completedJob();
    const written = await createReview(db, rider, shopReviewInput(jobId, 3), completedAt);
    const edited = await editReview(db, rider, written.id, { overall: 4, aspects: { onTime: 2 }, text: 'Late, but true.' }, daysAfter(completedAt, 2));
    expect(edited).toMatchObject({ overall: 4, text: 'Late, but true.', canEdit: true });
    expect(edited.aspects.find((a) => a.key === 'onTime')?.stars).toBe(2);
    expect(edited.aspects.find((a) => a.key === 'buildQuality')?.stars).toBe(3);
  });

  it('refuses changes once the edit window has closed', async () => {
    const { rider, jobId, completedAt } = await completedJob();
    const written = await createReview(db, rider, shopReviewInput(jobId, 3), completedAt);
    const closed = daysAfter(completedAt, REVIEW_SETTINGS.editWindowDays);
    await expect(editReview(db, rider, written.id, { overall: 1 }, closed)).rejects.toThrow(/could be changed until/);
    expect((await db('reviews').where({ id: written.id }).first()).overall).toBe(3);
  });

  it('refuses changes once the other side can read the review', async () => {
    const { rider, builder, jobId } = await completedJob();
    const written = await createReview(db, rider, shopReviewInput(jobId, 5));
    await createReview(db, builder, riderReviewInput(jobId, 1));
    await expect(editReview(db, rider, written.id, { overall: 1 })).rejects.toThrow(/can read this review now/);
  });

  it('refuses the other side, strangers, and aspects that belong to the other side', async () => {
    const { rider, builder, jobId } = await completedJob();
    const written = await createReview(db, rider, shopReviewInput(jobId, 5));
    await expect(editReview(db, builder, written.id, { overall: 1 })).rejects.toThrow(Forbidden);
    await expect(editReview(db, await makeRider(db), written.id, { overall: 1 })).rejects.toThrow(NotFound);
    await expect(editReview(db, rider, written.id, { aspects: { payment: 1 } })).rejects.toThrow(Invalid);
    await expect(editReview(db, rider, 'not-a-review', { overall: 1 })).rejects.toThrow(NotFound);
  });
});
