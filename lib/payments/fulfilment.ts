// The build from paid to done: start, ship (or ready for pickup), and receipt confirmed by the rider or,
// after the waiting period with no dispute, by the worker. Confirmation releases the escrow to the builder.
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { buildStartedMail, jobShippedMail, moneyReleasedMail } from '@/lib/mail/notices';
import type { PaymentsContext, PaymentsSettings } from './context';
import { releaseToBuilder } from './escrow';
import { requireSide } from './jobAccess';
import { lockJob, moveJob, type JobRow } from './jobStates';
import { getJobForViewer, type JobView } from './jobView';
import { assertJobBalances } from './ledger';
import { jobTitle, mailEach, riderAddress, shopAddresses, shopDisplayName } from './people';
import { sendPayout } from './payouts';
import { splitFor } from './policy';
import type { ShipInput } from './schema';

const DAY_MS = 86_400_000;

export async function startBuild(ctx: PaymentsContext, actor: SessionUser, jobId: string): Promise<JobView> {
  await ctx.db.transaction(async (trx) => {
    const job = await lockJob(trx, jobId);
    requireSide(actor, job, ['builder']);
    await moveJob(trx, job, 'startBuild', { build_started_at: new Date() });
    const [title, shopName] = [await jobTitle(trx, job.request_id), await shopDisplayName(trx, job.shop_id)];
    await mailEach(trx, 'job.build-started', [await riderAddress(trx, job.rider_id)], (to) => buildStartedMail(to, { jobId: job.id, title, shopName }));
    await assertJobBalances(trx, job.id);
  });
  return getJobForViewer(ctx, actor, jobId);
}

export async function markShipped(ctx: PaymentsContext, actor: SessionUser, jobId: string, input: ShipInput, now = new Date()): Promise<JobView> {
  await ctx.db.transaction(async (trx) => {
    const job = await lockJob(trx, jobId);
    requireSide(actor, job, ['builder']);
    const autoConfirmAt = new Date(now.getTime() + ctx.settings.autoConfirmDays * DAY_MS);
    await moveJob(trx, job, 'ship', {
      shipped_at: now,
      auto_confirm_at: autoConfirmAt,
      handover: input.handover,
      carrier: input.handover === 'carrier' ? input.carrier : null,
      tracking_number: input.handover === 'carrier' ? input.trackingNumber : null,
    });
    const title = await jobTitle(trx, job.request_id);
    await mailEach(trx, 'job.shipped', [await riderAddress(trx, job.rider_id)], (to) =>
      jobShippedMail(to, {
        jobId: job.id,
        title,
        handover: input.handover,
        carrier: input.handover === 'carrier' ? input.carrier : null,
        trackingNumber: input.handover === 'carrier' ? input.trackingNumber : null,
        autoConfirmAt,
      }),
    );
    await assertJobBalances(trx, job.id);
  });
  return getJobForViewer(ctx, actor, jobId);
}

/** Inside the locked transaction: shipped → completed, the escrow released to the builder less the fee. */
async function completeLocked(trx: Knex.Transaction, job: JobRow, by: 'rider' | 'auto', settings: PaymentsSettings): Promise<string | null> {
  const feeBps = job.fee_bps ?? settings.feeBps;
  const moved = await moveJob(trx, job, 'confirm', { completed_at: new Date(), completed_by: by, fee_bps: feeBps });
  const split = splitFor(moved.price_cents, 0, feeBps);
  const payoutId = await releaseToBuilder(trx, moved, split, by === 'rider' ? 'Rider confirmed receipt; escrow released' : 'Receipt confirmed automatically; escrow released');
  const title = await jobTitle(trx, job.request_id);
  const mail = { jobId: job.id, title, shareCents: split.shareCents, feeCents: split.feeCents, payoutCents: split.payoutCents, automatic: by === 'auto' };
  await mailEach(trx, 'payment.released', await shopAddresses(trx, job.shop_id), (to) => moneyReleasedMail(to, { ...mail, audience: 'builder' }));
  await mailEach(trx, 'payment.released', [await riderAddress(trx, job.rider_id)], (to) => moneyReleasedMail(to, { ...mail, audience: 'rider' }));
  await assertJobBalances(trx, job.id);
  return payoutId;
}

/** The rider has the wheel: the job completes and the builder is paid. */
export async function confirmReceipt(ctx: PaymentsContext, actor: SessionUser, jobId: string): Promise<JobView> {
  const payoutId = await ctx.db.transaction(async (trx) => {
    const job = await lockJob(trx, jobId);
    requireSide(actor, job, ['rider']);
    return completeLocked(trx, job, 'rider', ctx.settings);
  });
  if (payoutId) await sendPayout(ctx, payoutId);
  return getJobForViewer(ctx, actor, jobId);
}

/**
 * The worker's pass: shipped jobs whose waiting period is over are confirmed for the rider. A job with
 * an open dispute is no longer "shipped", so it is never picked. Rows another worker holds are skipped.
 */
export async function autoConfirmDueJobs(ctx: PaymentsContext, now = new Date(), limit = 100): Promise<number> {
  let count = 0;
  while (count < limit) {
    const payoutId = await ctx.db.transaction(async (trx) => {
      const job = (await trx('jobs').where({ status: 'shipped' }).andWhere('auto_confirm_at', '<=', now).orderBy('auto_confirm_at').first().forUpdate().skipLocked()) as
        | JobRow
        | undefined;
      if (!job) return undefined;
      return completeLocked(trx, job, 'auto', ctx.settings);
    });
    if (payoutId === undefined) break;
    count += 1;
    if (payoutId) await sendPayout(ctx, payoutId, now);
  }
  return count;
}
