// The job an accepted bid becomes.
import type { Knex } from 'knex';
import type { BidRow, RequestRow } from './rows';

export interface JobView {
  id: string;
  requestId: string;
  bidId: string;
  riderId: string;
  shopId: string;
  priceCents: number;
  status: string;
}

/**
 * PAYMENTS SEAM: accepting a bid ends here, inside the accept transaction, with a job awaiting payment.
 * The payments module takes over from this row (escrow, then the build); hook it in here.
 */
export async function createJobAwaitingPayment(trx: Knex.Transaction, request: RequestRow, bid: BidRow): Promise<JobView> {
  const [job] = await trx('jobs')
    .insert({ request_id: request.id, bid_id: bid.id, rider_id: request.rider_id, shop_id: bid.shop_id, price_cents: bid.total_cents, status: 'awaiting_payment' })
    .returning('*');
  return { id: job.id, requestId: job.request_id, bidId: job.bid_id, riderId: job.rider_id, shopId: job.shop_id, priceCents: job.price_cents, status: job.status };
}

/** The job a request became, if a bid on it was accepted. */
export async function jobIdForRequest(db: Knex, requestId: string): Promise<string | null> {
  const row = await db('jobs').where({ request_id: requestId }).first('id');
  return row?.id ?? null;
}
