import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { lockShopBid } from './lockShopBid';
import { toBidView, type BidView } from './rows';
import { moveBid } from './states';

/** live → withdrawn, by a member of the bidding shop. */
export async function withdrawBid(db: Knex, actor: SessionUser, bidId: string): Promise<BidView> {
  return db.transaction(async (trx) => {
    const { bid } = await lockShopBid(trx, actor, bidId);
    return toBidView(await moveBid(trx, bid, 'withdraw'));
  });
}
