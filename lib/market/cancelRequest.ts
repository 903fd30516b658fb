import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { bidDeclinedMail } from '@/lib/mail/notices';
import { requireOwner } from './access';
import { notify, shopMemberEmails } from './notify';
import { toRequestView, type BidRow, type RequestView } from './rows';
import { lockRequest, moveBid, moveRequest } from './states';

/** Closes a draft or open request; any live bids are declined and their shops told. */
export async function cancelRequest(db: Knex, actor: SessionUser, requestId: string): Promise<RequestView> {
  return db.transaction(async (trx) => {
    const request = await lockRequest(trx, requestId);
    await requireOwner(trx, actor, request);
    const cancelled = await moveRequest(trx, request, 'cancel', { closed_at: new Date() });
    const live = (await trx('bids').where({ request_id: request.id, status: 'live' }).orderBy('id').forUpdate()) as BidRow[];
    for (const bid of live) {
      await moveBid(trx, bid, 'decline');
      await notify(trx, 'bid.declined', await shopMemberEmails(trx, bid.shop_id), (to) =>
        bidDeclinedMail(to, { requestId: request.id, requestTitle: request.title, reason: 'cancelled' }),
      );
    }
    return toRequestView(cancelled);
  });
}
