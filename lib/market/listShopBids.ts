import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { requireShopId } from './access';
import { dateOnly, toBidView, type BidRow, type BidView } from './rows';
import { nextStepForShop, type BidStatus, type RequestStatus } from './states';

export interface ShopBidSummary extends BidView {
  request: { id: string; title: string; status: RequestStatus; neededBy: string; city: string; region: string; budgetCents: number; baselineCents: number };
  unreadMessages: number;
  nextStep: string;
}

/** "My bids": every bid of the builder's shop, newest first, with its request and unread messages. */
export async function listShopBids(db: Knex, actor: SessionUser, filter: { status?: BidStatus } = {}): Promise<ShopBidSummary[]> {
  const shopId = requireShopId(actor);
  const query = db('bids as b')
    .join('wheel_requests as r', 'r.id', 'b.request_id')
    .where('b.shop_id', shopId)
    .select(
      'b.*',
      'r.title as r_title',
      'r.status as r_status',
      'r.needed_by as r_needed_by',
      'r.city as r_city',
      'r.region as r_region',
      'r.budget_cents as r_budget_cents',
      'r.baseline_cents as r_baseline_cents',
      db.raw(
        `(select count(*)::int from messages m
           left join thread_reads tr on tr.user_id = ? and tr.request_id = m.request_id and tr.shop_id = m.shop_id
          where m.request_id = b.request_id and m.shop_id = b.shop_id and m.author_id is distinct from ?
            and (tr.last_read_at is null or m.created_at > tr.last_read_at)) as unread_messages`,
        [actor.id, actor.id],
      ),
    )
    .orderBy('b.created_at', 'desc')
    .orderBy('b.id', 'desc')
    .limit(500);
  if (filter.status) query.andWhere('b.status', filter.status);
  const rows = (await query) as (BidRow & {
    r_title: string;
    r_status: RequestStatus;
    r_needed_by: Date;
    r_city: string;
    r_region: string;
    r_budget_cents: number;
    r_baseline_cents: number;
    unread_messages: number;
  })[];
  return rows.map((row) => ({
    ...toBidView(row),
    request: {
      id: row.request_id,
      title: row.r_title,
      status: row.r_status,
      neededBy: dateOnly(row.r_needed_by),
      city: row.r_city,
      region: row.r_region,
      budgetCents: row.r_budget_cents,
      baselineCents: row.r_baseline_cents,
    },
    unreadMessages: row.unread_messages,
    nextStep: nextStepForShop(row.status),
  }));
}
