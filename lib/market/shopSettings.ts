// A shop's settings: what it builds (capabilities), its labour rate, where it is, and how many builds fit at once.
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { Invalid, NotFound } from '@/lib/errors';
import { lookupZip } from '@/lib/geo/zip';
import { requireShopId } from './access';
import { shopCapabilities } from './board';
import type { Capabilities, ShopSettingsInput } from './schema';

export interface ShopSettings {
  shopId: string;
  name: string;
  capabilities: Capabilities;
  labourRateCentsPerHour: number | null;
  zip: string | null;
  city: string;
  region: string;
  latitude: number;
  longitude: number;
  buildsAtOnce: number;
}

async function readSettings(db: Knex, shopId: string): Promise<ShopSettings> {
  const s = await db('shops').where({ id: shopId }).first();
  if (!s) throw new NotFound('Shop not found.');
  return {
    shopId: s.id,
    name: s.name,
    capabilities: shopCapabilities(s.capabilities),
    labourRateCentsPerHour: s.labour_rate_cents_per_hour,
    zip: s.zip,
    city: s.city,
    region: s.region,
    latitude: s.latitude,
    longitude: s.longitude,
    buildsAtOnce: s.builds_at_once,
  };
}

export async function getShopSettings(db: Knex, actor: SessionUser): Promise<ShopSettings> {
  return readSettings(db, requireShopId(actor));
}

/** Updates the settings given; a new ZIP moves the shop to that ZIP's centre. */
export async function updateShopSettings(db: Knex, actor: SessionUser, patch: Partial<ShopSettingsInput>): Promise<ShopSettings> {
  const shopId = requireShopId(actor);
  const changes: Record<string, unknown> = {};
  if (patch.capabilities) changes.capabilities = JSON.stringify(patch.capabilities);
  if (patch.labourRateCentsPerHour !== undefined) changes.labour_rate_cents_per_hour = patch.labourRateCentsPerHour;
  if (patch.buildsAtOnce !== undefined) changes.builds_at_once = patch.buildsAtOnce;
  if (patch.zip !== undefined) {
    const place = lookupZip(patch.zip);
    if (!place) throw new Invalid('Check the location.', { zip: ['We could not find that ZIP code.'] });
    Object.assign(changes, { zip: place.zip, city: place.city, region: place.region, latitude: place.latitude, longitude: place.longitude });
  }
  if (Object.keys(changes).length > 0) await db('shops').where({ id: shopId }).update({ ...changes, updated_at: db.fn.now() });
  return readSettings(db, shopId);
}
