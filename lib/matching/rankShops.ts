// Which shops suit a request, best first, with the reasons: for the invitations sent when a request is
// published, for tests and for anyone reviewing the matcher's choices.
import type { Knex } from 'knex';
import { NotFound } from '@/lib/errors';
import { isUuid } from '@/lib/market/access';
import { shopCapabilities } from '@/lib/market/board';
import { milesBetween, roundMiles } from '@/lib/market/distance';
import type { RequestRow } from '@/lib/market/rows';
import { shopRatings } from '@/lib/reviews/shopRatings';
import { requestNeeds } from './needs';
import { meetsHardNeeds, scoreCandidate, type MatchParts } from './score';
import { MATCH_SETTINGS, OPEN_JOB_STATUSES } from './settings';

export interface RankedShop {
  shopId: string;
  slug: string;
  name: string;
  city: string;
  region: string;
  score: number;
  parts: MatchParts;
  reasons: string[];
  distanceMiles: number;
  openJobs: number;
  buildsAtOnce: number;
  rating: { average: number | null; count: number; score: number };
  /** Already invited to this request (by the matcher or the rider). */
  invited: boolean;
  /** Already bid on this request. */
  hasBid: boolean;
}

type MatchRequest = Pick<RequestRow, 'id' | 'spec' | 'delivery' | 'latitude' | 'longitude'>;

/** Every eligible shop for the request, best first (ties: nearer, then by name). */
export async function rankShops(db: Knex, request: MatchRequest, now = new Date()): Promise<RankedShop[]> {
  const needs = requestNeeds(request.spec);
  if (needs.length === 0) return [];
  // The rim widths and wheel sizes must be on the shop's lists: containment lets the index narrow the shops.
  const hard = { rimWidthsIn: [...new Set(needs.map((n) => n.rimWidthIn))], diametersIn: [...new Set(needs.map((n) => n.diameterIn))] };
  const rows = await db('shops as s')
    .whereRaw('s.capabilities @> ?::jsonb', [JSON.stringify(hard)])
    .select(
      's.id',
      's.slug',
      's.name',
      's.city',
      's.region',
      's.latitude',
      's.longitude',
      's.capabilities',
      's.builds_at_once',
      db.raw('(select count(*)::int from jobs j where j.shop_id = s.id and j.status = any(?)) as open_jobs', [OPEN_JOB_STATUSES as unknown as string[]]),
      db.raw('exists (select 1 from shop_invitations i where i.request_id = ? and i.shop_id = s.id) as invited', [request.id]),
      db.raw('exists (select 1 from bids b where b.request_id = ? and b.shop_id = s.id) as has_bid', [request.id]),
    );
  const ratings = await shopRatings(
    db,
    rows.map((r) => r.id as string),
    now,
  );
  const ranked: RankedShop[] = [];
  for (const r of rows) {
    const capabilities = shopCapabilities(r.capabilities);
    if (!meetsHardNeeds(needs, capabilities)) continue;
    const distanceMiles = milesBetween(request, r);
    if (request.delivery === 'pickup' && distanceMiles > MATCH_SETTINGS.pickupRadiusMiles) continue;
    const rating = ratings.get(r.id)!;
    const scored = scoreCandidate(needs, { capabilities, distanceMiles, rating, openJobs: r.open_jobs, buildsAtOnce: r.builds_at_once });
    ranked.push({
      shopId: r.id,
      slug: r.slug,
      name: r.name,
      city: r.city,
      region: r.region,
      score: scored.score,
      parts: scored.parts,
      reasons: scored.reasons,
      distanceMiles: roundMiles(distanceMiles),
      openJobs: r.open_jobs,
      buildsAtOnce: r.builds_at_once,
      rating: { average: rating.average, count: rating.count, score: rating.score },
      invited: r.invited,
      hasBid: r.has_bid,
    });
  }
  return ranked.sort((a, b) => b.score - a.score || a.distanceMiles - b.distanceMiles || a.name.localeCompare(b.name) || a.shopId.localeCompare(b.shopId));
}

export async function rankShopsForRequest(db: Knex, requestId: string, now = new Date()): Promise<RankedShop[]> {
  const request = isUuid(requestId) ? ((await db('wheel_requests').where({ id: requestId }).first()) as RequestRow | undefined) : undefined;
  if (!request) throw new NotFound('Request not found.');
  return rankShops(db, request, now);
}
