// Deciding where escrowed money goes, inside the job's locked transaction: a release books the builder's
// share and the fee and queues one payout; a refund books what goes back and queues one refund.
// The processor calls happen after commit (payouts.ts, refunds.ts) and are retried by the worker.
import type { Knex } from 'knex';
import { bookRefundDue, bookRelease } from './ledger';
import type { JobRow } from './jobStates';
import type { MoneySplit } from './policy';

export interface Decided {
  payoutId: string | null;
  refundId: string | null;
}

/** Releases the builder's share of the escrow (less the fee) and queues its transfer. At most once per job. */
export async function releaseToBuilder(trx: Knex.Transaction, job: JobRow, split: MoneySplit, memo: string): Promise<string | null> {
  if (split.shareCents === 0) return null;
  await bookRelease(trx, job.id, split, memo);
  await trx('jobs').where({ id: job.id }).update({ fee_cents: split.feeCents });
  if (split.payoutCents === 0) return null;
  const [payout] = await trx('payouts')
    .insert({ job_id: job.id, shop_id: job.shop_id, share_cents: split.shareCents, fee_cents: split.feeCents, amount_cents: split.payoutCents })
    .returning('id');
  return payout.id as string;
}

export type RefundReason = 'cancelled' | 'build_cancelled' | 'dispute' | 'late_payment';

/** Moves money from escrow to "owed to the rider" and queues the refund of that charge. */
export async function refundToRider(
  trx: Knex.Transaction,
  job: Pick<JobRow, 'id'>,
  a: { amountCents: number; paymentIntentId: string; chargeId: string; reason: RefundReason; memo: string },
): Promise<string | null> {
  if (a.amountCents === 0) return null;
  const { n } = (await trx('refunds').where({ job_id: job.id }).count<{ n: string }[]>({ n: '*' }))[0];
  const [refund] = await trx('refunds')
    .insert({ job_id: job.id, seq: Number(n) + 1, payment_intent_id: a.paymentIntentId, charge_id: a.chargeId, amount_cents: a.amountCents, reason: a.reason })
    .returning('id');
  await bookRefundDue(trx, job.id, refund.id, a.amountCents, a.memo);
  return refund.id as string;
}

/** Carries out one decision on an escrowed job: the refund part and the builder's part. */
export async function settleEscrow(trx: Knex.Transaction, job: JobRow, split: MoneySplit, reason: RefundReason, memo: string): Promise<Decided> {
  if (!job.payment_intent_id || !job.charge_id) throw new Error(`job ${job.id} holds no charge to settle`);
  const refundId = await refundToRider(trx, job, { amountCents: split.refundCents, paymentIntentId: job.payment_intent_id, chargeId: job.charge_id, reason, memo });
  const payoutId = await releaseToBuilder(trx, job, split, memo);
  return { payoutId, refundId };
}
