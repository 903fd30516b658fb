import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { NotFound } from '@/lib/errors';
import { isUuid, requireShopId } from './access';
import type { BidRow, RequestRow } from './rows';
import { lockBid, lockRequest } from './states';

/** Locks a shop's own bid and its request, request first (the order every market transaction uses). */
export async function lockShopBid(trx: Knex.Transaction, actor: SessionUser, bidId: string): Promise<{ request: RequestRow; bid: BidRow }> {
  const shopId = requireShopId(actor);
  const peek = isUuid(bidId) ? await trx('bids').where({ id: bidId }).first('request_id', 'shop_id') : undefined;
  // Another shop's bid is not even acknowledged.
  if (!peek || peek.shop_id !== shopId) throw new NotFound('Bid not found.');
  const request = await lockRequest(trx, peek.request_id);
  const bid = await lockBid(trx, bidId);
  return { request, bid };
}
