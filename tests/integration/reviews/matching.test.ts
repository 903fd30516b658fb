// Matching a published request with shops: the ranking (capability fit, distance, rating, backlog), who is
// eligible at all, the invitations written with the publish, and invitations that go out once only.
// A database of this file's own, emptied of shops and requests before each test, so rankings see only the test's shops.
import type { Knex } from 'knex';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { Conflict, Forbidden, NotFound } from '@/lib/errors';
import { invitableRequests, inviteShopToBid } from '@/lib/matching/invitations';
import { rankShopsForRequest } from '@/lib/matching/rankShops';
import { MATCH_SETTINGS, MATCH_WEIGHTS } from '@/lib/matching/settings';
import { cancelRequest } from '@/lib/market/cancelRequest';
import { createRequest } from '@/lib/market/createRequest';
import { placeBid } from '@/lib/market/placeBid';
import { bidInputSchema, requestInputSchema } from '@/lib/market/schema';
import { createReview } from '@/lib/reviews/writeReview';
import {
  daysAfter,
  makeJob,
  makeRider,
  makeShop,
  ownDatabase,
  publishNewRequest,
  requestValues,
  riderReviewInput,
  shopReviewInput,
  type ShopOptions,
} from './support';

let db: Knex;
beforeAll(async () => {
  db = await ownDatabase('matching');
});
afterAll(() => db?.destroy());
beforeEach(async () => {
  await db('wheel_requests').del();
  await db('shops').del();
  await db('outbox').del();
});

// The request the fixtures publish: one 26-inch rear, 80 mm (3-inch class) rim, 72 spokes of 12 gauge on a
// hub whose stock flange holes need drilling for that gauge; from Long Beach, CA.
const FULL = { rimWidthsIn: [3, 4], diametersIn: [24, 26], gauges: [12, 10], spokeCounts: [36, 72], hubDrilling: true };
const LONG_BEACH = { latitude: 33.7701, longitude: -118.1937 };
const ANAHEIM = { latitude: 33.8366, longitude: -117.9143 }; // about 17 miles away
const ALBUQUERQUE = { latitude: 35.0844, longitude: -106.6504 }; // about 670 miles away
const MILWAUKEE = { latitude: 43.0439, longitude: -87.8967 }; // about 1,750 miles away

const shop = (name: string, opts: ShopOptions = {}) => makeShop(db, { name, capabilities: FULL, ...LONG_BEACH, ...opts });
const order = (ranked: { name: string }[]) => ranked.map((s) => s.name);

/** Two visible reviews of `overall` stars for a shop, from jobs that completed long enough ago. */
async function reviewed(shopId: string, overall: number, count = 2) {
  for (let i = 0; i < count; i++) {
    const rider = await makeRider(db);
    const completedAt = daysAfter(new Date(), -30);
    const { jobId } = await makeJob(db, rider, shopId, { completedAt });
    await createReview(db, rider, shopReviewInput(jobId, overall), daysAfter(completedAt, 1));
  }
}

describe('ranking shops for a request', () => {
  it('ranks by capability fit: every need listed beats unlisted needs, which beat needs listed otherwise', async () => {
    await shop('Lists everything');
    await shop('Lists only sizes', { capabilities: { rimWidthsIn: [3], diametersIn: [26] } });
    await shop('Other gauges, no drilling', { capabilities: { ...FULL, gauges: [14], hubDrilling: false } });
    await shop('Wrong rim width', { capabilities: { ...FULL, rimWidthsIn: [4, 5] } });
    await shop('Wrong wheel size', { capabilities: { ...FULL, diametersIn: [24] } });
    await shop('Says nothing', { capabilities: {} });
    const rider = await makeRider(db);
    const request = await publishNewRequest(db, rider);

    const ranked = await rankShopsForRequest(db, request.id);
    expect(order(ranked)).toEqual(['Lists everything', 'Lists only sizes', 'Other gauges, no drilling']);
    expect(ranked.map((s) => s.parts.capability)).toEqual([1, (1 + 1 + 0.5 + 0.5 + 0) / 5, (1 + 1 + 0 + 1 + 0) / 5]);
    expect(ranked[0].reasons).toEqual(
      expect.arrayContaining(['builds 3 inch rims and 26 inch wheels', 'lists 12 gauge spokes', 'lists 72-spoke wheels', 'drills hub flanges, which this build needs']),
    );
    expect(ranked[2].reasons).toEqual(expect.arrayContaining(['does not list 12 gauge spokes', 'does not drill hub flanges, which this build needs']));
  });

  it('ranks nearer shops first when all else is equal, and keeps pickup requests to shops within reach', async () => {
    await shop('Milwaukee', MILWAUKEE);
    await shop('Albuquerque', ALBUQUERQUE);
    await shop('Anaheim', ANAHEIM);
    const rider = await makeRider(db);
    const shipped = await rankShopsForRequest(db, (await publishNewRequest(db, rider)).id);
    expect(order(shipped)).toEqual(['Anaheim', 'Albuquerque', 'Milwaukee']);
    // Great-circle miles through the map's haversine: Long Beach to Anaheim is about 17 miles.
    expect(shipped[0].distanceMiles).toBeGreaterThan(15);
    expect(shipped[0].distanceMiles).toBeLessThan(20);
    expect(shipped[2].distanceMiles).toBeGreaterThan(1700);

    const pickup = await rankShopsForRequest(db, (await publishNewRequest(db, rider, { delivery: 'pickup' })).id);
    expect(order(pickup)).toEqual(['Anaheim']);
    expect(MATCH_SETTINGS.pickupRadiusMiles).toBeLessThan(shipped[1].distanceMiles);
  });

  it('ranks a shop with good reviews above an unreviewed one, and counts only reviews open to view', async () => {
    const unreviewed = await shop('Unreviewed');
    const praised = await shop('Praised');
    const panned = await shop('Panned');
    const hidden = await shop('Hidden praise');
    void unreviewed;
    await reviewed(praised.shopId, 5, 3);
    await reviewed(panned.shopId, 1, 3);
    // A fresh review the shop has not answered stays hidden, so it does not count yet.
    const rider = await makeRider(db);
    const { jobId } = await makeJob(db, rider, hidden.shopId);
    await createReview(db, rider, shopReviewInput(jobId, 5));

    const ranked = await rankShopsForRequest(db, (await publishNewRequest(db, await makeRider(db))).id);
    expect(order(ranked)[0]).toBe('Praised');
    expect(ranked[0].rating).toMatchObject({ average: 5, count: 3 });
    expect(ranked[0].reasons).toContain('rated 5.0 of 5 from 3 reviews');
    const byName = Object.fromEntries(ranked.map((s) => [s.name, s]));
    expect(byName['Hidden praise'].rating.count).toBe(0);
    expect(byName['Hidden praise'].score).toBeCloseTo(byName['Unreviewed'].score, 10);
    expect(byName['Panned'].rating.score).toBe(0);

    // Once the shop answers, both reviews open and the rating counts.
    await createReview(db, hidden, riderReviewInput(jobId, 5));
    const again = await rankShopsForRequest(db, (await publishNewRequest(db, await makeRider(db))).id);
    expect(again.find((s) => s.name === 'Hidden praise')!.rating.count).toBe(1);
  });

  it('ranks a shop with free build slots above one whose slots are full', async () => {
    const busy = await shop('Fully booked', { buildsAtOnce: 2 });
    await shop('Free bench', { buildsAtOnce: 2 });
    const rider = await makeRider(db);
    await makeJob(db, rider, busy.shopId, { status: 'funded' });
    await makeJob(db, rider, busy.shopId, { status: 'building' });
    await makeJob(db, rider, busy.shopId, { status: 'completed' }); // finished work takes no slot

    const ranked = await rankShopsForRequest(db, (await publishNewRequest(db, rider)).id);
    expect(order(ranked)).toEqual(['Free bench', 'Fully booked']);
    expect(ranked.map((s) => [s.openJobs, s.parts.backlog])).toEqual([
      [0, 1],
      [2, 0],
    ]);
    expect(ranked[1].reasons).toContain('fully booked (2 open jobs)');
    expect(ranked[0].score - ranked[1].score).toBeCloseTo(MATCH_WEIGHTS.backlog, 10);
  });

  it('adds the weighted parts up to the score', async () => {
    await shop('Only shop', ALBUQUERQUE);
    const [ranked] = await rankShopsForRequest(db, (await publishNewRequest(db, await makeRider(db))).id);
    const { capability, distance, rating, backlog } = ranked.parts;
    expect(ranked.score).toBeCloseTo(
      MATCH_WEIGHTS.capability * capability + MATCH_WEIGHTS.distance * distance + MATCH_WEIGHTS.rating * rating + MATCH_WEIGHTS.backlog * backlog,
      12,
    );
    expect(MATCH_WEIGHTS.capability + MATCH_WEIGHTS.distance + MATCH_WEIGHTS.rating + MATCH_WEIGHTS.backlog).toBeCloseTo(1, 12);
    await expect(rankShopsForRequest(db, '00000000-0000-4000-8000-000000000000')).rejects.toThrow(NotFound);
  });
});

describe('invitations when a request is published', () => {
  it('invites the best few shops, with their e-mail in the outbox, and nobody else', async () => {
    const names = ['Near 1', 'Near 2', 'Near 3', 'Near 4', 'Near 5'];
    const near = [];
    for (const name of names) near.push(await shop(name, ANAHEIM));
    const far = await shop('Far away', MILWAUKEE);
    const unfit = await shop('Unfit', { capabilities: { rimWidthsIn: [5], diametersIn: [26] } });
    expect(MATCH_SETTINGS.inviteCount).toBe(5);

    const request = await publishNewRequest(db, await makeRider(db));
    const invitations = await db('shop_invitations').where({ request_id: request.id });
    expect(invitations.map((i) => i.shop_id).sort()).toEqual(near.map((s) => s.shopId).sort());
    expect(invitations.every((i) => i.source === 'match' && i.match_score > 0 && i.reasons.length > 0)).toBe(true);
    for (const s of near) {
      const mail = await db('outbox').where({ to_email: s.email, kind: 'request.invitation' });
      expect(mail).toHaveLength(1);
      expect(mail[0].text_body).toContain(`/board/${request.id}`);
    }
    expect(await db('outbox').whereIn('to_email', [far.email, unfit.email])).toHaveLength(0);
  });

  it('writes nothing when the publishing transaction rolls back', async () => {
    const builder = await shop('Would be invited');
    const rider = await makeRider(db);
    await expect(
      db.transaction(async (trx) => {
        await publishNewRequest(trx, rider);
        throw new Error('roll back');
      }),
    ).rejects.toThrow('roll back');
    expect(await db('shop_invitations')).toHaveLength(0);
    expect(await db('outbox').where({ to_email: builder.email })).toHaveLength(0);
  });

  it('invites no one for a draft', async () => {
    await shop('Waiting');
    await createRequest(db, await makeRider(db), requestInputSchema.parse(requestValues()));
    expect(await db('shop_invitations')).toHaveLength(0);
  });
});

describe('a rider invites a shop from its page', () => {
  it('sends one e-mail however often the rider asks, even when asked twice at once', async () => {
    const builder = await shop('Asked twice', MILWAUKEE); // far: left out of the matcher's five
    for (let i = 0; i < 5; i++) await shop(`Closer ${i}`, ANAHEIM);
    const rider = await makeRider(db);
    const request = await publishNewRequest(db, rider);
    expect(await db('shop_invitations').where({ shop_id: builder.shopId })).toHaveLength(0);

    const results = await Promise.all([inviteShopToBid(db, rider, builder.slug, request.id), inviteShopToBid(db, rider, builder.slug, request.id)]);
    expect(results.map((r) => r.invitedNow).sort()).toEqual([false, true]);
    expect((await inviteShopToBid(db, rider, builder.slug, request.id)).invitedNow).toBe(false);
    const rows = await db('shop_invitations').where({ shop_id: builder.shopId });
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ source: 'rider', invited_by: rider.id, match_score: null });
    const mail = await db('outbox').where({ to_email: builder.email, kind: 'request.invitation' });
    expect(mail).toHaveLength(1);
    expect(mail[0].text_body).toContain('saw your shop page');
  });

  it('does not mail a shop the matcher already invited', async () => {
    const builder = await shop('Matched first');
    const rider = await makeRider(db);
    const request = await publishNewRequest(db, rider);
    expect(await invitableRequests(db, rider, builder.slug)).toEqual([{ id: request.id, title: request.title, invited: true, hasBid: false }]);
    expect((await inviteShopToBid(db, rider, builder.slug, request.id)).invitedNow).toBe(false);
    expect(await db('outbox').where({ to_email: builder.email, kind: 'request.invitation' })).toHaveLength(1);
  });

  it('only for the rider’s own open request, a shop that exists and has not bid', async () => {
    const builder = await shop('Guarded', MILWAUKEE);
    const rider = await makeRider(db);
    const request = await publishNewRequest(db, rider);
    await expect(inviteShopToBid(db, await makeRider(db), builder.slug, request.id)).rejects.toThrow(NotFound);
    await expect(inviteShopToBid(db, builder, builder.slug, request.id)).rejects.toThrow(Forbidden);
    await expect(inviteShopToBid(db, rider, 'no-such-shop', request.id)).rejects.toThrow(NotFound);

    const bidder = await shop('Already bid', MILWAUKEE);
    await placeBid(
      db,
      bidder,
      request.id,
      bidInputSchema.parse({ partsCents: 100, labourCents: 100, finishCents: 0, shippingCents: 0, leadTimeDays: 10, validUntil: daysAfter(new Date(), 5).toISOString().slice(0, 10) }),
    );
    await expect(inviteShopToBid(db, rider, bidder.slug, request.id)).rejects.toThrow(/already bid/);

    await cancelRequest(db, rider, request.id);
    await expect(inviteShopToBid(db, rider, builder.slug, request.id)).rejects.toThrow(Conflict);
    expect(await invitableRequests(db, rider, builder.slug)).toEqual([]);
  });
});
