import type { Knex } from 'knex';
import { shopRatings } from '@/lib/reviews/shopRatings';
import { milesBetween, roundMiles, type Point } from './distance';
import type { ShopFacts } from './rows';

/** Name, place, rating (reviews open to view), completed builds and distance for the shops behind some bids. */
export async function shopFacts(db: Knex, shopIds: string[], from: Point, now = new Date()): Promise<Map<string, ShopFacts>> {
  const ids = [...new Set(shopIds)];
  if (ids.length === 0) return new Map();
  const rows = await db('shops as s')
    .whereIn('s.id', ids)
    .select(
      's.id',
      's.name',
      's.slug',
      's.city',
      's.region',
      's.latitude',
      's.longitude',
      db.raw(`(select count(*)::int from jobs j where j.shop_id = s.id and j.status = 'completed') as completed_builds`),
    );
  const ratings = await shopRatings(db, ids, now);
  return new Map(
    rows.map((s) => [
      s.id,
      {
        id: s.id,
        name: s.name,
        slug: s.slug,
        city: s.city,
        region: s.region,
        rating: ratings.get(s.id)?.average ?? null,
        ratingCount: ratings.get(s.id)?.count ?? 0,
        completedBuilds: s.completed_builds,
        distanceMiles: roundMiles(milesBetween(from, s)),
      },
    ]),
  );
}
