import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { Forbidden } from '@/lib/errors';
import { toRequestView, type RequestRow, type RequestView } from './rows';
import { isRequestEditable, nextStepForRider } from './states';

export interface RiderRequestSummary extends RequestView {
  liveBidCount: number;
  lowestLiveBidCents: number | null;
  unreadMessages: number;
  editable: boolean;
  nextStep: string;
}

/** A rider's own requests, newest first, each with what happens next; admins see everyone's. */
export async function listRiderRequests(db: Knex, actor: SessionUser): Promise<RiderRequestSummary[]> {
  if (actor.role === 'builder') throw new Forbidden('Builders find requests on the board.');
  const query = db('wheel_requests as r')
    .select(
      'r.*',
      db.raw(`(select count(*)::int from bids b where b.request_id = r.id and b.status = 'live') as live_bid_count`),
      db.raw(`(select min(b.total_cents) from bids b where b.request_id = r.id and b.status = 'live') as lowest_live_bid_cents`),
      db.raw(
        `(select count(*)::int from messages m
           left join thread_reads tr on tr.user_id = ? and tr.request_id = m.request_id and tr.shop_id = m.shop_id
          where m.request_id = r.id and m.author_id is distinct from ? and (tr.last_read_at is null or m.created_at > tr.last_read_at)) as unread_messages`,
        [actor.id, actor.id],
      ),
    )
    .orderBy('r.created_at', 'desc')
    .orderBy('r.id', 'desc');
  if (actor.role === 'rider') query.where('r.rider_id', actor.id);
  else query.limit(500);
  const rows = (await query) as (RequestRow & { live_bid_count: number; lowest_live_bid_cents: number | null; unread_messages: number })[];
  return rows.map((r) => ({
    ...toRequestView(r),
    liveBidCount: r.live_bid_count,
    lowestLiveBidCents: r.lowest_live_bid_cents,
    unreadMessages: r.unread_messages,
    editable: actor.role === 'rider' && isRequestEditable(r.status, r.live_bid_count),
    nextStep: nextStepForRider(r, r.live_bid_count),
  }));
}
