import { db } from '@/lib/db';
import { Forbidden } from '@/lib/errors';
import { route } from '@/lib/http/route';
import { getShop } from '@/lib/shops/shops';

// The signed-in builder's own shop.
export const GET = route({ access: { roles: ['builder'] } }, async ({ user }) => {
  if (!user?.shopId) throw new Forbidden('Your account is not a member of a shop.');
  return getShop(db, user.shopId);
});
