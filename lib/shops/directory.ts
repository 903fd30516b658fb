import type { Knex } from 'knex';
import { z } from 'zod';
import { NotFound } from '@/lib/errors';

/** What a shop says it can build, as stored in shops.capabilities. */
export interface ShopCapabilities {
  rimWidthsIn?: number[];
  diametersIn?: number[];
  gauges?: number[];
  spokeCounts?: number[];
  hubDrilling?: boolean;
  finishes?: string[];
}

export const directoryFilterSchema = z.object({
  width: z.coerce.number().int().min(1).max(6).optional(),
  diameter: z.coerce.number().min(16).max(29).optional(),
  gauge: z.coerce.number().int().min(8).max(15).optional(),
  spokes: z.coerce.number().int().min(12).max(144).optional(),
  drilling: z.enum(['1']).optional(),
});
export type DirectoryFilter = z.infer<typeof directoryFilterSchema>;

export interface DirectoryShop {
  slug: string;
  name: string;
  city: string;
  region: string;
  latitude: number;
  longitude: number;
  bio: string;
  capabilities: ShopCapabilities;
  summary: string;
}

export function capabilitySummary(c: ShopCapabilities): string {
  const parts: string[] = [];
  if (c.rimWidthsIn?.length) parts.push(`${c.rimWidthsIn.join(', ')} inch rims`);
  if (c.diametersIn?.length) parts.push(`${c.diametersIn.join(', ')} inch wheels`);
  if (c.spokeCounts?.length) parts.push(`${c.spokeCounts.join('/')} spokes`);
  if (c.gauges?.length) parts.push(`gauge ${Math.max(...c.gauges)} to ${Math.min(...c.gauges)}`);
  if (c.hubDrilling) parts.push('drills hub flanges');
  return parts.join(' · ');
}

/** Shops for the map and the directory, narrowed by what they can build (jsonb containment, so the GIN index serves it). */
export async function listDirectoryShops(db: Knex, filter: DirectoryFilter = {}): Promise<DirectoryShop[]> {
  const q = db('shops').select('slug', 'name', 'city', 'region', 'latitude', 'longitude', 'bio', 'capabilities').orderBy('name');
  const contains = (key: keyof ShopCapabilities, value: unknown) => q.whereRaw('capabilities @> ?::jsonb', [JSON.stringify({ [key]: value })]);
  if (filter.width) contains('rimWidthsIn', [filter.width]);
  if (filter.diameter) contains('diametersIn', [filter.diameter]);
  if (filter.gauge) contains('gauges', [filter.gauge]);
  if (filter.spokes) contains('spokeCounts', [filter.spokes]);
  if (filter.drilling) contains('hubDrilling', true);
  const rows = await q;
  return rows.map((r) => ({ ...r, summary: capabilitySummary(r.capabilities ?? {}) }));
}

export async function getShopBySlug(db: Knex, slug: string): Promise<DirectoryShop> {
  const row = await db('shops').where({ slug }).first('slug', 'name', 'city', 'region', 'latitude', 'longitude', 'bio', 'capabilities');
  if (!row) throw new NotFound('Shop not found.');
  return { ...row, summary: capabilitySummary(row.capabilities ?? {}) };
}
