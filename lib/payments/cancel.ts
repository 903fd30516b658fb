// Cancelling a job, by the policy in policy.ts: before payment nothing moves; after payment the escrow
// is refunded in full, or, when the rider cancels a build already started, partly refunded and partly
// paid to the builder. Once shipped nobody cancels; a dispute is the way.
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { Conflict } from '@/lib/errors';
import { jobCancelledMail } from '@/lib/mail/notices';
import type { PaymentsContext } from './context';
import { settleEscrow } from './escrow';
import { requireSide } from './jobAccess';
import { lockJob, moveJob } from './jobStates';
import { getJobForViewer, type JobView } from './jobView';
import { assertJobBalances } from './ledger';
import { OPEN_PAYMENT_STATUSES, payKey, type PaymentRow } from './pay';
import { jobTitle, mailEach, riderAddress, shopAddresses } from './people';
import { sendPayout } from './payouts';
import { cancellationTerms } from './policy';
import { describeFailure, failureKind } from './processorErrors';
import { sendRefund } from './refunds';
import type { CancelInput } from './schema';

export async function cancelJob(ctx: PaymentsContext, actor: SessionUser, jobId: string, input: CancelInput): Promise<JobView> {
  const decided = await ctx.db.transaction(async (trx) => {
    const job = await lockJob(trx, jobId);
    const side = requireSide(actor, job, ['rider', 'builder']);
    const feeBps = job.fee_bps ?? ctx.settings.feeBps;
    const terms = cancellationTerms(job.status, side, job.price_cents, feeBps);
    if (!terms.allowed) throw new Conflict(terms.reason ?? 'This job cannot be cancelled now.');
    const changes = { cancelled_at: new Date(), cancelled_by: side, cancel_reason: input.reason || null, fee_bps: feeBps };
    let result = { refundId: null as string | null, payoutId: null as string | null };
    if (job.status === 'awaiting_payment') {
      await moveJob(trx, job, 'cancelUnpaid', changes);
    } else {
      const wasBuilding = job.status === 'building';
      const moved = await moveJob(trx, job, 'cancelFunded', changes);
      result = await settleEscrow(
        trx,
        moved,
        terms.split!,
        wasBuilding ? 'build_cancelled' : 'cancelled',
        `Cancelled by the ${side}${wasBuilding ? ' after the build started' : ' before the build started'}`,
      );
    }
    const title = await jobTitle(trx, job.request_id);
    const mail = { jobId: job.id, title, cancelledBy: side, refundCents: terms.split?.refundCents ?? 0, payoutCents: terms.split?.payoutCents ?? 0 };
    await mailEach(trx, 'job.cancelled', [await riderAddress(trx, job.rider_id)], (to) => jobCancelledMail(to, { ...mail, audience: 'rider' }));
    await mailEach(trx, 'job.cancelled', await shopAddresses(trx, job.shop_id), (to) => jobCancelledMail(to, { ...mail, audience: 'builder' }));
    await assertJobBalances(trx, job.id);
    return result;
  });
  if (decided.refundId) await sendRefund(ctx, decided.refundId);
  if (decided.payoutId) await sendPayout(ctx, decided.payoutId);
  await cancelOpenIntents(ctx, jobId);
  return getJobForViewer(ctx, actor, jobId);
}

/**
 * A cancelled job's payment pages are closed at the processor so nobody pays for a job that is gone.
 * If a payment slips through anyway, the webhook refunds it. Also run by the worker as a retry.
 */
export async function cancelOpenIntents(ctx: PaymentsContext, jobId: string): Promise<number> {
  const open = (await ctx.db('payments as p')
    .join('jobs as j', 'j.id', 'p.job_id')
    .where('p.job_id', jobId)
    .whereIn('j.status', ['cancelled', 'refunded', 'resolved', 'completed'])
    .whereIn('p.status', OPEN_PAYMENT_STATUSES as string[])
    .whereNotNull('p.payment_intent_id')
    .select('p.*')) as PaymentRow[];
  let closed = 0;
  for (const p of open) {
    const tries = p.close_attempts;
    try {
      await ctx.stripe.paymentIntents.cancel(
        p.payment_intent_id!,
        { cancellation_reason: 'abandoned' },
        { idempotencyKey: `${payKey(jobId, p.attempt)}:close${tries === 0 ? '' : `:${tries + 1}`}` },
      );
      await markCanceled(ctx.db, jobId, p.id);
      closed += 1;
    } catch (err) {
      // An answer is stored under its key, so the next try gets a new one; a lost answer reuses it.
      if (failureKind(err) === 'answered') await ctx.db('payments').where({ id: p.id }).increment('close_attempts', 1);
      console.warn(`payments: could not close payment ${p.payment_intent_id} of job ${jobId}: ${describeFailure(err)}`);
    }
  }
  return closed;
}

async function markCanceled(db: Knex, jobId: string, paymentId: string): Promise<void> {
  await db.transaction(async (trx) => {
    await lockJob(trx, jobId);
    await trx('payments').where({ id: paymentId }).whereNot({ status: 'succeeded' }).update({ status: 'canceled', updated_at: trx.fn.now() });
  });
}

/** After this many refused tries the worker stops; a payment that still arrives is refunded by the webhook. */
const MAX_CLOSE_ATTEMPTS = 10;

/** The worker's pass over cancelled jobs whose payment page is still open at the processor. */
export async function closeAbandonedIntents(ctx: PaymentsContext, limit = 50): Promise<number> {
  const jobIds = await ctx.db('payments as p')
    .join('jobs as j', 'j.id', 'p.job_id')
    .whereIn('j.status', ['cancelled', 'refunded', 'resolved', 'completed'])
    .whereIn('p.status', OPEN_PAYMENT_STATUSES as string[])
    .whereNotNull('p.payment_intent_id')
    .andWhere('p.close_attempts', '<', MAX_CLOSE_ATTEMPTS)
    .distinct('p.job_id')
    .limit(limit)
    .pluck('p.job_id');
  let closed = 0;
  for (const id of jobIds) closed += await cancelOpenIntents(ctx, id);
  return closed;
}
