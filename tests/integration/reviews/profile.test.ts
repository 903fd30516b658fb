// A shop's public profile: rating from visible reviews only, the reviews anyone may read, completed builds,
// and the typical lead time (promised against actual, funding to shipping); and the rating a rider sees on bids.
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { NotFound } from '@/lib/errors';
import { shopFacts } from '@/lib/market/shopFacts';
import { wilsonLowerBound } from '@/lib/reviews/score';
import { listShopReviews } from '@/lib/reviews/shopReviews';
import { createReview } from '@/lib/reviews/writeReview';
import { getShopProfile, leadTimeSummary } from '@/lib/shops/profile';
import { testDb } from '../../support/db';
import { DAY, daysAfter, makeJob, makeRider, makeShop, riderReviewInput, shopReviewInput } from './support';

let db: Knex;
beforeAll(() => {
  db = testDb();
});
afterAll(() => db?.destroy());

describe('lead time from completed jobs', () => {
  const job = (promisedDays: number, actualDays: number) => ({ promisedDays, fundedAt: new Date(0), shippedAt: new Date(actualDays * DAY) });

  it('takes the median of actual days and the share shipped within the promise', () => {
    expect(leadTimeSummary([job(21, 18), job(21, 25), job(14, 14), job(30, 10)])).toEqual({
      builds: 4,
      medianActualDays: (14 + 18) / 2,
      medianPromisedDays: 21,
      onTime: 3,
      onTimeShare: 0.75,
    });
    expect(leadTimeSummary([job(10, 12.5), job(10, 3), job(20, 7)])).toMatchObject({ medianActualDays: 7, medianPromisedDays: 10, onTime: 2 });
  });

  it('says nothing with no completed builds', () => {
    expect(leadTimeSummary([])).toEqual({ builds: 0, medianActualDays: null, medianPromisedDays: null, onTime: 0, onTimeShare: null });
  });
});

describe('the shop profile', () => {
  it('shows the rating, the visible reviews, completed builds and the lead time', async () => {
    const builder = await makeShop(db, { name: 'Profile Spoke Works', capabilities: { rimWidthsIn: [3], diametersIn: [26], hubDrilling: true } });
    const now = new Date();
    // Three old jobs, reviews open to view (the review period is over): 5, 4 and 2 stars.
    const stars = [5, 4, 2];
    const promised = [21, 21, 14];
    const actual = [18, 20, 19];
    for (let i = 0; i < 3; i++) {
      const rider = await makeRider(db, `Rider${i} Lastname`);
      const completedAt = daysAfter(now, -40 - i);
      const shippedAt = daysAfter(completedAt, -3);
      const { jobId } = await makeJob(db, rider, builder.shopId, { completedAt, shippedAt, fundedAt: daysAfter(shippedAt, -actual[i]), leadTimeDays: promised[i] });
      await createReview(db, rider, shopReviewInput(jobId, stars[i], `Review ${i}`), daysAfter(completedAt, 1));
    }
    // A fresh job: the rider's review is hidden until the shop writes or the period ends.
    const fresh = await makeRider(db, 'Hidden Writer');
    const { jobId: freshJob } = await makeJob(db, fresh, builder.shopId, { completedAt: now, shippedAt: daysAfter(now, -1), fundedAt: daysAfter(now, -31), leadTimeDays: 30 });
    await createReview(db, fresh, shopReviewInput(freshJob, 1, 'Hidden for now'), now);
    // Open jobs are not completed builds.
    await makeJob(db, await makeRider(db), builder.shopId, { status: 'building' });

    const profile = await getShopProfile(db, builder.slug, null, { now: daysAfter(now, 0.001) });
    expect(profile).toMatchObject({ name: 'Profile Spoke Works', completedBuilds: 4, viewerIsMember: false, photos: [] });
    expect(profile.capabilities).toMatchObject({ rimWidthsIn: [3], diametersIn: [26], hubDrilling: true, gauges: [] });
    expect(profile.rating).toMatchObject({ count: 3, average: 11 / 3, positive: 2 });
    expect(profile.rating.score).toBeCloseTo(wilsonLowerBound(2, 3), 12);
    expect(profile.rating.aspects.buildQuality).toBeCloseTo(11 / 3, 12);
    expect(profile.reviews.map((r) => r.text)).toEqual(['Review 0', 'Review 1', 'Review 2']);
    expect(profile.reviews[0]).toMatchObject({ authorLabel: 'Rider0', canEdit: false });
    // Actual days 18, 20, 19 and 30 against promised 21, 21, 14 and 30: median 19.5; 3 of 4 on time.
    expect(profile.leadTime).toMatchObject({ builds: 4, medianActualDays: 19.5, medianPromisedDays: 21, onTime: 3, onTimeShare: 0.75 });

    // When the shop answers the fresh review, both open and the rating moves.
    await createReview(db, builder, riderReviewInput(freshJob, 4), daysAfter(now, 0.002));
    const later = await getShopProfile(db, builder.slug, builder, { now: daysAfter(now, 0.003) });
    expect(later.rating.count).toBe(4);
    expect(later.reviews[0].text).toBe('Hidden for now');
    expect(later.viewerIsMember).toBe(true);
    // The shop's review of a rider is not a review of the shop.
    expect((await listShopReviews(db, builder.shopId, { now: daysAfter(now, 0.003) })).every((r) => r.side === 'rider')).toBe(true);
  });

  it('answers 404 for an unknown shop', async () => {
    await expect(getShopProfile(db, 'no-such-shop-anywhere', null)).rejects.toThrow(NotFound);
  });

  it('gives bid comparisons the real average and count', async () => {
    const builder = await makeShop(db);
    const unrated = await makeShop(db);
    const rider = await makeRider(db);
    const completedAt = daysAfter(new Date(), -20);
    for (const overall of [5, 4]) {
      const { jobId } = await makeJob(db, rider, builder.shopId, { completedAt });
      await createReview(db, rider, shopReviewInput(jobId, overall), daysAfter(completedAt, 1));
    }
    const facts = await shopFacts(db, [builder.shopId, unrated.shopId], { latitude: 33.77, longitude: -118.19 });
    expect(facts.get(builder.shopId)).toMatchObject({ rating: 4.5, ratingCount: 2, completedBuilds: 2 });
    expect(facts.get(unrated.shopId)).toMatchObject({ rating: null, ratingCount: 0 });
  });
});
