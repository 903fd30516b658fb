import { afterAll, describe, expect, it } from 'vitest';
import { Conflict, Forbidden, NotFound } from '@/lib/errors';
import { acceptBid } from '@/lib/market/acceptBid';
import { withdrawBid } from '@/lib/market/withdrawBid';
import { testDb } from '../../support/db';
import { addShopMember, bid, makeAdmin, makeBuilder, makeRider, openRequest, outboxFor } from './fixtures';

const db = testDb();
afterAll(() => db.destroy());

async function threeBids() {
  const rider = await makeRider(db);
  const builders = [await makeBuilder(db), await makeBuilder(db), await makeBuilder(db)];
  const request = await openRequest(db, rider);
  const bids = [];
  for (const [i, b] of builders.entries()) bids.push(await bid(db, b, request.id, { labourCents: 10_000 + i * 1_000 }));
  return { rider, builders, request, bids };
}

describe('accepting a bid', () => {
  it('accepts one, declines the other live bids, awards the request and opens a job awaiting payment', async () => {
    const { rider, builders, request, bids } = await threeBids();
    const colleague = await addShopMember(db, builders[1].shopId!);
    await withdrawBid(db, builders[2], bids[2].id);
    const result = await acceptBid(db, rider, request.id, bids[0].id);
    expect(result.bid.status).toBe('accepted');
    expect(result.request).toMatchObject({ status: 'awarded', acceptedBidId: bids[0].id });
    expect(result.job).toMatchObject({ status: 'awaiting_payment', priceCents: bids[0].totalCents, riderId: rider.id, shopId: builders[0].shopId, bidId: bids[0].id });

    const statuses = Object.fromEntries((await db('bids').where({ request_id: request.id }).select('id', 'status')).map((b) => [b.id, b.status]));
    expect(statuses).toEqual({ [bids[0].id]: 'accepted', [bids[1].id]: 'declined', [bids[2].id]: 'withdrawn' });

    // Outbox rows were written in the same transaction: the winner, and every member of the declined shop.
    expect((await outboxFor(db, builders[0].email)).map((m) => m.kind)).toEqual(['bid.accepted']);
    expect((await outboxFor(db, builders[1].email)).map((m) => m.kind)).toEqual(['bid.declined']);
    expect((await outboxFor(db, colleague.email)).map((m) => m.kind)).toEqual(['bid.declined']);
    expect((await outboxFor(db, builders[2].email)).map((m) => m.kind)).toEqual([]);
    expect((await outboxFor(db, builders[1].email))[0].text_body).toContain('accepted another builder’s bid');
  });

  it('only the request’s rider accepts', async () => {
    const { request, bids, builders } = await threeBids();
    const otherRider = await makeRider(db);
    const admin = await makeAdmin(db);
    await expect(acceptBid(db, otherRider, request.id, bids[0].id)).rejects.toThrow(NotFound);
    await expect(acceptBid(db, builders[0], request.id, bids[0].id)).rejects.toThrow(Forbidden);
    await expect(acceptBid(db, admin, request.id, bids[0].id)).rejects.toThrow(Forbidden);
    expect((await db('bids').where({ id: bids[0].id }).first()).status).toBe('live');
  });

  it('refuses a bid that is withdrawn, past valid-until, or from another request', async () => {
    const { rider, request, bids, builders } = await threeBids();
    await withdrawBid(db, builders[0], bids[0].id);
    await expect(acceptBid(db, rider, request.id, bids[0].id)).rejects.toThrow('This bid is withdrawn, so it cannot be accepted.');
    await db('bids').where({ id: bids[1].id }).update({ valid_until: new Date(Date.now() - 60_000) });
    await expect(acceptBid(db, rider, request.id, bids[1].id)).rejects.toThrow('This bid is past its valid-until date, so it cannot be accepted.');
    const elsewhere = await openRequest(db, rider);
    const foreign = await bid(db, builders[0], elsewhere.id);
    await expect(acceptBid(db, rider, request.id, foreign.id)).rejects.toThrow(NotFound);
    // Nothing moved.
    expect((await db('wheel_requests').where({ id: request.id }).first()).status).toBe('open');
  });

  it('refuses a second accept on an awarded request with a 409', async () => {
    const { rider, request, bids } = await threeBids();
    await acceptBid(db, rider, request.id, bids[0].id);
    const err = await acceptBid(db, rider, request.id, bids[1].id).catch((e) => e);
    expect(err).toBeInstanceOf(Conflict);
    expect(err.message).toBe('This request is already awarded to a builder, so it cannot be awarded.');
  });

  it('two accepts at once: exactly one bid is accepted', async () => {
    const { rider, request, bids } = await threeBids();
    const results = await Promise.allSettled([
      acceptBid(db, rider, request.id, bids[0].id),
      acceptBid(db, rider, request.id, bids[1].id),
      acceptBid(db, rider, request.id, bids[2].id),
      acceptBid(db, rider, request.id, bids[0].id),
    ]);
    const fulfilled = results.filter((r) => r.status === 'fulfilled');
    const rejected = results.filter((r): r is PromiseRejectedResult => r.status === 'rejected');
    expect(fulfilled).toHaveLength(1);
    expect(rejected.every((r) => r.reason instanceof Conflict)).toBe(true);
    const accepted = await db('bids').where({ request_id: request.id, status: 'accepted' });
    expect(accepted).toHaveLength(1);
    expect(await db('jobs').where({ request_id: request.id })).toHaveLength(1);
    const row = await db('wheel_requests').where({ id: request.id }).first();
    expect(row.accepted_bid_id).toBe(accepted[0].id);
  });

  it('a bid racing an accept either lands before it (and is declined) or is refused', async () => {
    const { rider, request, bids } = await threeBids();
    const late = await makeBuilder(db);
    const [accepted, placed] = await Promise.allSettled([acceptBid(db, rider, request.id, bids[0].id), bid(db, late, request.id)]);
    expect(accepted.status).toBe('fulfilled');
    const lateBids = await db('bids').where({ request_id: request.id, shop_id: late.shopId });
    if (placed.status === 'fulfilled') expect(lateBids.map((b) => b.status)).toEqual(['declined']);
    else expect(lateBids).toHaveLength(0);
    expect(await db('bids').where({ request_id: request.id, status: 'live' })).toHaveLength(0);
  });
});
