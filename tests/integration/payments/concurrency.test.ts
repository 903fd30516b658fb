// Races: two confirmations at once make one transfer; two pay clicks make one payment; the worker and a
// rider confirming at the same moment still pay once.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Conflict } from '@/lib/errors';
import { autoConfirmDueJobs, confirmReceipt, markShipped, startBuild } from '@/lib/payments/fulfilment';
import { ledgerProblems } from '@/lib/payments/ledger';
import { startPayment } from '@/lib/payments/pay';
import { sendPayout } from '@/lib/payments/payouts';
import { acceptedJob, activatePayouts, fundedJob, jobRow, startHarness, type Harness } from './harness';

let h: Harness;
beforeAll(async () => {
  h = await startHarness('concurrency');
});
afterAll(() => h?.close());

async function shippedJob() {
  const world = await fundedJob(h);
  await startBuild(h.ctx, world.builder, world.jobId);
  await markShipped(h.ctx, world.builder, world.jobId, { handover: 'pickup' });
  return world;
}

describe('concurrent money moves', () => {
  it('two confirmations at once: one completes, the other gets 409, and exactly one transfer is made', async () => {
    const { rider, jobId } = await shippedJob();
    const results = await Promise.allSettled([confirmReceipt(h.ctx, rider, jobId), confirmReceipt(h.ctx, rider, jobId)]);
    expect(results.filter((r) => r.status === 'fulfilled')).toHaveLength(1);
    const rejected = results.find((r) => r.status === 'rejected') as PromiseRejectedResult;
    expect(rejected.reason).toBeInstanceOf(Conflict);
    expect((await h.ctx.stripe.transfers.list({ transfer_group: jobId })).data).toHaveLength(1);
    expect(await h.db('payouts').where({ job_id: jobId })).toHaveLength(1);
    expect(await ledgerProblems(h.db, await jobRow(h.db, jobId))).toEqual([]);
  });

  it('the rider confirming while the worker auto-confirms: still one release and one transfer', async () => {
    const { rider, jobId } = await shippedJob();
    await h.db('jobs').where({ id: jobId }).update({ auto_confirm_at: new Date(Date.now() - 1000) });
    await Promise.allSettled([confirmReceipt(h.ctx, rider, jobId), autoConfirmDueJobs(h.ctx), confirmReceipt(h.ctx, rider, jobId)]);
    expect((await jobRow(h.db, jobId)).status).toBe('completed');
    expect((await h.ctx.stripe.transfers.list({ transfer_group: jobId })).data).toHaveLength(1);
    expect(await h.db('ledger_transactions').where({ job_id: jobId, kind: 'release' })).toHaveLength(1);
  });

  it('several senders of the same payout at once: one transfer', async () => {
    const { rider, jobId } = await shippedJob();
    await h.stopFake(); // the confirmation leaves the payout pending
    try {
      await confirmReceipt(h.ctx, rider, jobId);
    } finally {
      await h.startFake();
    }
    const payout = await h.db('payouts').where({ job_id: jobId }).first();
    await h.db('payouts').where({ id: payout.id }).update({ next_attempt_at: new Date(), leased_until: null });
    const outcomes = await Promise.all([sendPayout(h.ctx, payout.id), sendPayout(h.ctx, payout.id), sendPayout(h.ctx, payout.id)]);
    expect(outcomes.filter((o) => o === 'sent')).toHaveLength(1);
    expect((await h.ctx.stripe.transfers.list({ transfer_group: jobId })).data).toHaveLength(1);
  });

  it('two pay clicks at once: one payment intent', async () => {
    const { rider, builder, jobId } = await acceptedJob(h.db);
    await activatePayouts(h, builder);
    const [a, b] = await Promise.all([startPayment(h.ctx, rider, jobId), startPayment(h.ctx, rider, jobId)]);
    expect(a.redirectUrl).toBe(b.redirectUrl);
    expect(await h.db('payments').where({ job_id: jobId })).toHaveLength(1);
  });
});
