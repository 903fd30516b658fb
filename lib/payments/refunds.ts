// Sending a decided refund back to the rider's card: keyed per job and refund, never sent twice, one sender
// at a time (a short lease on the row), failures retried by the worker with backoff.
import type { Knex } from 'knex';
import type Stripe from 'stripe';
import { refundSentMail } from '@/lib/mail/notices';
import type { PaymentsContext } from './context';
import { lockJob, type JobRow } from './jobStates';
import { assertJobBalances, bookRefund } from './ledger';
import { jobTitle, mailEach, riderAddress } from './people';
import { describeFailure, failureKind, retryDelayMs } from './processorErrors';

const LEASE_MS = 60_000;

interface RefundRow {
  id: string;
  job_id: string;
  seq: number;
  charge_id: string;
  amount_cents: number;
  status: 'pending' | 'succeeded';
  key_attempt: number;
  attempts: number;
}

export const refundKey = (jobId: string, seq: number, keyAttempt: number) => `job:${jobId}:refund:${seq}${keyAttempt === 1 ? '' : `:${keyAttempt}`}`;

/** Books a refund the processor made for this row (from our call's answer or its webhook); once. */
export async function recordRefund(db: Knex, refundRowId: string, refund: Pick<Stripe.Refund, 'id' | 'amount' | 'status'>): Promise<boolean> {
  if (refund.status !== 'succeeded' && refund.status !== 'pending') return false;
  return db.transaction(async (trx) => {
    const peek = (await trx('refunds').where({ id: refundRowId }).first('job_id')) as { job_id: string } | undefined;
    if (!peek) return false;
    const job: JobRow = await lockJob(trx, peek.job_id);
    const row = (await trx('refunds').where({ id: refundRowId }).first().forUpdate()) as RefundRow;
    if (row.status === 'succeeded') return false;
    if (refund.amount !== row.amount_cents) throw new Error(`refund ${refund.id} is ${refund.amount}, row ${row.id} is ${row.amount_cents}`);
    await trx('refunds')
      .where({ id: row.id })
      .update({ status: 'succeeded', refund_id: refund.id, refunded_at: trx.fn.now(), leased_until: null, last_error: null, updated_at: trx.fn.now() });
    await bookRefund(trx, job.id, refund.id, refund.amount);
    await assertJobBalances(trx, job.id);
    const title = await jobTitle(trx, job.request_id);
    await mailEach(trx, 'payment.refunded', [await riderAddress(trx, job.rider_id)], (to) => refundSentMail(to, { jobId: job.id, title, refundCents: refund.amount }));
    return true;
  });
}

export type SendOutcome = 'sent' | 'already-done' | 'busy' | 'failed';

export async function sendRefund(ctx: PaymentsContext, refundRowId: string, now = new Date()): Promise<SendOutcome> {
  const { db, stripe } = ctx;
  const [row] = (await db('refunds')
    .where({ id: refundRowId, status: 'pending' })
    .andWhere((q) => q.whereNull('leased_until').orWhere('leased_until', '<', now))
    .update({ leased_until: new Date(now.getTime() + LEASE_MS), attempts: db.raw('attempts + 1') })
    .returning('*')) as RefundRow[];
  if (!row) {
    const current = await db('refunds').where({ id: refundRowId }).first('status');
    return current?.status === 'succeeded' ? 'already-done' : 'busy';
  }
  let refund: Stripe.Refund;
  try {
    const earlier = row.key_attempt > 1 ? (await stripe.refunds.list({ charge: row.charge_id, limit: 100 })).data.find((r) => r.metadata?.refundRowId === row.id) : undefined;
    refund =
      earlier ??
      (await stripe.refunds.create(
        { charge: row.charge_id, amount: row.amount_cents, reason: 'requested_by_customer', metadata: { jobId: row.job_id, refundRowId: row.id } },
        { idempotencyKey: refundKey(row.job_id, row.seq, row.key_attempt) },
      ));
  } catch (err) {
    await db('refunds')
      .where({ id: row.id, status: 'pending' })
      .update({
        leased_until: null,
        last_error: describeFailure(err),
        next_attempt_at: new Date(now.getTime() + retryDelayMs(row.attempts)),
        key_attempt: failureKind(err) === 'answered' ? row.key_attempt + 1 : row.key_attempt,
        updated_at: db.fn.now(),
      });
    console.warn(`payments: refund ${row.id} for job ${row.job_id} failed: ${describeFailure(err)}`);
    return 'failed';
  }
  await recordRefund(db, row.id, refund);
  return 'sent';
}

export async function retryDueRefunds(ctx: PaymentsContext, now = new Date(), limit = 50): Promise<number> {
  const ids = await ctx.db('refunds').where({ status: 'pending' }).andWhere('next_attempt_at', '<=', now).orderBy('next_attempt_at').limit(limit).pluck('id');
  let sent = 0;
  for (const id of ids) if ((await sendRefund(ctx, id, now)) === 'sent') sent += 1;
  return sent;
}
