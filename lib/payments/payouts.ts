// Sending a decided payout to the builder's connected account: a transfer from the job's own charge
// (source_transaction), grouped under the job id, with an idempotency key per job so it is never paid twice.
// One sender at a time holds a short lease on the row; failures wait and are retried by the worker.
import type { Knex } from 'knex';
import type Stripe from 'stripe';
import type { PaymentsContext } from './context';
import { lockJob } from './jobStates';
import { assertJobBalances, bookTransfer } from './ledger';
import { describeFailure, failureKind, retryDelayMs } from './processorErrors';

const LEASE_MS = 60_000;

interface PayoutRow {
  id: string;
  job_id: string;
  shop_id: string;
  amount_cents: number;
  status: 'pending' | 'paid';
  key_attempt: number;
  attempts: number;
}

export const payoutKey = (jobId: string, keyAttempt: number) => (keyAttempt === 1 ? `job:${jobId}:payout` : `job:${jobId}:payout:${keyAttempt}`);

/** Books a transfer the processor made for this payout (from our call's answer or its webhook); once. */
export async function recordTransfer(db: Knex, payoutId: string, transfer: Pick<Stripe.Transfer, 'id' | 'amount'>): Promise<boolean> {
  return db.transaction(async (trx) => {
    const peek = (await trx('payouts').where({ id: payoutId }).first('job_id')) as { job_id: string } | undefined;
    if (!peek) return false;
    await lockJob(trx, peek.job_id);
    const payout = (await trx('payouts').where({ id: payoutId }).first().forUpdate()) as PayoutRow;
    if (payout.status === 'paid') return false;
    if (transfer.amount !== payout.amount_cents) throw new Error(`transfer ${transfer.id} is ${transfer.amount}, payout ${payout.id} is ${payout.amount_cents}`);
    await trx('payouts')
      .where({ id: payout.id })
      .update({ status: 'paid', transfer_id: transfer.id, paid_at: trx.fn.now(), leased_until: null, last_error: null, updated_at: trx.fn.now() });
    await bookTransfer(trx, payout.job_id, transfer.id, transfer.amount);
    await assertJobBalances(trx, payout.job_id);
    return true;
  });
}

export type SendOutcome = 'sent' | 'already-done' | 'busy' | 'failed';

export async function sendPayout(ctx: PaymentsContext, payoutId: string, now = new Date()): Promise<SendOutcome> {
  const { db, stripe } = ctx;
  const [payout] = (await db('payouts')
    .where({ id: payoutId, status: 'pending' })
    .andWhere((q) => q.whereNull('leased_until').orWhere('leased_until', '<', now))
    .update({ leased_until: new Date(now.getTime() + LEASE_MS), attempts: db.raw('attempts + 1') })
    .returning('*')) as PayoutRow[];
  if (!payout) {
    const row = await db('payouts').where({ id: payoutId }).first('status');
    return row?.status === 'paid' ? 'already-done' : 'busy';
  }
  const fail = async (err: unknown, newKey: boolean) => {
    await db('payouts')
      .where({ id: payout.id, status: 'pending' })
      .update({
        leased_until: null,
        last_error: describeFailure(err),
        next_attempt_at: new Date(now.getTime() + retryDelayMs(payout.attempts)),
        key_attempt: newKey ? payout.key_attempt + 1 : payout.key_attempt,
        updated_at: db.fn.now(),
      });
    console.warn(`payouts: payout ${payout.id} for job ${payout.job_id} failed: ${describeFailure(err)}`);
    return 'failed' as const;
  };

  const job = (await db('jobs').where({ id: payout.job_id }).first('id', 'charge_id', 'currency')) as { id: string; charge_id: string; currency: string };
  const account = (await db('payout_accounts').where({ shop_id: payout.shop_id }).first('account_id', 'status')) as { account_id: string | null; status: string } | undefined;
  if (!account?.account_id || account.status !== 'active') return fail(new Error('The shop has no active payout account; waiting for the builder to finish payout setup.'), false);

  let transfer: Stripe.Transfer;
  try {
    // Before trying under a fresh key, look for a transfer an earlier try made but whose answer was lost.
    const earlier =
      payout.key_attempt > 1 ? (await stripe.transfers.list({ transfer_group: job.id, limit: 100 })).data.find((t) => t.metadata?.payoutId === payout.id) : undefined;
    transfer =
      earlier ??
      (await stripe.transfers.create(
        {
          amount: payout.amount_cents,
          currency: job.currency,
          destination: account.account_id,
          transfer_group: job.id,
          source_transaction: job.charge_id,
          description: `Lacewright job ${job.id}`,
          metadata: { jobId: job.id, payoutId: payout.id },
        },
        { idempotencyKey: payoutKey(job.id, payout.key_attempt) },
      ));
  } catch (err) {
    return fail(err, failureKind(err) === 'answered');
  }
  await recordTransfer(db, payout.id, transfer);
  return 'sent';
}

/** The worker's pass: every pending payout whose wait is over. */
export async function retryDuePayouts(ctx: PaymentsContext, now = new Date(), limit = 50): Promise<number> {
  const ids = await ctx.db('payouts').where({ status: 'pending' }).andWhere('next_attempt_at', '<=', now).orderBy('next_attempt_at').limit(limit).pluck('id');
  let sent = 0;
  for (const id of ids) if ((await sendPayout(ctx, id, now)) === 'sent') sent += 1;
  return sent;
}
