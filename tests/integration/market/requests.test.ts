import { afterAll, describe, expect, it } from 'vitest';
import { Conflict, Forbidden, Invalid, NotFound } from '@/lib/errors';
import { cancelRequest } from '@/lib/market/cancelRequest';
import { createRequest } from '@/lib/market/createRequest';
import { getRequestForViewer } from '@/lib/market/getRequestForViewer';
import { listRiderRequests } from '@/lib/market/listRiderRequests';
import { publishRequest } from '@/lib/market/publishRequest';
import { requestInputSchema } from '@/lib/market/schema';
import { updateRequest } from '@/lib/market/updateRequest';
import { withdrawBid } from '@/lib/market/withdrawBid';
import { testDb } from '../../support/db';
import { bid, daysFromNow, frontWheel, makeBuilder, makeRider, openRequest, outboxFor, rearWheel, requestValues } from './fixtures';

const db = testDb();
afterAll(() => db.destroy());

const parse = (overrides = {}) => requestInputSchema.parse(requestValues(overrides));

describe('wheel requests: draft → open → cancelled', () => {
  it('saves a draft with the engine verdict, the baseline and the place from the ZIP', async () => {
    const rider = await makeRider(db);
    const draft = await createRequest(db, rider, parse({ title: 'Pair for a lowrider', wheels: [frontWheel, rearWheel] }));
    expect(draft).toMatchObject({ status: 'draft', title: 'Pair for a lowrider', city: 'Long Beach', region: 'CA', publishedAt: null, expiresAt: null });
    expect(draft.fitVerdict).toBe('fits');
    expect(draft.baseline.lowCents).toBeGreaterThan(0);
    expect(draft.baseline.lowCents).toBeLessThan(draft.baseline.typicalCents);
    expect(draft.baseline.typicalCents).toBeLessThan(draft.baseline.highCents);
    expect(draft.wheels).toHaveLength(2);
    const row = await db('wheel_requests').where({ id: draft.id }).first();
    expect(row.spoke_counts).toEqual([72]);
    expect(row.rim_widths_in.map(Number)).toEqual([3]);
  });

  it('publishes a draft: open, with a publish time and an expiry 30 days on', async () => {
    const rider = await makeRider(db);
    const draft = await createRequest(db, rider, parse());
    const open = await publishRequest(db, rider, draft.id);
    expect(open.status).toBe('open');
    const days = (Date.parse(open.expiresAt!) - Date.parse(open.publishedAt!)) / 86_400_000;
    expect(days).toBe(30);
  });

  it('publishes straight away when asked', async () => {
    const rider = await makeRider(db);
    const open = await openRequest(db, rider);
    expect(open.status).toBe('open');
  });

  it('refuses to publish twice, with a 409 in plain words', async () => {
    const rider = await makeRider(db);
    const open = await openRequest(db, rider);
    const err = await publishRequest(db, rider, open.id).catch((e) => e);
    expect(err).toBeInstanceOf(Conflict);
    expect(err.status).toBe(409);
    expect(err.message).toBe('This request is open for bids, so it cannot be published.');
  });

  it('cancels a draft and an open request, and nothing more after that', async () => {
    const rider = await makeRider(db);
    const draft = await createRequest(db, rider, parse());
    expect((await cancelRequest(db, rider, draft.id)).status).toBe('cancelled');
    const open = await openRequest(db, rider);
    const cancelled = await cancelRequest(db, rider, open.id);
    expect(cancelled.status).toBe('cancelled');
    expect(cancelled.closedAt).not.toBeNull();
    await expect(cancelRequest(db, rider, open.id)).rejects.toThrow(Conflict);
    await expect(publishRequest(db, rider, open.id)).rejects.toThrow('This request is cancelled, so it cannot be published.');
    await expect(updateRequest(db, rider, open.id, parse())).rejects.toThrow(Conflict);
  });

  it('declines live bids and tells their shops when an open request is cancelled', async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    const open = await openRequest(db, rider);
    const placed = await bid(db, builder, open.id);
    await cancelRequest(db, rider, open.id);
    expect((await db('bids').where({ id: placed.id }).first()).status).toBe('declined');
    const mail = await outboxFor(db, builder.email);
    expect(mail.map((m) => m.kind)).toContain('bid.declined');
    expect(mail.find((m) => m.kind === 'bid.declined')!.text_body).toContain('cancelled the request');
  });

  it('only the rider who posted it may publish, edit or cancel it', async () => {
    const rider = await makeRider(db);
    const other = await makeRider(db);
    const builder = await makeBuilder(db);
    const draft = await createRequest(db, rider, parse());
    // Someone else's draft is simply not there.
    await expect(publishRequest(db, other, draft.id)).rejects.toThrow(NotFound);
    await expect(cancelRequest(db, builder, draft.id)).rejects.toThrow(NotFound);
    await publishRequest(db, rider, draft.id);
    // Once open, a builder can see it but not change it.
    await expect(cancelRequest(db, builder, draft.id)).rejects.toThrow(Forbidden);
    await expect(updateRequest(db, builder, draft.id, parse())).rejects.toThrow(Forbidden);
    await expect(cancelRequest(db, other, draft.id)).rejects.toThrow(NotFound);
  });

  it('only riders post requests', async () => {
    const builder = await makeBuilder(db);
    await expect(createRequest(db, builder, parse())).rejects.toThrow(Forbidden);
  });

  it('refuses to publish a draft whose needed-by date has passed', async () => {
    const rider = await makeRider(db);
    const draft = await createRequest(db, rider, parse());
    await db('wheel_requests').where({ id: draft.id }).update({ needed_by: daysFromNow(-1) });
    await expect(publishRequest(db, rider, draft.id)).rejects.toThrow(Invalid);
  });
});

describe('editing a request', () => {
  it('edits a draft, and an open request until the first bid', async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    const draft = await createRequest(db, rider, parse());
    const edited = await updateRequest(db, rider, draft.id, parse({ title: 'Changed title', budgetCents: 70_000 }));
    expect(edited).toMatchObject({ title: 'Changed title', budgetCents: 70_000, status: 'draft' });

    await publishRequest(db, rider, draft.id);
    const stillEditable = await updateRequest(db, rider, draft.id, parse({ wheels: [{ ...rearWheel, spokes: 144, spokeGauge: 10 }] }));
    expect(stillEditable.wheels[0].spokes).toBe(144);
    expect(stillEditable.baseline.typicalCents).toBeGreaterThan(edited.baseline.typicalCents);

    const placed = await bid(db, builder, draft.id);
    const err = await updateRequest(db, rider, draft.id, parse({ title: 'Too late' })).catch((e) => e);
    expect(err).toBeInstanceOf(Conflict);
    expect(err.message).toMatch(/already has a bid/);
    expect((await getRequestForViewer(db, rider, draft.id)).editable).toBe(false);

    // With the only bid withdrawn, nothing is priced against the spec any more.
    await withdrawBid(db, builder, placed.id);
    expect((await updateRequest(db, rider, draft.id, parse({ title: 'Editable again' }))).title).toBe('Editable again');
  });
});

describe('my requests', () => {
  it('lists only the rider’s own requests, newest first, with what happens next', async () => {
    const rider = await makeRider(db);
    const other = await makeRider(db);
    const builder = await makeBuilder(db);
    await createRequest(db, other, parse({ title: 'Not mine' }));
    const draft = await createRequest(db, rider, parse({ title: 'My draft' }));
    const open = await openRequest(db, rider, { title: 'My open one' });
    await bid(db, builder, open.id, { partsCents: 20_000 });
    const list = await listRiderRequests(db, rider);
    expect(list.map((r) => r.id)).toEqual([open.id, draft.id]);
    expect(list[0]).toMatchObject({ liveBidCount: 1, lowestLiveBidCents: 44_000, editable: false });
    expect(list[0].nextStep).toMatch(/^1 bid to compare/);
    expect(list[1].nextStep).toMatch(/Publish it/);
    await expect(listRiderRequests(db, builder)).rejects.toThrow(Forbidden);
  });
});
