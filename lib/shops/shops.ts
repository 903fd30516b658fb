import type { Knex } from 'knex';
import { NotFound } from '@/lib/errors';

export interface ShopSummary {
  id: string;
  name: string;
  slug: string;
  bio: string;
  city: string;
  region: string;
  zip: string | null;
  latitude: number;
  longitude: number;
  capabilities: Record<string, unknown>;
}

const SHOP_COLUMNS = ['id', 'name', 'slug', 'bio', 'city', 'region', 'zip', 'latitude', 'longitude', 'capabilities'];

export async function getShop(db: Knex, shopId: string): Promise<ShopSummary> {
  const shop = await db('shops').where({ id: shopId }).first(SHOP_COLUMNS);
  if (!shop) throw new NotFound('Shop not found.');
  return shop;
}

export async function listShops(db: Knex): Promise<ShopSummary[]> {
  return db('shops').orderBy('name').select(SHOP_COLUMNS);
}
