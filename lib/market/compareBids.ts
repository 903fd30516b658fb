import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { Forbidden } from '@/lib/errors';
import { isOwner, loadVisibleRequest } from './access';
import { dateOnly, type BidRow, type StoredProposedChange } from './rows';
import { shopFacts } from './shopFacts';
import { canMoveBid } from './states';

export interface BidComparisonRow {
  bidId: string;
  status: BidRow['status'];
  shopId: string;
  shopName: string;
  shopCity: string;
  shopRegion: string;
  rating: number | null;
  ratingCount: number;
  completedBuilds: number;
  distanceMiles: number;
  partsCents: number;
  labourCents: number;
  finishCents: number;
  shippingCents: number;
  totalCents: number;
  /** Total minus the request's typical baseline: positive above, negative below. */
  vsBaselineCents: number;
  vsBaselinePercent: number;
  vsBaseline: 'above' | 'below' | 'at';
  /** Inside the baseline's low-to-high band. */
  withinBaselineBand: boolean;
  leadTimeDays: number;
  /** The date the wheel would be ready if the bid were accepted today (UTC). */
  readyBy: string;
  meetsNeededBy: boolean;
  validUntil: string;
  message: string;
  proposedChange: StoredProposedChange | null;
  revision: number;
  canAccept: boolean;
}

export interface BidComparison {
  requestId: string;
  requestStatus: string;
  budgetCents: number;
  neededBy: string;
  baseline: { lowCents: number; typicalCents: number; highCents: number };
  rows: BidComparisonRow[];
}

const addDays = (date: Date, days: number) => new Date(date.getTime() + days * 86_400_000);

/** For the request's rider (and admins): each live or accepted bid set against the baseline and the dates. */
export async function compareBids(db: Knex, actor: SessionUser, requestId: string, now = new Date()): Promise<BidComparison> {
  const request = await loadVisibleRequest(db, actor, requestId);
  if (!isOwner(actor, request) && actor.role !== 'admin') throw new Forbidden('Only the rider who posted this request can compare its bids.');
  const bids = (await db('bids').where({ request_id: request.id }).whereIn('status', ['live', 'accepted']).orderBy('total_cents').orderBy('created_at')) as BidRow[];
  const facts = await shopFacts(db, bids.map((b) => b.shop_id), request);
  const neededBy = dateOnly(request.needed_by);
  const typical = request.baseline_cents;
  return {
    requestId: request.id,
    requestStatus: request.status,
    budgetCents: request.budget_cents,
    neededBy,
    baseline: { lowCents: request.baseline_low_cents, typicalCents: typical, highCents: request.baseline_high_cents },
    rows: bids.map((b) => {
      const shop = facts.get(b.shop_id)!;
      const diff = b.total_cents - typical;
      const readyBy = addDays(now, b.lead_time_days).toISOString().slice(0, 10);
      return {
        bidId: b.id,
        status: b.status,
        shopId: b.shop_id,
        shopName: shop.name,
        shopCity: shop.city,
        shopRegion: shop.region,
        rating: shop.rating,
        ratingCount: shop.ratingCount,
        completedBuilds: shop.completedBuilds,
        distanceMiles: shop.distanceMiles,
        partsCents: b.parts_cents,
        labourCents: b.labour_cents,
        finishCents: b.finish_cents,
        shippingCents: b.shipping_cents,
        totalCents: b.total_cents,
        vsBaselineCents: diff,
        vsBaselinePercent: typical > 0 ? Math.round((diff / typical) * 1000) / 10 : 0,
        vsBaseline: diff > 0 ? 'above' : diff < 0 ? 'below' : 'at',
        withinBaselineBand: b.total_cents >= request.baseline_low_cents && b.total_cents <= request.baseline_high_cents,
        leadTimeDays: b.lead_time_days,
        readyBy,
        meetsNeededBy: readyBy <= neededBy,
        validUntil: new Date(b.valid_until).toISOString(),
        message: b.message,
        proposedChange: b.proposed_change,
        revision: b.revision,
        canAccept:
          request.status === 'open' && canMoveBid(b.status, 'accept') && b.valid_until.getTime() > now.getTime() && isOwner(actor, request),
      };
    }),
  };
}
