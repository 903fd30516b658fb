// A shop's public profile: who they are, what they build, their photos, their rating and reviews, their
// completed builds and how long builds really take compared with what the shop promised.
import 'server-only';
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { NotFound } from '@/lib/errors';
import { shopCapabilities } from '@/lib/market/board';
import type { Capabilities } from '@/lib/market/schema';
import type { ReviewView } from '@/lib/reviews/rows';
import { shopRating, type ShopRating } from '@/lib/reviews/shopRatings';
import { listShopReviews } from '@/lib/reviews/shopReviews';
import { DAY_MS } from '@/lib/reviews/settings';
import { listUploads } from '@/lib/storage/listUploads';
import type { Storage } from '@/lib/storage/s3';
import type { UploadView } from '@/lib/storage/schema';
import { capabilitySummary } from './directory';

/** How many of the latest completed builds the lead time is worked out from. */
export const LEAD_TIME_SAMPLE = 50;

export interface LeadTimeJob {
  /** The lead time the shop promised in its accepted bid. */
  promisedDays: number;
  fundedAt: Date;
  shippedAt: Date;
}

export interface LeadTimeSummary {
  /** Completed builds with both a payment and a shipping time. */
  builds: number;
  /** Median days from payment into escrow to shipping (or ready for pickup), or null with no builds. */
  medianActualDays: number | null;
  medianPromisedDays: number | null;
  /** Builds shipped within the promised lead time. */
  onTime: number;
  /** onTime ÷ builds, or null with no builds. */
  onTimeShare: number | null;
}

function median(values: number[]): number | null {
  if (values.length === 0) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

/** Promised against actual, from funding to shipping. Pure, so it can be checked on its own. */
export function leadTimeSummary(jobs: LeadTimeJob[]): LeadTimeSummary {
  const actual = jobs.map((j) => Math.max(0, (j.shippedAt.getTime() - j.fundedAt.getTime()) / DAY_MS));
  const onTime = jobs.filter((j, i) => actual[i] <= j.promisedDays).length;
  return {
    builds: jobs.length,
    medianActualDays: median(actual),
    medianPromisedDays: median(jobs.map((j) => j.promisedDays)),
    onTime,
    onTimeShare: jobs.length ? onTime / jobs.length : null,
  };
}

export async function shopLeadTime(db: Knex, shopId: string): Promise<LeadTimeSummary> {
  const rows = (await db('jobs as j')
    .join('bids as b', 'b.id', 'j.bid_id')
    .where({ 'j.shop_id': shopId, 'j.status': 'completed' })
    .whereNotNull('j.funded_at')
    .whereNotNull('j.shipped_at')
    .orderBy('j.completed_at', 'desc')
    .limit(LEAD_TIME_SAMPLE)
    .select('b.lead_time_days', 'j.funded_at', 'j.shipped_at')) as { lead_time_days: number; funded_at: Date; shipped_at: Date }[];
  return leadTimeSummary(rows.map((r) => ({ promisedDays: r.lead_time_days, fundedAt: new Date(r.funded_at), shippedAt: new Date(r.shipped_at) })));
}

export interface ShopProfile {
  id: string;
  slug: string;
  name: string;
  bio: string;
  city: string;
  region: string;
  latitude: number;
  longitude: number;
  capabilities: Capabilities;
  summary: string;
  buildsAtOnce: number;
  rating: ShopRating;
  reviews: ReviewView[];
  completedBuilds: number;
  leadTime: LeadTimeSummary;
  photos: UploadView[];
  /** The viewer is a member of this shop (and so may add portfolio photos). */
  viewerIsMember: boolean;
}

export async function getShopProfile(db: Knex, slug: string, viewer: SessionUser | null, opts: { now?: Date; storage?: Storage } = {}): Promise<ShopProfile> {
  const now = opts.now ?? new Date();
  const shop = await db('shops')
    .where({ slug })
    .first(
      'id',
      'slug',
      'name',
      'bio',
      'city',
      'region',
      'latitude',
      'longitude',
      'capabilities',
      'builds_at_once',
      db.raw(`(select count(*)::int from jobs j where j.shop_id = shops.id and j.status = 'completed') as completed_builds`),
    );
  if (!shop) throw new NotFound('Shop not found.');
  const capabilities = shopCapabilities(shop.capabilities);
  const viewerIsMember = Boolean(viewer && (await db('shop_members').where({ shop_id: shop.id, user_id: viewer.id }).first('user_id')));
  const { uploads } = await listUploads(db, viewer, { purpose: 'portfolio', subjectId: shop.id }, opts.storage);
  return {
    id: shop.id,
    slug: shop.slug,
    name: shop.name,
    bio: shop.bio,
    city: shop.city,
    region: shop.region,
    latitude: shop.latitude,
    longitude: shop.longitude,
    capabilities,
    summary: capabilitySummary(capabilities),
    buildsAtOnce: shop.builds_at_once,
    rating: await shopRating(db, shop.id, now),
    reviews: await listShopReviews(db, shop.id, { now }),
    completedBuilds: shop.completed_builds,
    leadTime: await shopLeadTime(db, shop.id),
    photos: uploads,
    viewerIsMember,
  };
}
