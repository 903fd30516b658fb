import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { runWorkerTick } from '@/lib/jobs/worker';
import type { MailContent } from '@/lib/mail/transport';
import { acceptBid } from '@/lib/market/acceptBid';
import { getRequestForViewer } from '@/lib/market/getRequestForViewer';
import { bid, makeBuilder, makeRider, openRequest, ownDatabase, outboxFor } from './fixtures';

let db: Knex;
beforeAll(async () => {
  db = await ownDatabase('worker');
});
afterAll(() => db?.destroy());

const sent: MailContent[] = [];
const send = async (m: MailContent) => {
  sent.push(m);
};
const tick = () => runWorkerTick(db, { send });
const hoursAgo = (h: number) => new Date(Date.now() - h * 3_600_000);

describe('one worker tick', () => {
  it('expires live bids past valid-until and tells their shop', async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    const other = await makeBuilder(db);
    const request = await openRequest(db, rider);
    const stale = await bid(db, builder, request.id);
    const fresh = await bid(db, other, request.id);
    await db('bids').where({ id: stale.id }).update({ valid_until: hoursAgo(1) });

    const report = await tick();
    expect(report.bidsExpired).toBe(1);
    expect((await db('bids').where({ id: stale.id }).first()).status).toBe('expired');
    expect((await db('bids').where({ id: fresh.id }).first()).status).toBe('live');
    expect((await db('wheel_requests').where({ id: request.id }).first()).status).toBe('open');
    const notice = sent.find((m) => m.to === builder.email && m.subject.includes('expired'));
    expect(notice?.text).toContain('passed its valid-until date');
    expect((await tick()).bidsExpired).toBe(0);
  });

  it('expires open requests past their time, their live bids with them, and tells everyone', async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    const request = await openRequest(db, rider);
    const live = await bid(db, builder, request.id);
    await db('wheel_requests').where({ id: request.id }).update({ expires_at: hoursAgo(1) });

    const report = await tick();
    expect(report.requestsExpired).toBe(1);
    const view = await getRequestForViewer(db, rider, request.id);
    expect(view.status).toBe('expired');
    expect(view.closedAt).not.toBeNull();
    expect(view.nextStep).toMatch(/No bid was accepted in time/);
    expect((await db('bids').where({ id: live.id }).first()).status).toBe('expired');
    expect((await outboxFor(db, rider.email)).map((m) => m.kind)).toContain('request.expired');
    expect((await outboxFor(db, builder.email)).map((m) => m.kind)).toContain('bid.expired');
    // The tick sent what it queued.
    expect(sent.some((m) => m.to === rider.email && m.subject.includes('has expired'))).toBe(true);
    expect(await db('outbox').where({ status: 'pending' })).toHaveLength(0);
  });

  it('leaves awarded requests alone even past their expiry time', async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    const request = await openRequest(db, rider);
    const won = await bid(db, builder, request.id);
    await acceptBid(db, rider, request.id, won.id);
    await db('wheel_requests').where({ id: request.id }).update({ expires_at: hoursAgo(1) });
    await tick();
    expect((await db('wheel_requests').where({ id: request.id }).first()).status).toBe('awarded');
    expect((await db('bids').where({ id: won.id }).first()).status).toBe('accepted');
  });

  it('warns the rider once when a request is about to expire', async () => {
    const rider = await makeRider(db);
    const request = await openRequest(db, rider);
    await db('wheel_requests').where({ id: request.id }).update({ expires_at: new Date(Date.now() + 24 * 3_600_000) });
    expect((await tick()).requestsWarned).toBe(1);
    expect((await tick()).requestsWarned).toBe(0);
    const warnings = (await outboxFor(db, rider.email)).filter((m) => m.kind === 'request.expiring');
    expect(warnings).toHaveLength(1);
    expect(warnings[0].status).toBe('sent');
    expect(warnings[0].text_body).toContain('closes on');
    expect(sent.filter((m) => m.to === rider.email && m.subject.includes('closes soon'))).toHaveLength(1);
    expect((await db('wheel_requests').where({ id: request.id }).first()).status).toBe('open');
  });

  it('does not warn about requests far from expiry', async () => {
    const rider = await makeRider(db);
    await openRequest(db, rider);
    await tick();
    expect((await outboxFor(db, rider.email)).filter((m) => m.kind === 'request.expiring')).toHaveLength(0);
  });
});
