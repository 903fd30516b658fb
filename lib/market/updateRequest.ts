import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { requireOwner } from './access';
import { requestRecord } from './requestRecord';
import { toRequestView, type RequestRow, type RequestView } from './rows';
import type { RequestInput } from './schema';
import { assertRequestEditable, lockRequest } from './states';

export async function liveBidCount(db: Knex, requestId: string): Promise<number> {
  const row = await db('bids').where({ request_id: requestId, status: 'live' }).count<{ n: string }[]>('* as n').first();
  return Number(row?.n ?? 0);
}

/** Replaces the request's details while it is a draft, or open with no live bid. */
export async function updateRequest(db: Knex, actor: SessionUser, requestId: string, input: RequestInput): Promise<RequestView> {
  const record = requestRecord(input);
  return db.transaction(async (trx) => {
    const request = await lockRequest(trx, requestId);
    await requireOwner(trx, actor, request);
    // Bids lock the request row before they are written, so this count cannot go stale under us.
    assertRequestEditable(request.status, await liveBidCount(trx, request.id));
    const [row] = (await trx('wheel_requests')
      .where({ id: request.id })
      .update({ ...record, updated_at: trx.fn.now() })
      .returning('*')) as RequestRow[];
    return toRequestView(row);
  });
}
