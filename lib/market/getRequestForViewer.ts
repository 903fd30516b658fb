import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { isOwner, loadVisibleRequest } from './access';
import { toBidView, toRequestView, type BidRow, type BidView, type RequestView, type ShopFacts } from './rows';
import { shopFacts } from './shopFacts';
import { assessSpecCached, type WheelAssessment } from './spec';
import { canMoveRequest, isRequestEditable, nextStepForRider } from './states';
import { liveBidCount } from './updateRequest';

export interface RequestDetail extends RequestView {
  liveBidCount: number;
  /** The viewer may edit the details now (the rider, while a draft or open without bids). */
  editable: boolean;
  canPublish: boolean;
  canCancel: boolean;
  /** A builder whose shop has no live bid here may bid. */
  canBid: boolean;
  nextStep: string | null;
  /** The engine's findings per wheel, worked out from the spec as it is now. */
  fit: WheelAssessment[];
  /** The rider and admins see every bid; a builder sees only their own shop's bids. */
  bids: (BidView & { shop: ShopFacts | null })[];
}

export async function getRequestForViewer(db: Knex, viewer: SessionUser, requestId: string): Promise<RequestDetail> {
  const row = await loadVisibleRequest(db, viewer, requestId);
  const owner = isOwner(viewer, row);
  const bidQuery = db<BidRow>('bids').where({ request_id: row.id }).orderBy('created_at', 'desc');
  if (viewer.role === 'builder') bidQuery.andWhere('shop_id', viewer.shopId ?? '');
  const bids = (await bidQuery) as BidRow[];
  const facts = await shopFacts(db, bids.map((b) => b.shop_id), row);
  // Everyone but a builder has every bid in hand already; a builder sees only their own, so count in SQL.
  const live = viewer.role === 'builder' ? await liveBidCount(db, row.id) : bids.filter((b) => b.status === 'live').length;
  const ownLive = bids.some((b) => b.status === 'live' && b.shop_id === viewer.shopId);
  return {
    ...toRequestView(row),
    liveBidCount: live,
    editable: owner && isRequestEditable(row.status, live),
    canPublish: owner && canMoveRequest(row.status, 'publish'),
    canCancel: owner && canMoveRequest(row.status, 'cancel'),
    canBid: viewer.role === 'builder' && row.status === 'open' && !ownLive,
    nextStep: owner || viewer.role === 'admin' ? nextStepForRider(row, live) : null,
    fit: assessSpecCached(row.spec.wheels, row.spec.frame).wheels,
    bids: bids.map((b) => ({ ...toBidView(b), shop: facts.get(b.shop_id) ?? null })),
  };
}
