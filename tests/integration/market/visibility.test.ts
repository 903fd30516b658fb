import { afterAll, describe, expect, it } from 'vitest';
import { Forbidden, NotFound } from '@/lib/errors';
import { acceptBid } from '@/lib/market/acceptBid';
import { compareBids } from '@/lib/market/compareBids';
import { createRequest } from '@/lib/market/createRequest';
import { getRequestForViewer } from '@/lib/market/getRequestForViewer';
import { requestInputSchema } from '@/lib/market/schema';
import { testDb } from '../../support/db';
import { bid, makeAdmin, makeBuilder, makeRider, openRequest, requestValues } from './fixtures';

const db = testDb();
afterAll(() => db.destroy());

describe('who sees a request', () => {
  it('a rider sees their own draft; no other rider, builder or shop sees it; admins do', async () => {
    const rider = await makeRider(db);
    const draft = await createRequest(db, rider, requestInputSchema.parse(requestValues()));
    expect((await getRequestForViewer(db, rider, draft.id)).status).toBe('draft');
    await expect(getRequestForViewer(db, await makeRider(db), draft.id)).rejects.toThrow(NotFound);
    await expect(getRequestForViewer(db, await makeBuilder(db), draft.id)).rejects.toThrow(NotFound);
    expect((await getRequestForViewer(db, await makeAdmin(db), draft.id)).id).toBe(draft.id);
  });

  it('another rider does not see an open request either', async () => {
    const request = await openRequest(db, await makeRider(db));
    await expect(getRequestForViewer(db, await makeRider(db), request.id)).rejects.toThrow(NotFound);
  });

  it('the rider sees every bid with the shop, its distance and completed builds', async () => {
    const rider = await makeRider(db);
    const near = await makeBuilder(db, { zip: '90802' });
    const far = await makeBuilder(db, { zip: '04101' });
    const request = await openRequest(db, rider);
    await bid(db, near, request.id, { partsCents: 10_000 });
    await bid(db, far, request.id, { partsCents: 20_000 });
    const view = await getRequestForViewer(db, rider, request.id);
    expect(view.bids).toHaveLength(2);
    const byShop = Object.fromEntries(view.bids.map((b) => [b.shopId, b]));
    expect(byShop[near.shopId!].shop).toMatchObject({ distanceMiles: 0, completedBuilds: 0, rating: null, ratingCount: 0 });
    expect(byShop[far.shopId!].shop!.distanceMiles).toBeGreaterThan(2000); // Long Beach CA to Portland ME
    expect(byShop[far.shopId!].totalCents).toBe(44_000);
    expect(view).toMatchObject({ liveBidCount: 2, editable: false, canCancel: true, canPublish: false, canBid: false });
    expect(view.fit[0].spokeLengthsMm.left).toBeGreaterThan(100);
  });

  it('a builder sees the open request and only their own shop’s bid, never another shop’s amounts', async () => {
    const rider = await makeRider(db);
    const mine = await makeBuilder(db);
    const theirs = await makeBuilder(db);
    const request = await openRequest(db, rider);
    const before = await getRequestForViewer(db, mine, request.id);
    expect(before.canBid).toBe(true);
    expect(before.bids).toEqual([]);
    const own = await bid(db, mine, request.id, { partsCents: 11_111 });
    await bid(db, theirs, request.id, { partsCents: 22_222 });
    const view = await getRequestForViewer(db, mine, request.id);
    expect(view.bids.map((b) => b.id)).toEqual([own.id]);
    expect(JSON.stringify(view)).not.toContain('22222');
    expect(view).toMatchObject({ liveBidCount: 2, canBid: false, editable: false, canCancel: false, nextStep: null });
  });

  it('once awarded, only shops that took part still see the request', async () => {
    const rider = await makeRider(db);
    const winner = await makeBuilder(db);
    const loser = await makeBuilder(db);
    const bystander = await makeBuilder(db);
    const request = await openRequest(db, rider);
    const won = await bid(db, winner, request.id);
    await bid(db, loser, request.id);
    await acceptBid(db, rider, request.id, won.id);
    expect((await getRequestForViewer(db, winner, request.id)).bids[0].status).toBe('accepted');
    expect((await getRequestForViewer(db, loser, request.id)).bids[0].status).toBe('declined');
    await expect(getRequestForViewer(db, bystander, request.id)).rejects.toThrow(NotFound);
  });

  it('an id that is not a uuid is simply not found', async () => {
    await expect(getRequestForViewer(db, await makeRider(db), 'not-an-id')).rejects.toThrow(NotFound);
  });
});

describe('comparing bids', () => {
  it('sets each bid against the baseline, the needed-by date and the shop', async () => {
    const rider = await makeRider(db);
    const cheap = await makeBuilder(db);
    const dear = await makeBuilder(db);
    const request = await openRequest(db, rider, { neededBy: new Date(Date.now() + 30 * 86_400_000).toISOString().slice(0, 10) });
    const typical = request.baseline.typicalCents;
    await bid(db, cheap, request.id, { partsCents: typical - 10_000, labourCents: 0, finishCents: 0, shippingCents: 0, leadTimeDays: 10 });
    await bid(db, dear, request.id, { partsCents: typical + 5_000, labourCents: 0, finishCents: 0, shippingCents: 0, leadTimeDays: 45, message: 'Worth the wait.' });
    const now = new Date();
    const compare = await compareBids(db, rider, request.id, now);
    expect(compare.baseline.typicalCents).toBe(typical);
    expect(compare.rows.map((r) => r.shopId)).toEqual([cheap.shopId, dear.shopId]);
    const [low, high] = compare.rows;
    expect(low).toMatchObject({ vsBaseline: 'below', vsBaselineCents: -10_000, leadTimeDays: 10, meetsNeededBy: true, canAccept: true, completedBuilds: 0 });
    expect(low.readyBy).toBe(new Date(now.getTime() + 10 * 86_400_000).toISOString().slice(0, 10));
    expect(high).toMatchObject({ vsBaseline: 'above', vsBaselineCents: 5_000, meetsNeededBy: false, message: 'Worth the wait.' });
    expect(high.vsBaselinePercent).toBeCloseTo((5_000 / typical) * 100, 1);
  });

  it('is for the request’s rider (and admins) only', async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    const request = await openRequest(db, rider);
    await bid(db, builder, request.id);
    await expect(compareBids(db, builder, request.id)).rejects.toThrow(Forbidden);
    await expect(compareBids(db, await makeRider(db), request.id)).rejects.toThrow(NotFound);
    const asAdmin = await compareBids(db, await makeAdmin(db), request.id);
    expect(asAdmin.rows[0].canAccept).toBe(false);
  });
});
