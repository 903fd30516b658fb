// When the payments service is down or fails: the rider gets a clear message, the job stays awaiting
// payment, nothing is lost, and trying again later works without charging or paying twice.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runWorkerTick } from '@/lib/jobs/worker';
import { cancelJob } from '@/lib/payments/cancel';
import { confirmReceipt, markShipped, startBuild } from '@/lib/payments/fulfilment';
import { getJobForViewer } from '@/lib/payments/jobView';
import { jobMoney, ledgerProblems } from '@/lib/payments/ledger';
import { startPayment } from '@/lib/payments/pay';
import { startPayoutSetup } from '@/lib/payments/payoutAccounts';
import { PaymentsUnavailable } from '@/lib/payments/processorErrors';
import { runPaymentsTick } from '@/lib/payments/worker';
import { acceptedJob, activatePayouts, fundedJob, intentIdFrom, jobRow, makeBuilder, SUCCESS_CARD, startHarness, until, type Harness } from './harness';

let h: Harness;
beforeAll(async () => {
  h = await startHarness('outages');
});
afterAll(() => h?.close());

const later = (minutes: number) => new Date(Date.now() + minutes * 60_000);
const tick = (now = later(10)) => runPaymentsTick(h.db, { now, context: h.ctx });

describe('paying while the service is down', () => {
  it('says so plainly, keeps the job awaiting payment, and the retry later reuses the same key', async () => {
    const { rider, builder, jobId } = await acceptedJob(h.db);
    await activatePayouts(h, builder);
    await h.stopFake();
    let err: unknown;
    try {
      err = await startPayment(h.ctx, rider, jobId).catch((e) => e);
    } finally {
      await h.startFake();
    }
    expect(err).toBeInstanceOf(PaymentsUnavailable);
    expect((err as PaymentsUnavailable).status).toBe(503);
    expect((err as Error).message).toBe('The payment service is not answering right now. Nothing was charged and your job is unchanged; please try again in a few minutes.');
    expect((await jobRow(h.db, jobId)).status).toBe('awaiting_payment');
    expect(await h.db('payments').where({ job_id: jobId })).toEqual([expect.objectContaining({ attempt: 1, status: 'creating', payment_intent_id: null })]);

    const { redirectUrl } = await startPayment(h.ctx, rider, jobId);
    expect(await h.db('payments').where({ job_id: jobId })).toEqual([expect.objectContaining({ attempt: 1, idempotency_key: `job:${jobId}:pay:1`, status: 'requires_payment_method' })]);
    await h.control(`/_test/payment_intents/${intentIdFrom(redirectUrl)}/pay`, { card: SUCCESS_CARD });
    await until(async () => (await jobRow(h.db, jobId)).status === 'funded', 'funded after the outage');
  });

  it('a dropped connection is retried under the same key and makes exactly one payment intent', async () => {
    const { rider, builder, jobId } = await acceptedJob(h.db);
    await activatePayouts(h, builder);
    await h.control('/_test/fail-next', { count: 2, mode: 'disconnect' });
    await expect(startPayment(h.ctx, rider, jobId)).rejects.toThrow(PaymentsUnavailable);
    const { redirectUrl } = await startPayment(h.ctx, rider, jobId);
    const intents = await h.ctx.stripe.paymentIntents.list({ limit: 100 });
    expect(intents.data.filter((pi) => pi.metadata?.jobId === jobId).map((pi) => pi.id)).toEqual([intentIdFrom(redirectUrl)]);
  });

  it('a stored 500 is not replayed forever: the next try uses a new attempt key', async () => {
    const { rider, builder, jobId } = await acceptedJob(h.db);
    await activatePayouts(h, builder);
    await h.control('/_test/fail-next', { count: 1, status: 500 });
    await expect(startPayment(h.ctx, rider, jobId)).rejects.toThrow(PaymentsUnavailable);
    await startPayment(h.ctx, rider, jobId);
    const rows = await h.db('payments').where({ job_id: jobId }).orderBy('attempt');
    expect(rows.map((r) => [r.attempt, r.status])).toEqual([
      [1, 'failed'],
      [2, 'requires_payment_method'],
    ]);
    expect(rows[1].idempotency_key).toBe(`job:${jobId}:pay:2`);
  });

  it('payout setup while down says so and works later', async () => {
    const builder = await makeBuilder(h.db);
    await h.control('/_test/fail-next', { count: 1, status: 500 });
    await expect(startPayoutSetup(h.ctx, builder)).rejects.toThrow(PaymentsUnavailable);
    const { url } = await startPayoutSetup(h.ctx, builder);
    expect(url).toContain('/onboarding/');
    expect((await h.db('payout_accounts').where({ shop_id: builder.shopId }).first()).create_attempt).toBe(2);
  });
});

describe('payouts and refunds while the service is down', () => {
  it('a confirmed job stays completed with its payout pending; the worker pays it once when the service is back', async () => {
    const { rider, builder, jobId, priceCents } = await fundedJob(h);
    await startBuild(h.ctx, builder, jobId);
    await markShipped(h.ctx, builder, jobId, { handover: 'pickup' });
    await h.stopFake();
    try {
      const view = await confirmReceipt(h.ctx, rider, jobId);
      expect(view).toMatchObject({ status: 'completed', payout: { status: 'pending' } });
      expect((await tick()).payoutsSent).toBe(0);
    } finally {
      await h.startFake();
    }
    expect(await jobMoney(h.db, jobId)).toMatchObject({ owedToBuilderCents: priceCents - Math.round(priceCents / 10), transferredCents: 0 });
    expect(await ledgerProblems(h.db, await jobRow(h.db, jobId))).toEqual([]);
    expect((await tick(later(1))).payoutsSent).toBe(0); // not due yet: it waits before retrying
    expect((await tick(later(60))).payoutsSent).toBe(1);
    expect((await tick(later(120))).payoutsSent).toBe(0);
    expect((await h.ctx.stripe.transfers.list({ transfer_group: jobId })).data).toHaveLength(1);
    expect(await jobMoney(h.db, jobId)).toMatchObject({ owedToBuilderCents: 0, stillHeldCents: 0 });
  });

  it('a transfer refused with a stored error is retried under a fresh key, and an earlier success is found, not repeated', async () => {
    const { rider, builder, jobId } = await fundedJob(h);
    await startBuild(h.ctx, builder, jobId);
    await markShipped(h.ctx, builder, jobId, { handover: 'pickup' });
    await h.control('/_test/fail-next', { count: 1, status: 500 });
    await confirmReceipt(h.ctx, rider, jobId);
    const pending = await h.db('payouts').where({ job_id: jobId }).first();
    expect(pending).toMatchObject({ status: 'pending', key_attempt: 2 });
    expect(pending.last_error).toMatch(/^500/);
    await tick(later(60));
    const paid = await h.db('payouts').where({ job_id: jobId }).first();
    expect(paid.status).toBe('paid');
    expect((await h.ctx.stripe.transfers.list({ transfer_group: jobId })).data).toHaveLength(1);
  });

  it('a refund while down waits and is sent by the worker; the rider is told when it goes', async () => {
    const { rider, builder, jobId, priceCents } = await fundedJob(h);
    await h.stopFake();
    try {
      const view = await cancelJob(h.ctx, builder, jobId, { reason: '' });
      expect(view.refunds).toEqual([expect.objectContaining({ amountCents: priceCents, status: 'pending' })]);
      expect((await getJobForViewer(h.ctx, rider, jobId)).money.owedToRiderCents).toBe(priceCents);
    } finally {
      await h.startFake();
    }
    expect((await tick(later(60))).refundsSent).toBe(1);
    expect(await jobMoney(h.db, jobId)).toMatchObject({ refundedCents: priceCents, stillHeldCents: 0 });
    expect(await h.db('outbox').where({ kind: 'payment.refunded', to_email: rider.email })).toHaveLength(1);
  });

  it('the whole worker tick includes the payments pass', async () => {
    const report = await runWorkerTick(h.db, { send: async () => undefined, now: later(1) });
    expect(report.payments).toEqual(expect.objectContaining({ autoConfirmed: expect.any(Number), payoutsSent: expect.any(Number) }));
  });
});
