import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { NotFound } from '@/lib/errors';
import { bidAcceptedMail, bidDeclinedMail } from '@/lib/mail/notices';
import { requireOwner } from './access';
import { createJobAwaitingPayment, type JobView } from './jobs';
import { notify, shopMemberEmails } from './notify';
import { toBidView, toRequestView, type BidRow, type BidView, type RequestView } from './rows';
import { assertBidMove, assertBidStillValid, assertRequestMove, assertRequestTakesBids, lockBid, lockRequest, moveBid, moveRequest } from './states';

export interface AcceptResult {
  request: RequestView;
  bid: BidView;
  job: JobView;
}

/**
 * The request's rider accepts one live bid: it becomes accepted, every other live bid is declined
 * and its shop told, the request is awarded, and a job awaits payment. All in one transaction.
 */
export async function acceptBid(db: Knex, actor: SessionUser, requestId: string, bidId: string): Promise<AcceptResult> {
  return db.transaction(async (trx) => {
    const request = await lockRequest(trx, requestId);
    await requireOwner(trx, actor, request);
    assertRequestMove(request.status, 'award');
    assertRequestTakesBids(request);
    const bid = await lockBid(trx, bidId);
    if (bid.request_id !== request.id) throw new NotFound('Bid not found on this request.');
    assertBidMove(bid.status, 'accept');
    assertBidStillValid(bid);

    const now = new Date();
    const accepted = await moveBid(trx, bid, 'accept');
    const others = (await trx('bids').where({ request_id: request.id, status: 'live' }).whereNot({ id: bid.id }).orderBy('id').forUpdate()) as BidRow[];
    for (const other of others) {
      await moveBid(trx, other, 'decline');
      await notify(trx, 'bid.declined', await shopMemberEmails(trx, other.shop_id), (to) =>
        bidDeclinedMail(to, { requestId: request.id, requestTitle: request.title, reason: 'other-bid' }),
      );
    }
    const awarded = await moveRequest(trx, request, 'award', { accepted_bid_id: bid.id, closed_at: now });
    const job = await createJobAwaitingPayment(trx, awarded, accepted);
    await notify(trx, 'bid.accepted', await shopMemberEmails(trx, bid.shop_id), (to) =>
      bidAcceptedMail(to, { requestId: request.id, requestTitle: request.title, totalCents: accepted.total_cents }),
    );
    return { request: toRequestView(awarded), bid: toBidView(accepted), job };
  });
}
