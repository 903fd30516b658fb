import { afterAll, describe, expect, it } from 'vitest';
import { Forbidden, Invalid } from '@/lib/errors';
import { getShopSettings, updateShopSettings } from '@/lib/market/shopSettings';
import { shopSettingsPatchSchema } from '@/lib/market/schema';
import { testDb } from '../../support/db';
import { makeBuilder, makeRider } from './fixtures';

const db = testDb();
afterAll(() => db.destroy());

describe('shop settings', () => {
  it('reads and updates capabilities, labour rate, location and builds at once', async () => {
    const builder = await makeBuilder(db, { zip: '87102' });
    const before = await getShopSettings(db, builder);
    expect(before).toMatchObject({ shopId: builder.shopId, city: 'Albuquerque', region: 'NM', buildsAtOnce: 1, labourRateCentsPerHour: null });
    expect(before.capabilities).toEqual({ rimWidthsIn: [], diametersIn: [], gauges: [], spokeCounts: [], hubDrilling: false, finishes: [] });

    const patch = shopSettingsPatchSchema.parse({
      capabilities: { rimWidthsIn: [3, 4], diametersIn: [24, 26], gauges: [12, 10], spokeCounts: [72, 144], hubDrilling: true, finishes: ['polished'] },
      labourRateCentsPerHour: 6_500,
      zip: '80202',
      buildsAtOnce: 3,
    });
    const after = await updateShopSettings(db, builder, patch);
    expect(after).toMatchObject({ city: 'Denver', region: 'CO', zip: '80202', buildsAtOnce: 3, labourRateCentsPerHour: 6_500 });
    expect(after.capabilities).toMatchObject({ rimWidthsIn: [3, 4], hubDrilling: true, finishes: ['polished'] });

    // A partial update leaves the rest alone.
    const partial = await updateShopSettings(db, builder, shopSettingsPatchSchema.parse({ buildsAtOnce: 2 }));
    expect(partial).toMatchObject({ city: 'Denver', buildsAtOnce: 2, labourRateCentsPerHour: 6_500 });
  });

  it('refuses riders, and ZIP codes the dataset does not know', async () => {
    await expect(getShopSettings(db, await makeRider(db))).rejects.toThrow(Forbidden);
    const builder = await makeBuilder(db);
    await expect(updateShopSettings(db, builder, { zip: '00000' })).rejects.toThrow(Invalid);
  });
});
