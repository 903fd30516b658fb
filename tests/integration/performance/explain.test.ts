// The board, the request page and "my bids" read the big tables through indexes, whatever the filters:
// the SQL is captured from the domain functions themselves and EXPLAINed on a database with thousands of
// requests and bids (analysed), where a sequential scan would be the planner's honest choice if no index fit.
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SessionUser } from '@/lib/auth/roles';
import { boardPage } from '@/lib/market/board';
import { milesBetween, type Point } from '@/lib/market/distance';
import { compareBids } from '@/lib/market/compareBids';
import { getRequestForViewer } from '@/lib/market/getRequestForViewer';
import { listShopBids } from '@/lib/market/listShopBids';
import { listThreads } from '@/lib/market/threads';
import { boardQuerySchema } from '@/lib/market/schema';
import { GENERALIST_SHOPS, type ScaleData } from '../../../scripts/lib/scale/generate';
import { captureQueries, explain, filledDatabase, indexOnlyScans, indexesUsed, seqScans, type CapturedQuery } from './support';

const BIG_TABLES = ['wheel_requests', 'bids', 'messages'];

let db: Knex;
let data: ScaleData;
let builder: SessionUser;
let rider: SessionUser;

beforeAll(async () => {
  ({ db, data } = await filledDatabase('explain'));
  // The first shops build everything, so the board's capability filter keeps plenty for them; of those,
  // the one with the most open requests around it, so every radius search finds a page.
  const openPlaces = data.requests.filter((r) => r.status === 'open' && new Date(r.expires_at as string) > new Date()).map((r) => ({ latitude: r.latitude as number, longitude: r.longitude as number }));
  const nearby = (shop: Record<string, unknown>) => openPlaces.filter((p) => milesBetween(p, shop as unknown as Point) <= 300).length;
  const shop = data.shops.slice(0, GENERALIST_SHOPS).reduce((best, s) => (nearby(s) > nearby(best) ? s : best));
  const member = data.shopMembers.find((m) => m.shop_id === shop.id)!;
  const builderRow = data.users.find((u) => u.id === member.user_id)!;
  builder = { id: builderRow.id as string, email: builderRow.email as string, name: builderRow.name as string, role: 'builder', shopId: member.shop_id as string };
  const busiest = new Map<string, number>();
  for (const r of data.requests) busiest.set(r.rider_id as string, (busiest.get(r.rider_id as string) ?? 0) + 1);
  const riderId = [...busiest].sort((a, b) => b[1] - a[1])[0][0];
  const riderRow = data.users.find((u) => u.id === riderId)!;
  rider = { id: riderId, email: riderRow.email as string, name: riderRow.name as string, role: 'rider', shopId: null };
}, 120_000);

afterAll(() => db?.destroy());

const reads = (queries: CapturedQuery[]) => queries.filter((q) => /^\s*select/i.test(q.sql));

/** EXPLAINs every read; fails on a sequential scan of a big table. Returns each read's indexes. */
async function checkReads(queries: CapturedQuery[]): Promise<{ sql: string; indexes: string[]; indexOnly: string[] }[]> {
  const out: { sql: string; indexes: string[]; indexOnly: string[] }[] = [];
  for (const q of reads(queries)) {
    const plan = await explain(db, q);
    const bigSeq = seqScans(plan).filter((t) => BIG_TABLES.includes(t));
    expect(bigSeq, `sequential scan of ${bigSeq.join(', ')} in:\n${q.sql}`).toEqual([]);
    out.push({ sql: q.sql, indexes: indexesUsed(plan), indexOnly: indexOnlyScans(plan) });
  }
  return out;
}

/** `radius`: the search reads the box around the shop from the covering point index alone. */
const BOARD_SHAPES: { name: string; query: Record<string, string>; index?: RegExp; radius?: boolean }[] = [
  { name: 'newest first, no filter', query: {}, index: /wheel_requests_open_published/ },
  { name: 'nearest first within 250 miles', query: { sort: 'distance', maxMiles: '250' }, radius: true },
  { name: 'nearest first, growing circles', query: { sort: 'distance' }, radius: true },
  { name: 'newest within 250 miles, 4-inch rims', query: { sort: 'newest', maxMiles: '250', rimWidthIn: '4' }, radius: true },
  { name: 'needed-by within 400 miles, 26-inch', query: { sort: 'neededBy', maxMiles: '400', diameterIn: '26' }, radius: true },
  { name: 'largest budget first, 72 spokes', query: { sort: 'budget', spokes: '72' } },
  { name: 'budget band, capability filter off', query: { budgetMinCents: '40000', budgetMaxCents: '90000', capabilityFilter: 'off' } },
];

describe('the builder board', () => {
  for (const shape of BOARD_SHAPES) {
    it(`reads open requests through an index: ${shape.name}`, async () => {
      const { result, queries } = await captureQueries(db, () => boardPage(db, builder, boardQuerySchema.parse(shape.query)));
      expect(result.items.length).toBeGreaterThan(0);
      const checked = await checkReads(queries);
      const boardReads = checked.filter((c) => c.sql.includes('"wheel_requests" as "r"'));
      expect(boardReads.length).toBeGreaterThan(0);
      for (const read of boardReads) {
        expect(read.indexes.some((i) => i.includes('wheel_requests_')), `no wheel_requests index in ${read.indexes.join(', ')}`).toBe(true);
        // Live bid count and this shop's bid per row come from bid indexes, not from the table.
        expect(read.indexes.some((i) => /bids_/.test(i))).toBe(true);
      }
      if (shape.index) expect(boardReads.flatMap((r) => r.indexes).join(' ')).toMatch(shape.index);
      if (shape.radius) for (const read of boardReads) expect(read.indexOnly).toContain('wheel_requests_open_point_covering');
    });
  }

  it('reads a later page through the same index (keyset cursor)', async () => {
    const first = await boardPage(db, builder, boardQuerySchema.parse({ limit: '10' }));
    expect(first.nextCursor).not.toBeNull();
    const { queries } = await captureQueries(db, () => boardPage(db, builder, boardQuerySchema.parse({ limit: '10', cursor: first.nextCursor! })));
    const checked = await checkReads(queries);
    expect(checked.flatMap((c) => c.indexes).join(' ')).toMatch(/wheel_requests_open_published/);
  });

  it('makes the same number of queries for a page of 5 and a page of 50 (no query per row)', async () => {
    const small = await captureQueries(db, () => boardPage(db, builder, boardQuerySchema.parse({ limit: '5', capabilityFilter: 'off' })));
    const large = await captureQueries(db, () => boardPage(db, builder, boardQuerySchema.parse({ limit: '50', capabilityFilter: 'off' })));
    expect(large.result.items.length).toBe(50);
    expect(large.queries.length).toBe(small.queries.length);
  });
});

describe('the request page', () => {
  const requestsOf = (riderId: string) => {
    const bidCount = new Map<string, number>();
    for (const b of data.bids) bidCount.set(b.request_id as string, (bidCount.get(b.request_id as string) ?? 0) + 1);
    return data.requests
      .filter((r) => r.rider_id === riderId && (bidCount.get(r.id as string) ?? 0) > 0)
      .map((r) => ({ id: r.id as string, bids: bidCount.get(r.id as string)! }))
      .sort((a, b) => a.bids - b.bids);
  };

  it('reads the request and its bids through indexes, for the rider and for a builder', async () => {
    const withBids = requestsOf(rider.id);
    const busiest = withBids[withBids.length - 1];
    const asRider = await captureQueries(db, () => getRequestForViewer(db, rider, busiest.id));
    expect(asRider.result.bids.length).toBe(busiest.bids);
    const checked = await checkReads(asRider.queries);
    const bidsRead = checked.find((c) => /from "bids" where "request_id"/.test(c.sql) && /order by "created_at" desc/.test(c.sql));
    expect(bidsRead?.indexes.some((i) => i.includes('bids_'))).toBe(true);

    const bidder = data.bids.find((b) => b.request_id === busiest.id)!;
    const shopBuilder: SessionUser = { ...builder, id: data.shopMembers.find((m) => m.shop_id === bidder.shop_id)!.user_id as string, shopId: bidder.shop_id as string };
    const asBuilder = await captureQueries(db, () => getRequestForViewer(db, shopBuilder, busiest.id));
    const builderReads = await checkReads(asBuilder.queries);
    expect(builderReads.flatMap((c) => c.indexes).join(' ')).toMatch(/bids_request_shop_created|bids_one_live_per_shop/);
  });

  it('makes the same number of queries however many bids the request has', async () => {
    const withBids = requestsOf(rider.id);
    const fewest = withBids[0];
    const most = withBids[withBids.length - 1];
    expect(most.bids).toBeGreaterThan(fewest.bids);
    const few = await captureQueries(db, () => getRequestForViewer(db, rider, fewest.id));
    const many = await captureQueries(db, () => getRequestForViewer(db, rider, most.id));
    expect(many.queries.length).toBe(few.queries.length);
  });

  it('compares bids and lists threads through indexes', async () => {
    const withBids = requestsOf(rider.id);
    const busiest = withBids[withBids.length - 1];
    const compare = await captureQueries(db, () => compareBids(db, rider, busiest.id));
    await checkReads(compare.queries);
    const threads = await captureQueries(db, () => listThreads(db, rider, busiest.id));
    await checkReads(threads.queries);
  });
});

describe('my bids', () => {
  it("reads the shop's bids and their unread messages through indexes", async () => {
    const { result, queries } = await captureQueries(db, () => listShopBids(db, builder));
    expect(result.length).toBeGreaterThan(0);
    const checked = await checkReads(queries);
    const indexes = checked.flatMap((c) => c.indexes).join(' ');
    expect(indexes).toMatch(/bids_shop_newest/);
    expect(indexes).toMatch(/messages_request_id_shop_id_created_at_index/);
  });

  it('filters by status through the same index', async () => {
    const { queries } = await captureQueries(db, () => listShopBids(db, builder, { status: 'live' }));
    await checkReads(queries);
  });
});
