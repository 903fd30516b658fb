import { afterAll, describe, expect, it } from 'vitest';
import { Conflict, Forbidden, Invalid, NotFound } from '@/lib/errors';
import { acceptBid } from '@/lib/market/acceptBid';
import { createRequest } from '@/lib/market/createRequest';
import { listShopBids } from '@/lib/market/listShopBids';
import { reviseBid } from '@/lib/market/reviseBid';
import { bidInputSchema, requestInputSchema } from '@/lib/market/schema';
import { withdrawBid } from '@/lib/market/withdrawBid';
import { testDb } from '../../support/db';
import { addShopMember, bid, bidValues, makeBuilder, makeRider, openRequest, outboxFor, requestValues } from './fixtures';

const db = testDb();
afterAll(() => db.destroy());

describe('placing a bid', () => {
  it('stores the line items, the database total, and queues a notice to the rider', async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    const request = await openRequest(db, rider);
    const placed = await bid(db, builder, request.id);
    expect(placed).toMatchObject({ status: 'live', partsCents: 30_000, labourCents: 15_000, finishCents: 5_000, shippingCents: 4_000, totalCents: 54_000, leadTimeDays: 21, revision: 1 });
    expect(placed.validUntil).toMatch(/T23:59:59\.999Z$/);
    const mail = await outboxFor(db, rider.email);
    expect(mail).toHaveLength(1);
    expect(mail[0]).toMatchObject({ kind: 'bid.new', status: 'pending' });
    expect(mail[0].subject).toContain(request.title);
    expect(mail[0].text_body).toContain('$540.00');
    expect(mail[0].text_body).toContain(`/requests/${request.id}`);
  });

  it('allows one live bid per shop per request, for every member of the shop', async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    const colleague = await addShopMember(db, builder.shopId!);
    const request = await openRequest(db, rider);
    const first = await bid(db, builder, request.id);
    const err = await bid(db, colleague, request.id).catch((e) => e);
    expect(err).toBeInstanceOf(Conflict);
    expect(err.message).toMatch(/already has a live bid/);
    // Once withdrawn, the shop may bid again.
    await withdrawBid(db, builder, first.id);
    expect((await bid(db, colleague, request.id)).status).toBe('live');
  });

  it('backs the one-live-bid rule with a unique index as well', async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    const request = await openRequest(db, rider);
    const first = await bid(db, builder, request.id);
    const row = await db('bids').where({ id: first.id }).first();
    const copy = { request_id: row.request_id, shop_id: row.shop_id, parts_cents: 1, labour_cents: 1, finish_cents: 1, shipping_cents: 1, lead_time_days: 5, valid_until: row.valid_until };
    await expect(db('bids').insert(copy)).rejects.toThrow(/bids_one_live_per_shop/);
    // A closed bid beside a live one is fine.
    await db('bids').insert({ ...copy, status: 'withdrawn' });
  });

  it('refuses bids on drafts (not found), on closed requests and from riders', async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    const draft = await createRequest(db, rider, requestInputSchema.parse(requestValues()));
    await expect(bid(db, builder, draft.id)).rejects.toThrow(NotFound);
    const open = await openRequest(db, rider);
    await expect(bid(db, rider, open.id)).rejects.toThrow(Forbidden);
    await db('wheel_requests').where({ id: open.id }).update({ expires_at: new Date(Date.now() - 1000) });
    await expect(bid(db, builder, open.id)).rejects.toThrow('This request has expired, so it takes no bids.');
  });

  it('re-checks a proposed spec change with the wheel engine', async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    const request = await openRequest(db, rider);
    const ok = await bid(db, builder, request.id, {
      proposedChange: { description: 'Go to 144 spokes in 10 gauge for a stiffer wheel', wheels: [{ position: 'rear', spokes: 144, spokeGauge: 10 }] },
    });
    expect(ok.proposedChange).toMatchObject({ verdict: expect.any(String), wheels: [{ position: 'rear', spokes: 144, spokeGauge: 10 }] });
    expect(ok.proposedChange!.baselineCents).toBeGreaterThan(request.baseline.typicalCents);

    const other = await makeBuilder(db);
    // A hub that is not drilled for this spoke count is caught by the engine's own checks.
    const bad = await bid(db, other, request.id, {
      proposedChange: { description: 'Use 48 spokes', wheels: [{ position: 'rear', spokes: 60 }] },
    }).catch((e) => e);
    expect(bad).toBeInstanceOf(Invalid);
    expect(Object.keys(bad.fieldErrors)).toContain('proposedChange.wheels.0.spokes');

    const noFront = await bid(db, other, request.id, { proposedChange: { description: 'Front too', wheels: [{ position: 'front', spokes: 36 }] } }).catch((e) => e);
    expect(noFront).toBeInstanceOf(Invalid);
    expect(noFront.fieldErrors['proposedChange.wheels']).toEqual(['This request has no front wheel.']);
  });
});

describe('revising and withdrawing', () => {
  it('revises a live bid, bumps the revision and tells the rider', async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    const request = await openRequest(db, rider);
    const placed = await bid(db, builder, request.id);
    const revised = await reviseBid(db, builder, placed.id, bidInputSchema.parse(bidValues({ labourCents: 10_000, leadTimeDays: 10 })));
    expect(revised).toMatchObject({ id: placed.id, status: 'live', totalCents: 49_000, leadTimeDays: 10, revision: 2 });
    expect((await outboxFor(db, rider.email)).map((m) => m.kind)).toEqual(['bid.new', 'bid.revised']);
  });

  it('lets only the bidding shop revise or withdraw, and only while live', async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    const stranger = await makeBuilder(db);
    const request = await openRequest(db, rider);
    const placed = await bid(db, builder, request.id);
    await expect(withdrawBid(db, stranger, placed.id)).rejects.toThrow(NotFound);
    await expect(reviseBid(db, stranger, placed.id, bidInputSchema.parse(bidValues()))).rejects.toThrow(NotFound);
    await expect(withdrawBid(db, rider, placed.id)).rejects.toThrow(Forbidden);
    const withdrawn = await withdrawBid(db, builder, placed.id);
    expect(withdrawn.status).toBe('withdrawn');
    expect(withdrawn.closedAt).not.toBeNull();
    await expect(withdrawBid(db, builder, placed.id)).rejects.toThrow('This bid is withdrawn, so it cannot be withdrawn.');
    await expect(reviseBid(db, builder, placed.id, bidInputSchema.parse(bidValues()))).rejects.toThrow('This bid is withdrawn, so it cannot be revised.');
  });

  it('cannot revise or withdraw once accepted', async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    const request = await openRequest(db, rider);
    const placed = await bid(db, builder, request.id);
    await acceptBid(db, rider, request.id, placed.id);
    await expect(withdrawBid(db, builder, placed.id)).rejects.toThrow('This bid is already accepted, so it cannot be withdrawn.');
    await expect(reviseBid(db, builder, placed.id, bidInputSchema.parse(bidValues()))).rejects.toThrow(Conflict);
  });
});

describe('my bids', () => {
  it('lists the shop’s bids with their request and state, never another shop’s', async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    const other = await makeBuilder(db);
    const a = await openRequest(db, rider, { title: 'First' });
    const b = await openRequest(db, rider, { title: 'Second' });
    const mine1 = await bid(db, builder, a.id);
    const mine2 = await bid(db, builder, b.id);
    await bid(db, other, a.id);
    await withdrawBid(db, builder, mine1.id);
    const list = await listShopBids(db, builder);
    expect(list.map((x) => x.id)).toEqual([mine2.id, mine1.id]);
    expect(list[1]).toMatchObject({ status: 'withdrawn', request: { id: a.id, title: 'First', status: 'open' } });
    expect(list[0].nextStep).toMatch(/Waiting for the rider/);
    expect((await listShopBids(db, builder, { status: 'live' })).map((x) => x.id)).toEqual([mine2.id]);
    await expect(listShopBids(db, rider)).rejects.toThrow(Forbidden);
  });
});
