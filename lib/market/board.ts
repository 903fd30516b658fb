// The builders' board: open requests, filtered and sorted, a page at a time with keyset paging
// (each page starts after the last row of the one before, so deep pages cost the same as the first).
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { Invalid, NotFound } from '@/lib/errors';
import type { Verdict } from '@/lib/wheel';
import { requireShopId } from './access';
import { boundingBox, milesSql, roundMiles } from './distance';
import { dateOnly, type StoredSpec } from './rows';
import { capabilitiesSchema, type BoardQuery, type BoardSort, type Capabilities, type Lacing, type WheelSpec } from './schema';
import { rimWidthClassIn } from './spec';
import type { BidStatus } from './states';

export interface BoardWheel {
  position: WheelSpec['position'];
  nominalDiameterIn: number;
  rimWidthMm: number;
  rimWidthIn: number;
  tireWidthMm: number;
  spokes: number;
  spokeGauge: number;
  lacing: Lacing;
  hubId: string;
  finish: string;
}

export interface BoardItem {
  id: string;
  title: string;
  city: string;
  region: string;
  delivery: 'ship' | 'pickup';
  neededBy: string;
  budgetCents: number;
  baseline: { lowCents: number; typicalCents: number; highCents: number };
  fitVerdict: Verdict;
  wheels: BoardWheel[];
  publishedAt: string;
  expiresAt: string;
  distanceMiles: number;
  liveBidCount: number;
  /** This shop's latest bid on the request, if any; other shops' amounts are never shown. */
  myBid: { id: string; status: BidStatus; totalCents: number } | null;
  matchesCapabilities: boolean;
}

export interface BoardPage {
  items: BoardItem[];
  /** Pass back as `cursor` for the next page; null on the last page. */
  nextCursor: string | null;
  sort: BoardSort;
  order: 'asc' | 'desc';
  capabilityFilter: boolean;
  capabilities: Capabilities;
}

const NEAREST_SEARCH_STEPS_MILES = [50, 200, 800];

const DEFAULT_ORDER: Record<BoardSort, 'asc' | 'desc'> = { newest: 'desc', neededBy: 'asc', budget: 'desc', distance: 'asc' };

interface Cursor {
  s: BoardSort;
  o: 'asc' | 'desc';
  v: string | number;
  id: string;
}

const encodeCursor = (c: Cursor) => Buffer.from(JSON.stringify(c)).toString('base64url');

function decodeCursor(raw: string, sort: BoardSort, order: 'asc' | 'desc'): Cursor {
  try {
    const c = JSON.parse(Buffer.from(raw, 'base64url').toString('utf8')) as Cursor;
    if (c.s === sort && c.o === order && typeof c.id === 'string' && (typeof c.v === 'string' || typeof c.v === 'number')) return c;
  } catch {
    /* falls through to the error below */
  }
  throw new Invalid('That page link is out of date; start from the first page.', { cursor: ['Start from the first page.'] });
}

/** Does every wheel of a request fall inside what the shop says it builds? Empty lists mean "any". */
export function matchesCapabilities(wheels: WheelSpec[], caps: Capabilities): boolean {
  const within = (list: number[], value: number) => list.length === 0 || list.includes(value);
  return wheels.every(
    (w) =>
      within(caps.diametersIn, w.nominalDiameterIn) &&
      within(caps.rimWidthsIn, rimWidthClassIn(w.rimWidthMm)) &&
      within(caps.gauges, w.spokeGauge) &&
      within(caps.spokeCounts, w.spokes),
  );
}

export function shopCapabilities(raw: unknown): Capabilities {
  const parsed = capabilitiesSchema.safeParse(raw ?? {});
  return parsed.success ? parsed.data : capabilitiesSchema.parse({});
}

export async function boardPage(db: Knex, actor: SessionUser, query: BoardQuery, now = new Date()): Promise<BoardPage> {
  const shopId = requireShopId(actor);
  const shop = await db('shops').where({ id: shopId }).first('id', 'latitude', 'longitude', 'capabilities');
  if (!shop) throw new NotFound('Shop not found.');
  const caps = shopCapabilities(shop.capabilities);
  const order = query.order ?? DEFAULT_ORDER[query.sort];
  const distance = milesSql(db, shop, 'r.latitude', 'r.longitude');

  const cursor = query.cursor ? decodeCursor(query.cursor, query.sort, order) : null;
  const sortKey: Record<BoardSort, { expr: Knex.Raw | string; cast: string }> = {
    newest: { expr: 'r.published_at', cast: 'timestamptz' },
    neededBy: { expr: 'r.needed_by', cast: 'date' },
    budget: { expr: 'r.budget_cents', cast: 'integer' },
    distance: { expr: distance, cast: 'double precision' },
  };
  const key = sortKey[query.sort];
  const keySql = typeof key.expr === 'string' ? db.raw('??', [key.expr]) : key.expr;

  /** One page of rows, optionally only those within `radiusMiles` of the shop. */
  const fetchRows = (radiusMiles: number | undefined) => {
    const q = db('wheel_requests as r').where('r.status', 'open').andWhere('r.expires_at', '>', now);
    if (query.diameterIn !== undefined) q.whereRaw('r.diameters_in @> array[?]::numeric[]', [query.diameterIn]);
    if (query.rimWidthIn !== undefined) q.whereRaw('r.rim_widths_in @> array[?]::numeric[]', [query.rimWidthIn]);
    if (query.gauge !== undefined) q.whereRaw('r.spoke_gauges @> array[?]::integer[]', [query.gauge]);
    if (query.spokes !== undefined) q.whereRaw('r.spoke_counts @> array[?]::integer[]', [query.spokes]);
    if (query.budgetMinCents !== undefined) q.where('r.budget_cents', '>=', query.budgetMinCents);
    if (query.budgetMaxCents !== undefined) q.where('r.budget_cents', '<=', query.budgetMaxCents);
    if (query.neededByFrom) q.where('r.needed_by', '>=', query.neededByFrom);
    if (query.neededByTo) q.where('r.needed_by', '<=', query.neededByTo);
    if (radiusMiles !== undefined) {
      const box = boundingBox(shop, radiusMiles);
      // Both axes in one box test, which the open requests' covering point index answers (see its migration).
      if (box.minLon !== null && box.maxLon !== null) {
        q.whereRaw('point(r.longitude, r.latitude) <@ box(point(?::float8, ?::float8), point(?::float8, ?::float8))', [box.minLon, box.minLat, box.maxLon, box.maxLat]);
      } else q.whereBetween('r.latitude', [box.minLat, box.maxLat]);
      q.where(distance, '<=', radiusMiles);
    }
    if (query.capabilityFilter) {
      // A request is shown when all of its wheels are inside the shop's lists (<@: "contained in").
      if (caps.diametersIn.length) q.whereRaw('r.diameters_in <@ ?::numeric[]', [caps.diametersIn]);
      if (caps.rimWidthsIn.length) q.whereRaw('r.rim_widths_in <@ ?::numeric[]', [caps.rimWidthsIn]);
      if (caps.gauges.length) q.whereRaw('r.spoke_gauges <@ ?::integer[]', [caps.gauges]);
      if (caps.spokeCounts.length) q.whereRaw('r.spoke_counts <@ ?::integer[]', [caps.spokeCounts]);
    }
    if (cursor) q.whereRaw(`(${keySql.toQuery()}, r.id) ${order === 'asc' ? '>' : '<'} (?::${key.cast}, ?::uuid)`, [cursor.v, cursor.id]);
    const pageOrder = `${keySql.toQuery()} ${order}, r.id ${order}`;
    // The page's ids first, from the filter and sort columns alone (a radius search reads them all from
    // its covering index, never from the table), then the full rows and their bid counts for that page only.
    const page = q.orderByRaw(pageOrder).select('r.id').limit(query.limit + 1);
    return db
      .from(page.as('page'))
      .join('wheel_requests as r', 'r.id', 'page.id')
      .orderByRaw(pageOrder)
      .select(
        'r.id',
        'r.title',
        'r.city',
        'r.region',
        'r.delivery',
        'r.needed_by',
        'r.budget_cents',
        'r.baseline_low_cents',
        'r.baseline_cents',
        'r.baseline_high_cents',
        'r.fit_verdict',
        'r.spec',
        'r.published_at',
        'r.expires_at',
        // Full microsecond precision for the cursor; a JS Date would drop it and skip rows.
        db.raw(`to_json(r.published_at) #>> '{}' as published_key`),
        db.raw('? as distance_miles', [distance]),
        db.raw(`(select count(*)::int from bids b where b.request_id = r.id and b.status = 'live') as live_bid_count`),
        db.raw(
          `(select json_build_object('id', b.id, 'status', b.status, 'totalCents', b.total_cents)
              from bids b where b.request_id = r.id and b.shop_id = ? order by b.created_at desc limit 1) as my_bid`,
          [shopId],
        ),
      );
  };

  let rows: Awaited<ReturnType<typeof fetchRows>> | undefined;
  if (query.sort === 'distance' && order === 'asc') {
    // Nearest first: look in growing circles beyond the last row shown and stop at the first circle
    // that fills a page. Every row inside a circle is nearer than every row outside it, so the page is
    // exact, and it costs a look at nearby rows instead of a distance for every open request.
    const from = cursor ? Number(cursor.v) : 0;
    for (const step of NEAREST_SEARCH_STEPS_MILES) {
      if (query.maxMiles !== undefined && from + step >= query.maxMiles) break;
      const found = await fetchRows(from + step);
      if (found.length > query.limit) {
        rows = found;
        break;
      }
    }
  }
  rows ??= await fetchRows(query.maxMiles);

  const hasMore = rows.length > query.limit;
  const page = rows.slice(0, query.limit);
  const items: BoardItem[] = page.map((r) => {
    const spec = r.spec as StoredSpec;
    return {
      id: r.id,
      title: r.title,
      city: r.city,
      region: r.region,
      delivery: r.delivery,
      neededBy: dateOnly(r.needed_by),
      budgetCents: r.budget_cents,
      baseline: { lowCents: r.baseline_low_cents, typicalCents: r.baseline_cents, highCents: r.baseline_high_cents },
      fitVerdict: r.fit_verdict,
      wheels: spec.wheels.map((w) => ({ ...w, rimWidthIn: rimWidthClassIn(w.rimWidthMm) })),
      publishedAt: new Date(r.published_at).toISOString(),
      expiresAt: new Date(r.expires_at).toISOString(),
      distanceMiles: roundMiles(r.distance_miles),
      liveBidCount: r.live_bid_count,
      myBid: r.my_bid ?? null,
      matchesCapabilities: matchesCapabilities(spec.wheels, caps),
    };
  });
  const last = page[page.length - 1];
  const lastValue = (): string | number => {
    if (query.sort === 'newest') return last.published_key;
    if (query.sort === 'neededBy') return dateOnly(last.needed_by);
    if (query.sort === 'budget') return last.budget_cents;
    return last.distance_miles;
  };
  return {
    items,
    nextCursor: hasMore && last ? encodeCursor({ s: query.sort, o: order, v: lastValue(), id: last.id }) : null,
    sort: query.sort,
    order,
    capabilityFilter: query.capabilityFilter,
    capabilities: caps,
  };
}
