import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { bidRevisedMail } from '@/lib/mail/notices';
import { lockShopBid } from './lockShopBid';
import { notify, riderEmail, shopName } from './notify';
import { bidColumns } from './placeBid';
import { assessProposal } from './proposal';
import { toBidView, type BidView } from './rows';
import type { BidInput } from './schema';
import { assertBidMove, assertRequestTakesBids, moveBid } from './states';

/** Replaces a live bid's price, lead time and terms while the request is still open. */
export async function reviseBid(db: Knex, actor: SessionUser, bidId: string, input: BidInput): Promise<BidView> {
  return db.transaction(async (trx) => {
    const { request, bid } = await lockShopBid(trx, actor, bidId);
    assertBidMove(bid.status, 'revise');
    assertRequestTakesBids(request);
    const proposal = assessProposal(request, input.proposedChange);
    const revised = await moveBid(trx, bid, 'revise', {
      ...bidColumns(input),
      proposed_change: (proposal ? JSON.stringify(proposal) : null) as never,
      revision: bid.revision + 1,
    });
    const name = await shopName(trx, bid.shop_id);
    await notify(trx, 'bid.revised', [await riderEmail(trx, request.rider_id)], (to) =>
      bidRevisedMail(to, { requestId: request.id, requestTitle: request.title, shopName: name, totalCents: revised.total_cents, leadTimeDays: revised.lead_time_days }),
    );
    return toBidView(revised);
  });
}
