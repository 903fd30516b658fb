// The reviews riders wrote about a shop that anyone may read: only those open to view, newest first.
import type { Knex } from 'knex';
import { firstName, toReviewView, type ReviewRow, type ReviewView } from './rows';

export async function listShopReviews(db: Knex, shopId: string, opts: { now?: Date; limit?: number } = {}): Promise<ReviewView[]> {
  const now = opts.now ?? new Date();
  const rows = (await db('reviews as r')
    .leftJoin('users as u', 'u.id', 'r.author_id')
    .where({ 'r.author_side': 'rider', 'r.subject_shop_id': shopId })
    .andWhere('r.hidden_until', '<=', now)
    .orderBy([
      { column: 'r.created_at', order: 'desc' },
      { column: 'r.id', order: 'desc' },
    ])
    .limit(opts.limit ?? 20)
    .select('r.*', 'u.name as author_name')) as (ReviewRow & { author_name: string | null })[];
  return rows.map((row) => toReviewView(row, firstName(row.author_name), false));
}
