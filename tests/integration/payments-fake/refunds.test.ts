// Refunds: full, partial up to the remainder, and too much.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import { paidIntent, startFake, type FakeHandle } from './helpers';

let h: FakeHandle;
beforeAll(async () => {
  h = await startFake();
});
afterAll(async () => {
  await h.close();
});

const errorOf = (p: Promise<unknown>) => p.catch((e: unknown) => e) as Promise<Stripe.errors.StripeError>;

describe('payments fake: refunds', () => {
  it('refunds the whole charge when no amount is given, once', async () => {
    const { pi, chargeId } = await paidIntent(h, 20_000);
    const refund = await h.stripe.refunds.create({ payment_intent: pi.id, reason: 'requested_by_customer' });
    expect(refund.id).toMatch(/^re_/);
    expect(refund).toMatchObject({ object: 'refund', amount: 20_000, charge: chargeId, payment_intent: pi.id, status: 'succeeded' });
    const charge = await h.stripe.charges.retrieve(chargeId);
    expect(charge).toMatchObject({ amount_refunded: 20_000, refunded: true });
    const again = await errorOf(h.stripe.refunds.create({ payment_intent: pi.id }));
    expect(again).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(again.code).toBe('charge_already_refunded');
  });

  it('repeats partial refunds up to the unrefunded remainder', async () => {
    const { pi, chargeId } = await paidIntent(h, 10_000);
    expect((await h.stripe.refunds.create({ payment_intent: pi.id, amount: 3_000 })).amount).toBe(3_000);
    expect((await h.stripe.refunds.create({ charge: chargeId, amount: 2_000 })).amount).toBe(2_000);

    const over = await errorOf(h.stripe.refunds.create({ payment_intent: pi.id, amount: 6_000 }));
    expect(over).toMatchObject({ statusCode: 400, code: 'amount_too_large', param: 'amount' });

    const rest = await h.stripe.refunds.create({ payment_intent: pi.id });
    expect(rest.amount).toBe(5_000);
    const charge = await h.stripe.charges.retrieve(chargeId);
    expect(charge).toMatchObject({ amount_refunded: 10_000, refunded: true });
    const listed = await h.stripe.refunds.list({ payment_intent: pi.id });
    expect(listed.data.map((r) => r.amount)).toEqual([5_000, 2_000, 3_000]);
  });

  it('takes refunds out of the platform balance', async () => {
    const before = (await h.stripe.balance.retrieve()).available.find((b) => b.currency === 'usd')!.amount;
    const { pi } = await paidIntent(h, 7_000);
    await h.stripe.refunds.create({ payment_intent: pi.id, amount: 2_500 });
    const after = (await h.stripe.balance.retrieve()).available.find((b) => b.currency === 'usd')!.amount;
    expect(after - before).toBe(4_500);
  });

  it('refuses an intent that was never paid, and a refund with neither intent nor charge', async () => {
    const unpaid = await h.stripe.paymentIntents.create({ amount: 5_000, currency: 'usd' });
    expect((await errorOf(h.stripe.refunds.create({ payment_intent: unpaid.id }))).code).toBe('payment_intent_unexpected_state');
    expect(await errorOf(h.stripe.refunds.create({}))).toMatchObject({ code: 'parameter_missing', param: 'payment_intent' });
  });

  it('emits refund.created and charge.refunded with the old amounts', async () => {
    const { pi, chargeId } = await paidIntent(h, 8_000);
    const refund = await h.stripe.refunds.create({ payment_intent: pi.id, amount: 1_000 });
    const events = await h.stripe.events.list({ limit: 5 });
    const refunded = events.data.find((e) => e.type === 'charge.refunded' && (e.data.object as Stripe.Charge).id === chargeId)!;
    expect(refunded.data.previous_attributes).toMatchObject({ amount_refunded: 0, refunded: false });
    expect((refunded.data.object as Stripe.Charge).amount_refunded).toBe(1_000);
    expect(events.data.some((e) => e.type === 'refund.created' && (e.data.object as Stripe.Refund).id === refund.id)).toBe(true);
  });
});
