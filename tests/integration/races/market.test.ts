// Many hands on the same request at once: the invariants hold in every round (one live bid per shop,
// one accepted bid and one job per request, a bid either accepted or withdrawn, never both).
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SessionUser } from '@/lib/auth/roles';
import { DomainError } from '@/lib/errors';
import { acceptBid } from '@/lib/market/acceptBid';
import { cancelRequest } from '@/lib/market/cancelRequest';
import { placeBid } from '@/lib/market/placeBid';
import { reviseBid } from '@/lib/market/reviseBid';
import { bidInputSchema } from '@/lib/market/schema';
import { withdrawBid } from '@/lib/market/withdrawBid';
import { addShopMember, bid, bidValues, makeBuilder, makeRider, openRequest, ownDatabase } from '../market/fixtures';
import { recordProof } from '../../support/summary';

// Rounds per race: each round is a fresh request with every call fired at once.
const ROUNDS = 8;

let db: Knex;
const tally = { raceRuns: 0, lostRecords: 0, duplicatedRecords: 0 };
beforeAll(async () => {
  db = await ownDatabase('races');
});
afterAll(async () => {
  recordProof('races/market', tally);
  await db?.destroy();
});

/** Only domain refusals (409, 404, 403, 400) are acceptable losers; anything else fails the race. */
async function settle<T>(calls: (() => Promise<T>)[]): Promise<{ won: T[]; refused: DomainError[] }> {
  const results = await Promise.allSettled(calls.map((c) => c()));
  const won: T[] = [];
  const refused: DomainError[] = [];
  for (const r of results) {
    if (r.status === 'fulfilled') won.push(r.value);
    else if (r.reason instanceof DomainError && r.reason.status < 500) refused.push(r.reason);
    else throw r.reason;
  }
  return { won, refused };
}

function exactlyOne(count: number): void {
  if (count === 0) tally.lostRecords += 1;
  if (count > 1) tally.duplicatedRecords += count - 1;
  expect(count).toBe(1);
}

describe('racing on one request', () => {
  it(`${ROUNDS} rounds of 12 simultaneous bids from the four members of one shop: one live bid`, async () => {
    const rider = await makeRider(db);
    const owner = await makeBuilder(db);
    const members: SessionUser[] = [owner, ...(await Promise.all([1, 2, 3].map(() => addShopMember(db, owner.shopId!))))];
    for (let round = 0; round < ROUNDS; round++) {
      const request = await openRequest(db, rider);
      const { won, refused } = await settle(
        Array.from({ length: 12 }, (_, i) => () => placeBid(db, members[i % 4], request.id, bidInputSchema.parse(bidValues({ labourCents: 10_000 + i })))),
      );
      tally.raceRuns += 1;
      exactlyOne(won.length);
      expect(refused.every((e) => e.status === 409)).toBe(true);
      exactlyOne((await db('bids').where({ request_id: request.id, shop_id: owner.shopId, status: 'live' })).length);
      expect(await db('bids').where({ request_id: request.id })).toHaveLength(1);
      // One notice to the rider per bid that landed.
      expect(await db('outbox').where({ kind: 'bid.new' }).andWhere('text_body', 'like', `%${request.id}%`)).toHaveLength(1);
    }
  });

  it(`${ROUNDS} rounds of 8 simultaneous accepts of four bids: one accepted bid, one job, the rest declined`, async () => {
    const rider = await makeRider(db);
    const shops = await Promise.all([0, 1, 2, 3].map(() => makeBuilder(db)));
    for (let round = 0; round < ROUNDS; round++) {
      const request = await openRequest(db, rider);
      const bids: { id: string }[] = [];
      for (const shop of shops) bids.push(await bid(db, shop, request.id));
      const { won, refused } = await settle(Array.from({ length: 8 }, (_, i) => () => acceptBid(db, rider, request.id, bids[i % 4].id)));
      tally.raceRuns += 1;
      exactlyOne(won.length);
      expect(refused.every((e) => e.status === 409)).toBe(true);
      const rows = await db('bids').where({ request_id: request.id });
      exactlyOne(rows.filter((b) => b.status === 'accepted').length);
      expect(rows.filter((b) => b.status === 'declined')).toHaveLength(3);
      const jobs = await db('jobs').where({ request_id: request.id });
      exactlyOne(jobs.length);
      const accepted = rows.find((b) => b.status === 'accepted');
      expect(jobs[0].bid_id).toBe(accepted.id);
      expect(jobs[0].price_cents).toBe(accepted.total_cents);
      expect(await db('wheel_requests').where({ id: request.id }).first()).toMatchObject({ status: 'awarded', accepted_bid_id: accepted.id });
    }
  });

  it(`${ROUNDS} rounds of accept, withdraw and revise on the same bid: accepted or withdrawn, never both, and the job keeps the price accepted`, async () => {
    const rider = await makeRider(db);
    const builder = await makeBuilder(db);
    for (let round = 0; round < ROUNDS; round++) {
      const request = await openRequest(db, rider);
      const placed = await bid(db, builder, request.id, { labourCents: 15_000 });
      await settle<unknown>([
        () => acceptBid(db, rider, request.id, placed.id),
        () => withdrawBid(db, builder, placed.id),
        () => reviseBid(db, builder, placed.id, bidInputSchema.parse(bidValues({ labourCents: 25_000 }))),
        () => acceptBid(db, rider, request.id, placed.id),
      ]);
      tally.raceRuns += 1;
      const row = await db('bids').where({ id: placed.id }).first();
      const jobs = await db('jobs').where({ request_id: request.id });
      expect(['accepted', 'withdrawn']).toContain(row.status);
      if (row.status === 'accepted') {
        exactlyOne(jobs.length);
        expect(jobs[0].price_cents).toBe(row.total_cents);
      } else {
        expect(jobs).toHaveLength(0);
        expect((await db('wheel_requests').where({ id: request.id }).first()).status).toBe('open');
      }
    }
  });

  it(`${ROUNDS} rounds of the rider cancelling while accepting and a shop bidding: awarded with one job, or cancelled with none`, async () => {
    const rider = await makeRider(db);
    const first = await makeBuilder(db);
    const late = await makeBuilder(db);
    for (let round = 0; round < ROUNDS; round++) {
      const request = await openRequest(db, rider);
      const placed = await bid(db, first, request.id);
      await settle<unknown>([
        () => cancelRequest(db, rider, request.id),
        () => acceptBid(db, rider, request.id, placed.id),
        () => placeBid(db, late, request.id, bidInputSchema.parse(bidValues())),
      ]);
      tally.raceRuns += 1;
      const status = (await db('wheel_requests').where({ id: request.id }).first()).status;
      const jobs = await db('jobs').where({ request_id: request.id });
      const bids = await db('bids').where({ request_id: request.id });
      expect(['awarded', 'cancelled']).toContain(status);
      if (status === 'awarded') exactlyOne(jobs.length);
      else expect(jobs).toHaveLength(0);
      // Whatever happened, no bid is left live on a closed request.
      expect(bids.filter((b) => b.status === 'live')).toHaveLength(0);
    }
  });
});
