// A shop's rating from the reviews its riders wrote that are open to view. Hidden reviews do not count
// yet: a number that moved when a review arrived would give the review away before its time.
import type { Knex } from 'knex';
import { ratingSummary, type RatingSummary } from './score';
import { REVIEW_SETTINGS } from './settings';

export interface ShopRating extends RatingSummary {
  /** Mean stars per aspect, or null with no reviews. */
  aspects: { buildQuality: number | null; communication: number | null; onTime: number | null };
}

const EMPTY: ShopRating = { ...ratingSummary(0, 0, 0), aspects: { buildQuality: null, communication: null, onTime: null } };

/** Ratings for many shops at once; shops without visible reviews get an empty rating. */
export async function shopRatings(db: Knex, shopIds: string[], now = new Date()): Promise<Map<string, ShopRating>> {
  const ids = [...new Set(shopIds)];
  const result = new Map<string, ShopRating>(ids.map((id) => [id, EMPTY]));
  if (ids.length === 0) return result;
  const rows = await db('reviews')
    .where({ author_side: 'rider' })
    .whereIn('subject_shop_id', ids)
    .andWhere('hidden_until', '<=', now)
    .groupBy('subject_shop_id')
    .select(
      'subject_shop_id as shop_id',
      db.raw('count(*)::int as count'),
      db.raw('sum(overall)::int as stars'),
      db.raw('count(*) filter (where overall >= ?)::int as positive', [REVIEW_SETTINGS.positiveFromStars]),
      db.raw('avg(build_quality)::float8 as build_quality'),
      db.raw('avg(communication)::float8 as communication'),
      db.raw('avg(on_time)::float8 as on_time'),
    );
  for (const r of rows) {
    result.set(r.shop_id, {
      ...ratingSummary(r.count, r.stars, r.positive),
      aspects: { buildQuality: r.build_quality, communication: r.communication, onTime: r.on_time },
    });
  }
  return result;
}

export async function shopRating(db: Knex, shopId: string, now = new Date()): Promise<ShopRating> {
  return (await shopRatings(db, [shopId], now)).get(shopId)!;
}
