// The money path, step by step: payout setup, pay into escrow (the webhook funds the job), build, ship,
// confirm, and the transfer to the builder less the fee; with who may take each step and the wrong moves.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type Stripe from 'stripe';
import { Conflict, Forbidden, Invalid, NotFound } from '@/lib/errors';
import { confirmReceipt, markShipped, startBuild } from '@/lib/payments/fulfilment';
import { getJobForViewer, listJobsForViewer } from '@/lib/payments/jobView';
import { jobMoney, ledgerProblems } from '@/lib/payments/ledger';
import { startPayment } from '@/lib/payments/pay';
import { payoutStatus, startPayoutSetup } from '@/lib/payments/payoutAccounts';
import { shipInputSchema } from '@/lib/payments/schema';
import { acceptedJob, activatePayouts, DECLINE_CARD, fundedJob, intentIdFrom, jobRow, makeAdmin, makeBuilder, makeRider, payWithCard, startHarness, until, type Harness } from './harness';

let h: Harness;
beforeAll(async () => {
  h = await startHarness('flow');
});
afterAll(() => h?.close());

const outboxKinds = async (email: string) => (await h.db('outbox').where({ to_email: email }).orderBy('created_at')).map((m) => m.kind as string);

describe('payout setup', () => {
  it('makes one connected account per shop, hands out an onboarding link, and turns active after onboarding', async () => {
    const builder = await makeBuilder(h.db);
    expect((await payoutStatus(h.ctx, builder)).state).toBe('not_started');
    const first = await startPayoutSetup(h.ctx, builder);
    const second = await startPayoutSetup(h.ctx, builder);
    expect(first.url).toMatch(new RegExp(`^${h.fakeUrl}/onboarding/`));
    expect(second.url).not.toBe(first.url);
    const rows = await h.db('payout_accounts').where({ shop_id: builder.shopId });
    expect(rows).toHaveLength(1);
    expect((await payoutStatus(h.ctx, builder)).state).toBe('onboarding');
    await h.control(`/_test/accounts/${rows[0].account_id}/onboard`);
    await until(async () => (await payoutStatus(h.ctx, builder)).state === 'active', 'active payouts');
  });

  it('is for builders only', async () => {
    await expect(startPayoutSetup(h.ctx, await makeRider(h.db))).rejects.toThrow(Forbidden);
  });
});

describe('paying into escrow', () => {
  it('refuses to take money before the builder can receive payouts, and reminds the builder once', async () => {
    const { rider, builder, jobId } = await acceptedJob(h.db);
    const err = await startPayment(h.ctx, rider, jobId).catch((e) => e);
    expect(err).toBeInstanceOf(Conflict);
    expect(err.message).toMatch(/not finished setting up payouts/);
    await startPayment(h.ctx, rider, jobId).catch(() => undefined);
    expect((await outboxKinds(builder.email)).filter((k) => k === 'payout.setup-needed')).toHaveLength(1);
    expect(await h.db('payments').where({ job_id: jobId })).toHaveLength(0);
  });

  it('only the job’s rider pays; others get 404 or 403', async () => {
    const { builder, jobId } = await acceptedJob(h.db);
    await activatePayouts(h, builder);
    await expect(startPayment(h.ctx, await makeRider(h.db), jobId)).rejects.toThrow(NotFound);
    await expect(startPayment(h.ctx, builder, jobId)).rejects.toThrow(Forbidden);
    await expect(startPayment(h.ctx, await makeAdmin(h.db), jobId)).rejects.toThrow(Forbidden);
    await expect(startPayment(h.ctx, await makeBuilder(h.db), jobId)).rejects.toThrow(NotFound);
  });

  it('sends the rider to the hosted page with a keyed intent; the webhook, not the redirect, funds the job', async () => {
    const { rider, builder, jobId, priceCents } = await acceptedJob(h.db);
    await activatePayouts(h, builder);
    await h.control('/_test/webhooks/pause');
    const { redirectUrl } = await startPayment(h.ctx, rider, jobId);
    expect(redirectUrl).toContain(`${h.fakeUrl}/pay/`);
    expect(new URL(redirectUrl).searchParams.get('return_url')).toBe(`${h.ctx.settings.appUrl}/jobs/${jobId}/payment-return`);
    const piId = intentIdFrom(redirectUrl);
    const pi = await h.ctx.stripe.paymentIntents.retrieve(piId);
    expect(pi).toMatchObject({ amount: priceCents, currency: 'usd', transfer_group: jobId, metadata: { jobId } });
    const payment = await h.db('payments').where({ job_id: jobId }).first();
    expect(payment).toMatchObject({ idempotency_key: `job:${jobId}:pay:1`, payment_intent_id: piId, status: 'requires_payment_method' });
    // Asking again resumes the same page rather than making a second payment.
    expect((await startPayment(h.ctx, rider, jobId)).redirectUrl).toBe(redirectUrl);

    await h.control(`/_test/payment_intents/${piId}/pay`, { card: '4242424242424242' });
    expect((await jobRow(h.db, jobId)).status).toBe('awaiting_payment'); // paid, but no webhook yet
    await h.control('/_test/webhooks/resume');
    await until(async () => (await jobRow(h.db, jobId)).status === 'funded', 'funded');
    const job = await jobRow(h.db, jobId);
    expect(job).toMatchObject({ payment_intent_id: piId, fee_bps: 1000 });
    expect(job.charge_id).toMatch(/^ch_/);
    expect(await jobMoney(h.db, jobId)).toMatchObject({ chargedCents: priceCents, heldInEscrowCents: priceCents, stillHeldCents: priceCents });
    expect(await outboxKinds(rider.email)).toContain('payment.received');
    expect(await outboxKinds(builder.email)).toContain('payment.received');
    await expect(startPayment(h.ctx, rider, jobId)).rejects.toThrow(Conflict);
  });

  it('a declined card leaves the job awaiting payment with the reason; paying again with a good card works', async () => {
    const { rider, builder, jobId } = await acceptedJob(h.db);
    await activatePayouts(h, builder);
    const pi = await payWithCard(h, rider, jobId, DECLINE_CARD);
    await h.settle();
    const view = await getJobForViewer(h.ctx, rider, jobId);
    expect(view.status).toBe('awaiting_payment');
    expect(view.payment).toMatchObject({ status: 'requires_payment_method', lastError: 'Your card was declined.' });
    expect(view.actions.pay).toBe(true);
    expect(await payWithCard(h, rider, jobId)).toBe(pi); // the same intent, paid on the second try
    await until(async () => (await jobRow(h.db, jobId)).status === 'funded', 'funded after retry');
  });
});

describe('building, shipping and confirming', () => {
  it('runs the whole path and pays the builder the price less the fee, from the job’s own charge', async () => {
    const { rider, builder, jobId, priceCents } = await fundedJob(h);
    const other = await makeBuilder(h.db);
    await expect(startBuild(h.ctx, rider, jobId)).rejects.toThrow(Forbidden);
    await expect(startBuild(h.ctx, other, jobId)).rejects.toThrow(NotFound);
    await expect(markShipped(h.ctx, builder, jobId, { handover: 'pickup' })).rejects.toThrow(Conflict);
    expect((await startBuild(h.ctx, builder, jobId)).status).toBe('building');
    await expect(startBuild(h.ctx, builder, jobId)).rejects.toThrow(Conflict);
    await expect(confirmReceipt(h.ctx, rider, jobId)).rejects.toThrow(Conflict);

    const shipped = await markShipped(h.ctx, builder, jobId, shipInputSchema.parse({ handover: 'carrier', carrier: 'Parcel Co', trackingNumber: '1Z 999 AA1' }));
    expect(shipped).toMatchObject({ status: 'shipped', handover: { method: 'carrier', carrier: 'Parcel Co', trackingNumber: '1Z 999 AA1' } });
    expect(new Date(shipped.autoConfirmAt!).getTime() - Date.now()).toBeGreaterThan(13.9 * 86_400_000);
    await expect(confirmReceipt(h.ctx, builder, jobId)).rejects.toThrow(Forbidden);

    const done = await confirmReceipt(h.ctx, rider, jobId);
    const fee = Math.round(priceCents * 0.1);
    expect(done).toMatchObject({ status: 'completed', feeCents: fee, payout: { status: 'paid', amountCents: priceCents - fee } });
    const job = await jobRow(h.db, jobId);
    const transfers = await h.ctx.stripe.transfers.list({ transfer_group: jobId });
    expect(transfers.data).toHaveLength(1);
    const account = (await h.db('payout_accounts').where({ shop_id: builder.shopId }).first()).account_id;
    expect(transfers.data[0]).toMatchObject({ amount: priceCents - fee, destination: account, source_transaction: job.charge_id, transfer_group: jobId });
    expect(await h.db('payouts').where({ job_id: jobId }).first()).toMatchObject({ status: 'paid', transfer_id: transfers.data[0].id });
    expect(await jobMoney(h.db, jobId)).toEqual({
      chargedCents: priceCents,
      refundedCents: 0,
      transferredCents: priceCents - fee,
      reversedCents: 0,
      feesCents: fee,
      heldInEscrowCents: 0,
      owedToBuilderCents: 0,
      owedToRiderCents: 0,
      stillHeldCents: 0,
    });
    expect(await ledgerProblems(h.db, job)).toEqual([]);
    await expect(confirmReceipt(h.ctx, rider, jobId)).rejects.toThrow(Conflict);
    expect(await outboxKinds(rider.email)).toEqual(expect.arrayContaining(['job.build-started', 'job.shipped', 'payment.released']));
    expect(await outboxKinds(builder.email)).toContain('payment.released');
    // The transfer.created webhook arriving after the answer changes nothing.
    await h.settle();
    expect((await h.ctx.stripe.transfers.list({ transfer_group: jobId })).data).toHaveLength(1);
    expect(await ledgerProblems(h.db, await jobRow(h.db, jobId))).toEqual([]);
  });

  it('ready for pickup needs no carrier; a carrier hand-over needs carrier and tracking', async () => {
    expect(shipInputSchema.safeParse({ handover: 'carrier', carrier: 'X' }).success).toBe(false);
    expect(shipInputSchema.safeParse({ handover: 'carrier', carrier: 'Parcel Co', trackingNumber: '<script>' }).success).toBe(false);
    const { rider, builder, jobId } = await fundedJob(h);
    await startBuild(h.ctx, builder, jobId);
    const view = await markShipped(h.ctx, builder, jobId, { handover: 'pickup' });
    expect(view.handover).toEqual({ method: 'pickup', carrier: null, trackingNumber: null });
    expect(view.timeline.find((s) => s.key === 'shipped')?.label).toBe('Ready for pickup');
    expect((await getJobForViewer(h.ctx, rider, jobId)).actions.confirm).toBe(true);
  });

  it('shows each side only the actions it may take, and lists jobs per viewer', async () => {
    const { rider, builder, jobId } = await acceptedJob(h.db);
    const admin = await makeAdmin(h.db);
    const forRider = await getJobForViewer(h.ctx, rider, jobId);
    expect(forRider.actions).toMatchObject({ pay: false, setUpPayouts: false, startBuild: false, dispute: false });
    expect(forRider.nextStep).toMatch(/finishing their payout setup/);
    const forBuilder = await getJobForViewer(h.ctx, builder, jobId);
    expect(forBuilder.actions).toMatchObject({ pay: false, setUpPayouts: true });
    const forAdmin = await getJobForViewer(h.ctx, admin, jobId);
    expect(forAdmin.actions).toEqual({ pay: false, setUpPayouts: false, startBuild: false, ship: false, confirm: false, cancel: null, dispute: false });
    await expect(getJobForViewer(h.ctx, await makeRider(h.db), jobId)).rejects.toThrow(NotFound);
    await expect(getJobForViewer(h.ctx, rider, 'not-a-uuid')).rejects.toThrow(NotFound);
    expect((await listJobsForViewer(h.ctx, rider)).map((j) => j.id)).toEqual([jobId]);
    expect((await listJobsForViewer(h.ctx, builder)).map((j) => j.id)).toEqual([jobId]);
    expect((await listJobsForViewer(h.ctx, admin)).map((j) => j.id)).toContain(jobId);
    await activatePayouts(h, builder);
    expect((await getJobForViewer(h.ctx, rider, jobId)).actions.pay).toBe(true);
  });

  it('refuses bad input for the domain with plain errors', async () => {
    expect(() => shipInputSchema.parse({ handover: 'drone' })).toThrow();
    await expect(startBuild(h.ctx, await makeRider(h.db), '00000000-0000-4000-8000-000000000000')).rejects.toThrow(NotFound);
    expect(Invalid).toBeDefined();
  });
});

export type { Stripe };
