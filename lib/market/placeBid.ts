import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { Conflict, NotFound } from '@/lib/errors';
import { newBidMail } from '@/lib/mail/notices';
import { requireShopId } from './access';
import { notify, riderEmail, shopName } from './notify';
import { assessProposal } from './proposal';
import { toBidView, type BidRow, type BidView } from './rows';
import { endOfDayUtc, type BidInput } from './schema';
import { assertRequestTakesBids, lockRequest } from './states';

const ONE_LIVE_BID = 'Your shop already has a live bid on this request; revise that bid instead.';

export function bidColumns(input: BidInput) {
  return {
    parts_cents: input.partsCents,
    labour_cents: input.labourCents,
    finish_cents: input.finishCents,
    shipping_cents: input.shippingCents,
    lead_time_days: input.leadTimeDays,
    valid_until: endOfDayUtc(input.validUntil),
    message: input.message,
  };
}

/** A builder's bid on an open request: one live bid per shop, the rider told in the same transaction. */
export async function placeBid(db: Knex, actor: SessionUser, requestId: string, input: BidInput): Promise<BidView> {
  const shopId = requireShopId(actor);
  return db.transaction(async (trx) => {
    const request = await lockRequest(trx, requestId);
    if (request.status === 'draft') throw new NotFound('Request not found.');
    assertRequestTakesBids(request);
    if (await trx('bids').where({ request_id: request.id, shop_id: shopId, status: 'live' }).first('id')) throw new Conflict(ONE_LIVE_BID);
    const proposal = assessProposal(request, input.proposedChange);
    let bid: BidRow;
    try {
      [bid] = (await trx('bids')
        .insert({ ...bidColumns(input), request_id: request.id, shop_id: shopId, author_id: actor.id, proposed_change: proposal ? JSON.stringify(proposal) : null })
        .returning('*')) as BidRow[];
    } catch (err) {
      if ((err as { code?: string }).code === '23505') throw new Conflict(ONE_LIVE_BID);
      throw err;
    }
    const name = await shopName(trx, shopId);
    await notify(trx, 'bid.new', [await riderEmail(trx, request.rider_id)], (to) =>
      newBidMail(to, { requestId: request.id, requestTitle: request.title, shopName: name, totalCents: bid.total_cents, leadTimeDays: bid.lead_time_days }),
    );
    return toBidView(bid);
  });
}
