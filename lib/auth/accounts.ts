import type { Knex } from 'knex';
import { Conflict, Invalid } from '@/lib/errors';
import { lookupZip } from '@/lib/geo/zip';
import { uniqueShopSlug } from '@/lib/shops/slug';
import { hashPassword, verifyPassword } from './passwords';
import type { Role, SessionUser } from './roles';
import type { SignUpInput } from './schema';

interface UserRow {
  id: string;
  email: string;
  name: string;
  role: Role;
  password_hash: string | null;
}

/** Creates a rider, or a builder together with their shop, in one transaction. */
export async function createAccount(db: Knex, input: SignUpInput): Promise<SessionUser> {
  const place = input.role === 'builder' ? lookupZip(input.zip) : null;
  if (input.role === 'builder' && !place) {
    throw new Invalid('Check the shop details.', { zip: ['We could not find that ZIP code.'] });
  }
  const passwordHash = await hashPassword(input.password);
  return db.transaction(async (trx) => {
    const existing = await trx('users').where({ email: input.email }).first('id');
    if (existing) throw new Conflict('An account with that e-mail already exists.', { email: ['An account with that e-mail already exists.'] });
    const [user] = await trx('users')
      .insert({ email: input.email, name: input.name, role: input.role, password_hash: passwordHash })
      .returning(['id', 'email', 'name', 'role']);
    let shopId: string | null = null;
    if (input.role === 'builder' && place) {
      const [shop] = await trx('shops')
        .insert({
          name: input.shopName,
          slug: await uniqueShopSlug(trx, input.shopName),
          city: place.city,
          region: place.region,
          zip: place.zip,
          latitude: place.latitude,
          longitude: place.longitude,
        })
        .returning('id');
      shopId = shop.id;
      await trx('shop_members').insert({ shop_id: shopId, user_id: user.id, member_role: 'owner' });
    }
    return { ...user, shopId } as SessionUser;
  });
}

/** Checks an e-mail and password; the same answer (null) for an unknown e-mail and a wrong password. */
export async function verifyCredentials(db: Knex, email: string, password: string): Promise<SessionUser | null> {
  const row = await db<UserRow>('users').where({ email: email.trim().toLowerCase() }).first();
  if (!row?.password_hash) return null;
  if (!(await verifyPassword(password, row.password_hash))) return null;
  return loadSessionUser(db, row.id);
}

export async function loadSessionUser(db: Knex, userId: string): Promise<SessionUser | null> {
  const row = await db('users as u')
    .leftJoin('shop_members as m', 'm.user_id', 'u.id')
    .where('u.id', userId)
    .first('u.id', 'u.email', 'u.name', 'u.role', 'm.shop_id as shopId');
  return row ? { id: row.id, email: row.email, name: row.name, role: row.role, shopId: row.shopId ?? null } : null;
}
