// The webhook: signatures checked on the raw body (400 when missing or wrong), each event handled once,
// and events arriving twice or out of order leave the job and its books right.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import { cancelJob } from '@/lib/payments/cancel';
import { jobMoney, ledgerProblems } from '@/lib/payments/ledger';
import { startPayment } from '@/lib/payments/pay';
import { BadSignature, handleWebhook } from '@/lib/payments/webhook';
import { acceptedJob, activatePayouts, DECLINE_CARD, intentIdFrom, jobRow, SUCCESS_CARD, startHarness, until, WEBHOOK_SECRET, type Harness } from './harness';

let h: Harness;
beforeAll(async () => {
  h = await startHarness('webhooks');
});
afterAll(() => h?.close());

const signer = new Stripe('sk_test_unused', { telemetry: false });
const sign = (payload: string, secret = WEBHOOK_SECRET, timestamp?: number) => signer.webhooks.generateTestHeaderString({ payload, secret, timestamp });
const balanced = async (jobId: string) => expect(await ledgerProblems(h.db, await jobRow(h.db, jobId))).toEqual([]);

async function payableJob() {
  const world = await acceptedJob(h.db);
  await activatePayouts(h, world.builder);
  return world;
}

async function eventsFor(piId: string): Promise<Stripe.Event[]> {
  const all = await h.ctx.stripe.events.list({ limit: 100 });
  return all.data.filter((e) => (e.data.object as { id?: string; payment_intent?: string }).id === piId || (e.data.object as { payment_intent?: string }).payment_intent === piId);
}

describe('webhook signatures', () => {
  const body = JSON.stringify({ id: 'evt_sig_test', object: 'event', type: 'payment_intent.succeeded', created: 1, data: { object: { id: 'pi_x', metadata: {} } } });

  it('refuses a missing signature, a wrong secret, a changed body and a stale timestamp with 400', async () => {
    for (const [raw, header] of [
      [body, null],
      [body, ''],
      [body, sign(body, 'whsec_someone_else')],
      [body.replace('pi_x', 'pi_y'), sign(body)],
      [body, sign(body, WEBHOOK_SECRET, Math.floor(Date.now() / 1000) - 3600)],
      [body, 't=1,v1=deadbeef'],
    ] as [string, string | null][]) {
      const err = await handleWebhook(h.ctx, raw, header, WEBHOOK_SECRET).catch((e) => e);
      expect(err).toBeInstanceOf(BadSignature);
      expect(err.status).toBe(400);
    }
    expect(await h.db('webhook_events').where({ id: 'evt_sig_test' })).toHaveLength(0);
  });

  it('accepts a good signature, and answers a repeat of the same event id as a duplicate', async () => {
    const first = await handleWebhook(h.ctx, body, sign(body), WEBHOOK_SECRET);
    expect(first).toMatchObject({ eventId: 'evt_sig_test', outcome: 'ignored: no job' });
    const again = await handleWebhook(h.ctx, body, sign(body), WEBHOOK_SECRET);
    expect(again.outcome).toBe('duplicate event');
  });

  it('the receiver answers 400 to deliveries signed with another secret, and the fake retries them', async () => {
    const { rider, jobId } = await payableJob();
    await h.control('/_test/webhooks/config', { secret: 'whsec_wrong' });
    try {
      await startPayment(h.ctx, rider, jobId);
      await until(() => h.deliveries.some((d) => d.status === 400), 'a refused delivery');
    } finally {
      await h.control('/_test/webhooks/config', { secret: WEBHOOK_SECRET });
    }
  });
});

describe('duplicate and out-of-order events', () => {
  it('a payment success delivered three times books one charge and funds once', async () => {
    const { rider, jobId, priceCents } = await payableJob();
    const pi = intentIdFrom((await startPayment(h.ctx, rider, jobId)).redirectUrl);
    await h.control(`/_test/payment_intents/${pi}/pay`, { card: SUCCESS_CARD });
    await until(async () => (await jobRow(h.db, jobId)).status === 'funded', 'funded');
    const succeeded = (await eventsFor(pi)).find((e) => e.type === 'payment_intent.succeeded')!;
    await h.control(`/_test/events/${succeeded.id}/resend`);
    await h.control(`/_test/events/${succeeded.id}/resend`);
    // Also the same facts under a new event id (as after a provider-side replay): the charge is booked once.
    const copy = JSON.stringify({ ...succeeded, id: `${succeeded.id}_copy` });
    expect((await handleWebhook(h.ctx, copy, sign(copy), WEBHOOK_SECRET)).outcome).toBe('duplicate: charge already booked');
    expect(await jobMoney(h.db, jobId)).toMatchObject({ chargedCents: priceCents, heldInEscrowCents: priceCents });
    expect(await h.db('outbox').where({ kind: 'payment.received', to_email: rider.email })).toHaveLength(1);
    await balanced(jobId);
  });

  it('a decline delivered after the later success does not undo the payment', async () => {
    const { rider, jobId } = await payableJob();
    await h.control('/_test/webhooks/pause');
    const pi = intentIdFrom((await startPayment(h.ctx, rider, jobId)).redirectUrl);
    await h.control(`/_test/payment_intents/${pi}/pay`, { card: DECLINE_CARD });
    await h.control(`/_test/payment_intents/${pi}/pay`, { card: SUCCESS_CARD });
    await h.control('/_test/webhooks/flush', { order: 'reverse' });
    await h.control('/_test/webhooks/resume');
    await h.settle();
    expect((await jobRow(h.db, jobId)).status).toBe('funded');
    expect(await h.db('payments').where({ job_id: jobId }).first()).toMatchObject({ status: 'succeeded', last_error: null });
    await balanced(jobId);
  });

  it('a payment that lands after the rider cancelled is booked and refunded in full', async () => {
    const { rider, jobId, priceCents } = await payableJob();
    const pi = intentIdFrom((await startPayment(h.ctx, rider, jobId)).redirectUrl);
    await h.control('/_test/webhooks/pause');
    await h.control(`/_test/payment_intents/${pi}/pay`, { card: SUCCESS_CARD }); // paid on the page…
    await cancelJob(h.ctx, rider, jobId, { reason: '' }); // …while the job is cancelled in another tab
    await h.control('/_test/webhooks/resume');
    await until(async () => (await h.db('refunds').where({ job_id: jobId, status: 'succeeded' })).length === 1, 'the late payment refunded');
    await h.settle();
    const job = await jobRow(h.db, jobId);
    expect(job.status).toBe('cancelled');
    expect(await jobMoney(h.db, jobId)).toMatchObject({ chargedCents: priceCents, refundedCents: priceCents, stillHeldCents: 0 });
    expect((await h.ctx.stripe.refunds.list({ payment_intent: pi })).data.map((r) => r.amount)).toEqual([priceCents]);
    await balanced(jobId);
  });

  it('refund and transfer events that arrive before our own record of the call are booked once', async () => {
    const { rider, builder, jobId, priceCents } = await payableJob();
    const pi = intentIdFrom((await startPayment(h.ctx, rider, jobId)).redirectUrl);
    await h.control(`/_test/payment_intents/${pi}/pay`, { card: SUCCESS_CARD });
    await until(async () => (await jobRow(h.db, jobId)).status === 'funded', 'funded');
    await h.settle();
    // Deliver every event at once while the cancel call is still recording its answer.
    await h.control('/_test/webhooks/pause');
    const cancelled = cancelJob(h.ctx, builder, jobId, { reason: '' });
    await until(async () => ((await h.control<{ held: string[] }>('/_test/webhooks', undefined, 'GET')).body.held.length) >= 2, 'held refund events');
    await h.control('/_test/webhooks/flush', { order: 'reverse' });
    await cancelled;
    await h.control('/_test/webhooks/resume');
    await h.settle();
    expect(await jobMoney(h.db, jobId)).toMatchObject({ refundedCents: priceCents, stillHeldCents: 0 });
    expect(await h.db('ledger_transactions').where({ job_id: jobId, kind: 'refund' })).toHaveLength(1);
    await balanced(jobId);
  });

  it('events about things that are not ours, and event types we do not use, are recorded and ignored', async () => {
    const stray = JSON.stringify({ id: 'evt_stray', object: 'event', type: 'customer.created', created: 2, data: { object: { id: 'cus_1' } } });
    expect((await handleWebhook(h.ctx, stray, sign(stray), WEBHOOK_SECRET)).outcome).toBe('ignored: not used');
    const alien = JSON.stringify({ id: 'evt_alien', object: 'event', type: 'refund.created', created: 2, data: { object: { id: 're_1', metadata: {} } } });
    expect((await handleWebhook(h.ctx, alien, sign(alien), WEBHOOK_SECRET)).outcome).toBe('ignored: not ours');
  });
});
