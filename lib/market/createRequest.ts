import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { requireRider } from './access';
import { publishLocked } from './publishRequest';
import { requestRecord } from './requestRecord';
import { toRequestView, type RequestRow, type RequestView } from './rows';
import type { RequestInput } from './schema';

/** Saves a rider's request as a draft, or publishes it in the same transaction. */
export async function createRequest(db: Knex, actor: SessionUser, input: RequestInput, opts: { publish?: boolean } = {}): Promise<RequestView> {
  requireRider(actor);
  const record = requestRecord(input);
  return db.transaction(async (trx) => {
    const [inserted] = await trx('wheel_requests')
      .insert({ ...record, rider_id: actor.id, status: 'draft' })
      .returning('id');
    const [row] = (await trx('wheel_requests').where({ id: inserted.id }).forUpdate()) as RequestRow[];
    return toRequestView(opts.publish ? await publishLocked(trx, row) : row);
  });
}
