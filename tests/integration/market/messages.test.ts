import { afterAll, describe, expect, it } from 'vitest';
import { Forbidden, NotFound } from '@/lib/errors';
import { cancelRequest } from '@/lib/market/cancelRequest';
import { createRequest } from '@/lib/market/createRequest';
import { listRiderRequests } from '@/lib/market/listRiderRequests';
import { listShopBids } from '@/lib/market/listShopBids';
import { listThreadMessages, postMessage } from '@/lib/market/messages';
import { requestInputSchema } from '@/lib/market/schema';
import { listThreads } from '@/lib/market/threads';
import { testDb } from '../../support/db';
import { addShopMember, bid, makeAdmin, makeBuilder, makeRider, openRequest, outboxFor, requestValues } from './fixtures';

const db = testDb();
afterAll(() => db.destroy());

describe('messages between a rider and a shop', () => {
  it('a builder asks, the rider answers; each side gets a notice and sees new messages flagged', async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    const colleague = await addShopMember(db, builder.shopId!);
    const request = await openRequest(db, rider);
    const shopId = builder.shopId!;

    await postMessage(db, builder, request.id, shopId, 'Is the frame steel?');
    const riderMail = await outboxFor(db, rider.email);
    expect(riderMail.map((m) => m.kind)).toEqual(['message.new']);
    expect(riderMail[0].text_body).toContain('Is the frame steel?');
    expect(riderMail[0].text_body).toContain(`/requests/${request.id}`);

    const threads = await listThreads(db, rider, request.id);
    expect(threads).toEqual([expect.objectContaining({ shopId, messageCount: 1, unreadCount: 1, lastMessageExcerpt: 'Is the frame steel?', hasBid: false })]);
    expect((await listRiderRequests(db, rider))[0].unreadMessages).toBe(1);

    const read = await listThreadMessages(db, rider, request.id, shopId);
    expect(read.messages).toEqual([expect.objectContaining({ body: 'Is the frame steel?', authorSide: 'shop', isNew: true })]);
    expect(read.canPost).toBe(true);
    // Reading marks the thread read.
    expect((await listThreads(db, rider, request.id))[0].unreadCount).toBe(0);
    expect((await listThreadMessages(db, rider, request.id, shopId)).messages[0].isNew).toBe(false);

    await postMessage(db, rider, request.id, shopId, 'Yes, chromoly.');
    // Every member of the shop hears about it.
    expect((await outboxFor(db, builder.email)).map((m) => m.kind)).toEqual(['message.new']);
    expect((await outboxFor(db, colleague.email)).map((m) => m.kind)).toEqual(['message.new']);
    expect((await outboxFor(db, builder.email))[0].text_body).toContain(`/board/${request.id}`);
    const forBuilder = await listThreadMessages(db, colleague, request.id, shopId, { markRead: false });
    expect(forBuilder.messages.map((m) => [m.authorSide, m.isNew])).toEqual([
      ['shop', true], // written by a colleague, not by this member
      ['rider', true],
    ]);
  });

  it('keeps each thread to that rider, that shop and admins', async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    const otherShop = await makeBuilder(db);
    const admin = await makeAdmin(db);
    const request = await openRequest(db, rider);
    await bid(db, builder, request.id);
    await bid(db, otherShop, request.id);
    await postMessage(db, rider, request.id, builder.shopId!, 'Private to your shop');

    await expect(listThreadMessages(db, otherShop, request.id, builder.shopId!)).rejects.toThrow(NotFound);
    await expect(postMessage(db, otherShop, request.id, builder.shopId!, 'Sneaking in')).rejects.toThrow(NotFound);
    await expect(listThreadMessages(db, await makeRider(db), request.id, builder.shopId!)).rejects.toThrow(NotFound);
    expect((await listThreads(db, otherShop, request.id)).map((t) => t.shopId)).toEqual([otherShop.shopId]);
    expect((await listThreads(db, rider, request.id)).map((t) => t.shopId).sort()).toEqual([builder.shopId, otherShop.shopId].sort());

    const asAdmin = await listThreadMessages(db, admin, request.id, builder.shopId!);
    expect(asAdmin.messages.map((m) => m.body)).toEqual(['Private to your shop']);
    expect(asAdmin.canPost).toBe(false);
    await expect(postMessage(db, admin, request.id, builder.shopId!, 'Admin here')).rejects.toThrow(Forbidden);
  });

  it('a rider writes only to shops that bid or wrote first', async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    const request = await openRequest(db, rider);
    await expect(postMessage(db, rider, request.id, builder.shopId!, 'Cold message')).rejects.toThrow(NotFound);
  });

  it('no one talks about a draft, and a closed request takes messages only from shops that took part', async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    const latecomer = await makeBuilder(db);
    const draft = await createRequest(db, rider, requestInputSchema.parse(requestValues()));
    await expect(postMessage(db, builder, draft.id, builder.shopId!, 'Hello?')).rejects.toThrow(NotFound);

    const request = await openRequest(db, rider);
    await postMessage(db, builder, request.id, builder.shopId!, 'Question before I bid');
    await cancelRequest(db, rider, request.id);
    await postMessage(db, rider, request.id, builder.shopId!, 'Sorry, plans changed.');
    await expect(postMessage(db, latecomer, request.id, latecomer.shopId!, 'Too late?')).rejects.toThrow(NotFound);
    const closedOpen = await openRequest(db, rider);
    await bid(db, builder, closedOpen.id);
    await db('wheel_requests').where({ id: closedOpen.id }).update({ status: 'expired', closed_at: new Date() });
    expect((await postMessage(db, builder, closedOpen.id, builder.shopId!, 'Still interested')).body).toBe('Still interested');
  });

  it('flags unread messages in the shop’s bid list', async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    const request = await openRequest(db, rider);
    await bid(db, builder, request.id);
    await postMessage(db, rider, request.id, builder.shopId!, 'Can you do it sooner?');
    await postMessage(db, rider, request.id, builder.shopId!, 'Two weeks?');
    expect((await listShopBids(db, builder))[0].unreadMessages).toBe(2);
    await listThreadMessages(db, builder, request.id, builder.shopId!);
    expect((await listShopBids(db, builder))[0].unreadMessages).toBe(0);
  });
});
