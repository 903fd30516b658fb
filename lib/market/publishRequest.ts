import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { Invalid } from '@/lib/errors';
import { inviteMatchingShops } from '@/lib/matching/invitations';
import { requireOwner } from './access';
import { dateOnly, toRequestView, type RequestRow, type RequestView } from './rows';
import { todayUtc } from './schema';
import { REQUEST_OPEN_DAYS, lockRequest, moveRequest } from './states';

/** draft → open, inside the caller's transaction with the row already locked; invites the best-matched shops. */
export async function publishLocked(trx: Knex.Transaction, request: RequestRow, now = new Date()): Promise<RequestRow> {
  if (dateOnly(request.needed_by) <= todayUtc(now)) {
    throw new Invalid('The needed-by date has passed; change it before publishing.', { neededBy: ['The needed-by date must be in the future.'] });
  }
  const published = await moveRequest(trx, request, 'publish', {
    published_at: now,
    expires_at: new Date(now.getTime() + REQUEST_OPEN_DAYS * 86_400_000),
  });
  // The best-matched shops are invited to bid in this same transaction.
  await inviteMatchingShops(trx, published, now);
  return published;
}

export async function publishRequest(db: Knex, actor: SessionUser, requestId: string): Promise<RequestView> {
  return db.transaction(async (trx) => {
    const request = await lockRequest(trx, requestId);
    await requireOwner(trx, actor, request);
    return toRequestView(await publishLocked(trx, request));
  });
}
