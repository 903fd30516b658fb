import type { Knex } from 'knex';
import bcrypt from 'bcryptjs';
import { DEMO_PASSWORD } from '../../lib/demo';

// DEMO DATA: invented people and shops in invented places around real US towns. Idempotent: re-running adds nothing.

const DEMO_SHOPS = [
  { slug: 'copperline-wheel-shop', name: 'Copperline Wheel Shop', city: 'Albuquerque', region: 'NM', zip: '87102', latitude: 35.0844, longitude: -106.6504,
    bio: 'Two benches, one truing stand older than both of us. We lace 72 and 144 spoke wheels for cruisers and lowriders.',
    capabilities: { rimWidthsIn: [3, 4], diametersIn: [24, 26], gauges: [14, 12, 10], spokeCounts: [36, 72, 144], hubDrilling: true, finishes: ['polished', 'powder coat'] } },
  { slug: 'harbor-street-spokesmiths', name: 'Harbor Street Spokesmiths', city: 'Long Beach', region: 'CA', zip: '90802', latitude: 33.7701, longitude: -118.1937,
    bio: 'Custom lowrider wheels, twisted and straight spokes, show finishes.',
    capabilities: { rimWidthsIn: [3, 4, 5], diametersIn: [20, 24, 26], gauges: [12, 10, 8], spokeCounts: [72, 144], hubDrilling: true, finishes: ['chrome-look', 'polished', 'painted'] } },
  { slug: 'prairie-hub-and-rim', name: 'Prairie Hub & Rim', city: 'Wichita', region: 'KS', zip: '67202', latitude: 37.6872, longitude: -97.3301,
    bio: 'Fat-tire and beach cruiser wheels, built for riding rather than showing.',
    capabilities: { rimWidthsIn: [3, 4], diametersIn: [26, 27.5, 29], gauges: [14, 13, 12], spokeCounts: [36, 72], hubDrilling: false, finishes: ['black', 'silver'] } },
  { slug: 'bayou-lowride-wheels', name: 'Bayou Lowride Wheels', city: 'Houston', region: 'TX', zip: '77002', latitude: 29.7589, longitude: -95.3677,
    bio: 'Heavy gauge, high spoke count, wide rims. Bring your frame and we will check the spacing.',
    capabilities: { rimWidthsIn: [4, 5], diametersIn: [24, 26], gauges: [12, 10, 8], spokeCounts: [72, 144], hubDrilling: true, finishes: ['polished', 'powder coat', 'painted'] } },
  { slug: 'lakeshore-wide-wheels', name: 'Lakeshore Wide Wheels', city: 'Milwaukee', region: 'WI', zip: '53202', latitude: 43.0439, longitude: -87.8967,
    bio: 'Winter fat bikes and summer cruisers. Wide rims are all we do.',
    capabilities: { rimWidthsIn: [3, 4, 5], diametersIn: [26, 27.5], gauges: [14, 12], spokeCounts: [36, 72], hubDrilling: false, finishes: ['black'] } },
  { slug: 'red-clay-truing-room', name: 'Red Clay Truing Room', city: 'Atlanta', region: 'GA', zip: '30303', latitude: 33.7525, longitude: -84.3915,
    bio: 'A one-person shop. Slow, careful, and happy to talk you out of parts that will not fit.',
    capabilities: { rimWidthsIn: [3], diametersIn: [24, 26], gauges: [14, 12], spokeCounts: [36, 72], hubDrilling: false, finishes: ['silver', 'polished'] } },
  { slug: 'tidewater-lace-works', name: 'Tidewater Lace Works', city: 'Norfolk', region: 'VA', zip: '23510', latitude: 36.8508, longitude: -76.2859,
    bio: 'Boardwalk cruisers and custom builds; we ship anywhere in the lower 48.',
    capabilities: { rimWidthsIn: [3, 4], diametersIn: [24, 26, 29], gauges: [14, 12, 10], spokeCounts: [36, 72, 144], hubDrilling: true, finishes: ['polished', 'painted'] } },
  { slug: 'foothill-fat-tire-lab', name: 'Foothill Fat Tire Lab', city: 'Denver', region: 'CO', zip: '80202', latitude: 39.7525, longitude: -104.9995,
    bio: 'Fat-tire wheels for snow and sand, 4 and 5 inch rims on wide hubs.',
    capabilities: { rimWidthsIn: [4, 5], diametersIn: [26, 27.5], gauges: [14, 13], spokeCounts: [36], hubDrilling: false, finishes: ['black', 'anodised'] } },
];

const DEMO_USERS = [
  { email: 'rider@demo.lacewright.test', name: 'Marisol Okafor', role: 'rider' },
  { email: 'rider2@demo.lacewright.test', name: 'Dev Lindqvist', role: 'rider' },
  { email: 'builder@demo.lacewright.test', name: 'Teo Halvorsen', role: 'builder', shop: 'copperline-wheel-shop' },
  { email: 'builder2@demo.lacewright.test', name: 'Rosa Bergamo', role: 'builder', shop: 'harbor-street-spokesmiths' },
  { email: 'builder3@demo.lacewright.test', name: 'Ike Nakamura-Voss', role: 'builder', shop: 'bayou-lowride-wheels' },
  { email: 'admin@demo.lacewright.test', name: 'Quinn Abernathy', role: 'admin' },
] as const;

export async function seed(knex: Knex): Promise<void> {
  const passwordHash = await bcrypt.hash(DEMO_PASSWORD, 11);
  await knex.transaction(async (trx) => {
    await trx('shops')
      .insert(DEMO_SHOPS.map((s) => ({ ...s, capabilities: JSON.stringify(s.capabilities) })))
      .onConflict('slug')
      .ignore();
    await trx('users')
      .insert(DEMO_USERS.map((u) => ({ email: u.email, name: u.name, role: u.role, password_hash: passwordHash, email_verified_at: trx.fn.now() })))
      .onConflict('email')
      .ignore();
    for (const u of DEMO_USERS) {
      if (!('shop' in u)) continue;
      const user = await trx('users').where({ email: u.email }).first('id');
      const shop = await trx('shops').where({ slug: u.shop }).first('id');
      await trx('shop_members').insert({ shop_id: shop.id, user_id: user.id, member_role: 'owner' }).onConflict(['shop_id', 'user_id']).ignore();
    }
  });
}
