import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { isOwner, loadVisibleRequest } from './access';

export interface ThreadSummary {
  requestId: string;
  shopId: string;
  shopName: string;
  hasBid: boolean;
  messageCount: number;
  unreadCount: number;
  lastMessageAt: string | null;
  lastMessageExcerpt: string | null;
}

/**
 * The conversations on a request the viewer may see: the rider and admins see one per shop that bid
 * or wrote; a builder sees only their own shop's (even before the first message).
 */
export async function listThreads(db: Knex, actor: SessionUser, requestId: string): Promise<ThreadSummary[]> {
  const request = await loadVisibleRequest(db, actor, requestId);
  let shopIds: string[];
  if (actor.role === 'builder') shopIds = actor.shopId ? [actor.shopId] : [];
  else if (isOwner(actor, request) || actor.role === 'admin') {
    shopIds = await db
      .union([db('bids').where({ request_id: request.id }).select('shop_id'), db('messages').where({ request_id: request.id }).select('shop_id')])
      .pluck('shop_id');
  } else shopIds = [];
  if (shopIds.length === 0) return [];
  const rows = await db('shops as s')
    .whereIn('s.id', shopIds)
    .select(
      's.id as shop_id',
      's.name as shop_name',
      db.raw('exists (select 1 from bids b where b.request_id = ? and b.shop_id = s.id) as has_bid', [request.id]),
      db.raw('(select count(*)::int from messages m where m.request_id = ? and m.shop_id = s.id) as message_count', [request.id]),
      db.raw(
        `(select count(*)::int from messages m
           left join thread_reads tr on tr.user_id = ? and tr.request_id = m.request_id and tr.shop_id = m.shop_id
          where m.request_id = ? and m.shop_id = s.id and m.author_id is distinct from ?
            and (tr.last_read_at is null or m.created_at > tr.last_read_at)) as unread_count`,
        [actor.id, request.id, actor.id],
      ),
      db.raw(
        `(select json_build_object('at', m.created_at, 'body', m.body) from messages m
           where m.request_id = ? and m.shop_id = s.id order by m.created_at desc, m.id desc limit 1) as last_message`,
        [request.id],
      ),
    )
    .orderBy('s.name');
  return rows.map((r) => ({
    requestId: request.id,
    shopId: r.shop_id,
    shopName: r.shop_name,
    hasBid: r.has_bid,
    messageCount: r.message_count,
    unreadCount: actor.role === 'admin' ? 0 : r.unread_count,
    lastMessageAt: r.last_message ? new Date(r.last_message.at).toISOString() : null,
    lastMessageExcerpt: r.last_message ? String(r.last_message.body).slice(0, 140) : null,
  }));
}
