import { afterAll, describe, expect, it } from 'vitest';
import { Forbidden, Invalid } from '@/lib/errors';
import { boardPage } from '@/lib/market/board';
import { createRequest } from '@/lib/market/createRequest';
import { boardQuerySchema, requestInputSchema } from '@/lib/market/schema';
import { testDb } from '../../support/db';
import { bid, daysFromNow, makeBuilder, makeRider, openRequest, rearWheel, requestValues } from './fixtures';

const db = testDb();
afterAll(() => db.destroy());

// Other test files add open requests to the same database at the same time, so each test here
// gives its requests a needed-by window of its own and asks the board for that window only.
let windowStart = 400;
function ownWindow(size = 10) {
  const from = windowStart;
  windowStart += size + 1;
  return { day: (n: number) => daysFromNow(from + n), query: { neededByFrom: daysFromNow(from), neededByTo: daysFromNow(from + size) } };
}

const board = (builder: Parameters<typeof boardPage>[1], query: Record<string, string | undefined>) =>
  boardPage(db, builder, boardQuerySchema.parse(Object.fromEntries(Object.entries(query).filter(([, v]) => v !== undefined))));

const wide = { rimWidthsIn: [], diametersIn: [], gauges: [], spokeCounts: [] };

describe('the board', () => {
  it('shows open requests only: no drafts, no cancelled, no expired', async () => {
    const w = ownWindow();
    const rider = await makeRider(db);
    const builder = await makeBuilder(db, { capabilities: wide });
    const open = await openRequest(db, rider, { neededBy: w.day(1) });
    await createRequest(db, rider, requestInputSchema.parse(requestValues({ neededBy: w.day(2) })));
    const stale = await openRequest(db, rider, { neededBy: w.day(3) });
    await db('wheel_requests').where({ id: stale.id }).update({ expires_at: new Date(Date.now() - 1000) });
    const page = await board(builder, w.query);
    expect(page.items.map((i) => i.id)).toEqual([open.id]);
    expect(page.items[0]).toMatchObject({ title: open.title, city: 'Long Beach', liveBidCount: 0, myBid: null, matchesCapabilities: true });
    expect(page.items[0].wheels[0]).toMatchObject({ rimWidthMm: 80, rimWidthIn: 3, spokes: 72 });
  });

  it('filters by diameter, rim width, gauge, spoke count, budget and needed-by', async () => {
    const w = ownWindow();
    const rider = await makeRider(db);
    const builder = await makeBuilder(db, { capabilities: wide });
    const a = await openRequest(db, rider, { neededBy: w.day(1), budgetCents: 40_000 });
    const b = await openRequest(db, rider, {
      neededBy: w.day(5),
      budgetCents: 90_000,
      wheels: [{ ...rearWheel, nominalDiameterIn: 24, rimWidthMm: 100, tireWidthMm: 100, spokes: 144, spokeGauge: 10 }],
    });
    const ids = async (q: Record<string, string>) => (await board(builder, { ...w.query, ...q })).items.map((i) => i.id).sort();
    expect(await ids({})).toEqual([a.id, b.id].sort());
    expect(await ids({ diameterIn: '24' })).toEqual([b.id]);
    expect(await ids({ diameterIn: '26' })).toEqual([a.id]);
    expect(await ids({ rimWidthIn: '4' })).toEqual([b.id]);
    expect(await ids({ gauge: '12' })).toEqual([a.id]);
    expect(await ids({ spokes: '144' })).toEqual([b.id]);
    expect(await ids({ budgetMinCents: '50000' })).toEqual([b.id]);
    expect(await ids({ budgetMaxCents: '50000' })).toEqual([a.id]);
    expect(await ids({ neededByTo: w.day(2) })).toEqual([a.id]);
  });

  it('keeps to the shop’s capabilities by default, and shows everything when that is turned off', async () => {
    const w = ownWindow();
    const rider = await makeRider(db);
    const builder = await makeBuilder(db, { capabilities: { rimWidthsIn: [3], diametersIn: [26], gauges: [12, 14], spokeCounts: [36, 72] } });
    const fits = await openRequest(db, rider, { neededBy: w.day(1) });
    const tooWide = await openRequest(db, rider, { neededBy: w.day(2), wheels: [{ ...rearWheel, rimWidthMm: 120, tireWidthMm: 120 }] });
    const onDefault = await board(builder, w.query);
    expect(onDefault.capabilityFilter).toBe(true);
    expect(onDefault.items.map((i) => i.id)).toEqual([fits.id]);
    const all = await board(builder, { ...w.query, capabilityFilter: 'off' });
    expect(all.items.map((i) => i.id).sort()).toEqual([fits.id, tooWide.id].sort());
    expect(all.items.find((i) => i.id === tooWide.id)!.matchesCapabilities).toBe(false);
  });

  it('filters and sorts by distance from the shop in miles', async () => {
    const w = ownWindow();
    const builder = await makeBuilder(db, { zip: '87102', capabilities: wide }); // Albuquerque
    const rider = await makeRider(db);
    const santaFe = await openRequest(db, rider, { neededBy: w.day(1), zip: '87501' });
    const denver = await openRequest(db, rider, { neededBy: w.day(2), zip: '80202' });
    const boston = await openRequest(db, rider, { neededBy: w.day(3), zip: '02108' });
    const near = await board(builder, { ...w.query, maxMiles: '100' });
    expect(near.items.map((i) => i.id)).toEqual([santaFe.id]);
    expect(near.items[0].distanceMiles).toBeGreaterThan(50);
    expect(near.items[0].distanceMiles).toBeLessThan(70);
    const sorted = await board(builder, { ...w.query, sort: 'distance' });
    expect(sorted.items.map((i) => i.id)).toEqual([santaFe.id, denver.id, boston.id]);
    const within500 = await board(builder, { ...w.query, maxMiles: '500', sort: 'distance', order: 'desc' });
    expect(within500.items.map((i) => i.id)).toEqual([denver.id, santaFe.id]);
  });

  it('sorts by newest, needed-by and budget', async () => {
    const w = ownWindow();
    const rider = await makeRider(db);
    const builder = await makeBuilder(db, { capabilities: wide });
    const first = await openRequest(db, rider, { neededBy: w.day(3), budgetCents: 50_000 });
    const second = await openRequest(db, rider, { neededBy: w.day(1), budgetCents: 80_000 });
    const third = await openRequest(db, rider, { neededBy: w.day(2), budgetCents: 20_000 });
    const order = async (q: Record<string, string>) => (await board(builder, { ...w.query, ...q })).items.map((i) => i.id);
    expect(await order({})).toEqual([third.id, second.id, first.id]);
    expect(await order({ sort: 'neededBy' })).toEqual([second.id, third.id, first.id]);
    expect(await order({ sort: 'budget' })).toEqual([second.id, first.id, third.id]);
    expect(await order({ sort: 'budget', order: 'asc' })).toEqual([third.id, first.id, second.id]);
  });

  it('pages with a cursor, every row once, for every sort', async () => {
    const w = ownWindow(30);
    const rider = await makeRider(db);
    const builder = await makeBuilder(db, { capabilities: wide });
    const made = [];
    const zips = ['87501', '80202', '02108', '90802', '60601'];
    // Equal budgets and dates on purpose: ties are broken by id so no row is skipped or repeated.
    for (let i = 0; i < 11; i++) made.push((await openRequest(db, rider, { neededBy: w.day(i % 3), budgetCents: 30_000 + (i % 2) * 1_000, zip: zips[i % 5] })).id);
    for (const sort of ['newest', 'neededBy', 'budget', 'distance']) {
      const seen: string[] = [];
      let cursor: string | undefined;
      let pages = 0;
      do {
        const page = await board(builder, { ...w.query, sort, limit: '4', cursor });
        seen.push(...page.items.map((i) => i.id));
        cursor = page.nextCursor ?? undefined;
        pages += 1;
      } while (cursor);
      expect(pages).toBe(3);
      expect(seen.sort()).toEqual([...made].sort());
    }
    await expect(board(builder, { ...w.query, sort: 'budget', cursor: 'garbage' })).rejects.toThrow(Invalid);
  });

  it('shows the shop its own bid on a request and the number of live bids, never other amounts', async () => {
    const w = ownWindow();
    const rider = await makeRider(db);
    const builder = await makeBuilder(db, { capabilities: wide });
    const other = await makeBuilder(db, { capabilities: wide });
    const request = await openRequest(db, rider, { neededBy: w.day(1) });
    const mine = await bid(db, builder, request.id, { partsCents: 12_345 });
    await bid(db, other, request.id, { partsCents: 54_321 });
    const page = await board(builder, w.query);
    expect(page.items[0]).toMatchObject({ liveBidCount: 2, myBid: { id: mine.id, status: 'live', totalCents: mine.totalCents } });
    expect(JSON.stringify(page)).not.toContain(String(54_321 + 15_000 + 5_000 + 4_000));
  });

  it('is for builders with a shop', async () => {
    await expect(board(await makeRider(db), {})).rejects.toThrow(Forbidden);
  });

  it('rejects nonsense in the query string with field messages', () => {
    const r = boardQuerySchema.safeParse({ diameterIn: '23', maxMiles: '-5', sort: 'price', limit: '500', budgetMinCents: '5000', budgetMaxCents: '100' });
    expect(r.success).toBe(false);
    const fields = Object.keys(r.error!.flatten().fieldErrors);
    expect(fields).toEqual(expect.arrayContaining(['diameterIn', 'maxMiles', 'sort', 'limit']));
  });
});
