import { db } from '@/lib/db';
import { route } from '@/lib/http/route';
import { listShopBids } from '@/lib/market/listShopBids';
import { shopBidsQuerySchema } from '@/lib/market/schema';

// The builder's shop's bids, optionally one status (?status=live).
export const GET = route({ access: { roles: ['builder'] } }, async ({ user, req }) => {
  const filter = shopBidsQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  return { bids: await listShopBids(db, user!, filter) };
});
