import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { shopSettingsPatchSchema, type ShopSettingsInput } from '@/lib/market/schema';
import { getShopSettings, updateShopSettings } from '@/lib/market/shopSettings';

export const GET = route({ access: { roles: ['builder'] } }, async ({ user }) => getShopSettings(db, user!));

export const PATCH = route<Partial<ShopSettingsInput>>({ access: { roles: ['builder'] }, body: shopSettingsPatchSchema }, async ({ user, body }) =>
  updateShopSettings(db, user!, body),
);
