// Time-driven moves, run by the worker: bids past valid-until, requests past their expiry, and the
// rider's warning before a request expires. Each row moves in its own transaction with its lock held;
// rows another worker holds are skipped, not waited for.
import type { Knex } from 'knex';
import { bidExpiredMail, requestExpiredMail, requestExpiringMail } from '@/lib/mail/notices';
import { notify, riderEmail, shopMemberEmails } from './notify';
import type { BidRow, RequestRow } from './rows';
import { EXPIRY_WARNING_HOURS, moveBid, moveRequest } from './states';

const BATCH = 200;

/** live bids whose valid-until has passed → expired, and their shop told. */
export async function expireDueBids(db: Knex, now = new Date()): Promise<number> {
  let count = 0;
  for (;;) {
    const moved = await db.transaction(async (trx) => {
      const bid = (await trx('bids').where({ status: 'live' }).andWhere('valid_until', '<=', now).orderBy('valid_until').first().forUpdate().skipLocked()) as
        | BidRow
        | undefined;
      if (!bid) return false;
      await moveBid(trx, bid, 'expire');
      const request = await trx('wheel_requests').where({ id: bid.request_id }).first('id', 'title');
      await notify(trx, 'bid.expired', await shopMemberEmails(trx, bid.shop_id), (to) =>
        bidExpiredMail(to, { requestId: request.id, requestTitle: request.title, reason: 'valid-until' }),
      );
      return true;
    });
    if (!moved) return count;
    count += 1;
    if (count >= BATCH) return count;
  }
}

/** open requests past expires_at with no accepted bid → expired; their live bids expire with them. */
export async function expireDueRequests(db: Knex, now = new Date()): Promise<number> {
  let count = 0;
  for (;;) {
    const moved = await db.transaction(async (trx) => {
      const request = (await trx('wheel_requests')
        .where({ status: 'open' })
        .whereNull('accepted_bid_id')
        .andWhere('expires_at', '<=', now)
        .orderBy('expires_at')
        .first()
        .forUpdate()
        .skipLocked()) as RequestRow | undefined;
      if (!request) return false;
      await moveRequest(trx, request, 'expire', { closed_at: now });
      const live = (await trx('bids').where({ request_id: request.id, status: 'live' }).orderBy('id').forUpdate()) as BidRow[];
      for (const bid of live) {
        await moveBid(trx, bid, 'expire');
        await notify(trx, 'bid.expired', await shopMemberEmails(trx, bid.shop_id), (to) =>
          bidExpiredMail(to, { requestId: request.id, requestTitle: request.title, reason: 'request-expired' }),
        );
      }
      await notify(trx, 'request.expired', [await riderEmail(trx, request.rider_id)], (to) =>
        requestExpiredMail(to, { requestId: request.id, requestTitle: request.title }),
      );
      return true;
    });
    if (!moved) return count;
    count += 1;
    if (count >= BATCH) return count;
  }
}

/** Once per request: tell the rider it closes within EXPIRY_WARNING_HOURS. */
export async function warnExpiringRequests(db: Knex, now = new Date()): Promise<number> {
  const horizon = new Date(now.getTime() + EXPIRY_WARNING_HOURS * 3_600_000);
  let count = 0;
  for (;;) {
    const warned = await db.transaction(async (trx) => {
      const request = (await trx('wheel_requests')
        .where({ status: 'open' })
        .whereNull('expiry_warned_at')
        .andWhere('expires_at', '>', now)
        .andWhere('expires_at', '<=', horizon)
        .orderBy('expires_at')
        .first()
        .forUpdate()
        .skipLocked()) as RequestRow | undefined;
      if (!request) return false;
      await trx('wheel_requests').where({ id: request.id }).update({ expiry_warned_at: now });
      const live = await trx('bids').where({ request_id: request.id, status: 'live' }).count<{ n: string }[]>('* as n').first();
      await notify(
        trx,
        'request.expiring',
        [await riderEmail(trx, request.rider_id)],
        (to) => requestExpiringMail(to, { requestId: request.id, requestTitle: request.title, expiresAt: request.expires_at!, liveBidCount: Number(live?.n ?? 0) }),
        () => `request.expiring:${request.id}`,
      );
      return true;
    });
    if (!warned) return count;
    count += 1;
    if (count >= BATCH) return count;
  }
}
