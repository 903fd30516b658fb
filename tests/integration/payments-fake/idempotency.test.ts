// Idempotency keys: replay, mismatch, unsaved validation failures, and saved 500s.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import { startFake, SECRET_KEY, type FakeHandle } from './helpers';

let h: FakeHandle;
beforeAll(async () => {
  h = await startFake();
});
afterAll(async () => {
  await h.close();
});

const errorOf = (p: Promise<unknown>) => p.catch((e: unknown) => e) as Promise<Stripe.errors.StripeError>;
const key = (name: string) => `${name}-${Math.random().toString(36).slice(2)}`;

describe('payments fake: idempotency keys', () => {
  it('replays the first answer for the same key and parameters', async () => {
    const k = key('create-pi');
    const params = { amount: 30_000, currency: 'usd', metadata: { jobId: '9' } };
    const first = await h.stripe.paymentIntents.create(params, { idempotencyKey: k });
    const second = await h.stripe.paymentIntents.create(params, { idempotencyKey: k });
    expect(second.id).toBe(first.id);
    expect(second.lastResponse.headers['idempotent-replayed']).toBe('true');
    const created = await h.stripe.events.list({ type: 'payment_intent.created', limit: 100 });
    expect(created.data.filter((e) => (e.data.object as Stripe.PaymentIntent).id === first.id)).toHaveLength(1);
  });

  it('rejects the same key with different parameters', async () => {
    const k = key('transfer');
    await h.stripe.customers.create({ email: 'one@example.test' }, { idempotencyKey: k });
    const err = await errorOf(h.stripe.customers.create({ email: 'two@example.test' }, { idempotencyKey: k }));
    expect(err).toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
    expect(err.statusCode).toBe(400);
    expect(err.raw).toMatchObject({ type: 'idempotency_error' });
  });

  it('does not keep a validation failure, so a corrected retry with the same key works', async () => {
    const k = key('fix-me');
    const bad = await errorOf(h.stripe.paymentIntents.create({ currency: 'usd' } as Stripe.PaymentIntentCreateParams, { idempotencyKey: k }));
    expect(bad.code).toBe('parameter_missing');
    const good = await h.stripe.paymentIntents.create({ amount: 5_000, currency: 'usd' }, { idempotencyKey: k });
    expect(good.status).toBe('requires_payment_method');
  });

  it('keeps a 500 under its key and replays it; a new key goes through', async () => {
    await h.control('/_test/fail-next', { count: 1 });
    const k = key('flaky');
    const first = await errorOf(h.stripe.customers.create({}, { idempotencyKey: k }));
    expect(first).toBeInstanceOf(Stripe.errors.StripeAPIError);
    expect(first.statusCode).toBe(500);
    const replay = await errorOf(h.stripe.customers.create({}, { idempotencyKey: k }));
    expect(replay.statusCode).toBe(500);
    expect(replay.headers?.['idempotent-replayed']).toBe('true');
    const fresh = await h.stripe.customers.create({}, { idempotencyKey: key('flaky-2') });
    expect(fresh.id).toMatch(/^cus_/);
  });

  it('can drop the connection to look like the server is down', async () => {
    // The SDK retries a dropped connection once on its own, so drop two.
    await h.control('/_test/fail-next', { count: 2, mode: 'disconnect' });
    const err = await errorOf(h.stripe.customers.create({}, { idempotencyKey: key('down') }));
    expect(err).toBeInstanceOf(Stripe.errors.StripeConnectionError);
    expect((await h.stripe.customers.create({})).id).toMatch(/^cus_/);
  });

  it('keeps a card error under its key', async () => {
    const pi = await h.stripe.paymentIntents.create({ amount: 5_000, currency: 'usd' });
    const k = key('confirm');
    const first = await errorOf(h.stripe.paymentIntents.confirm(pi.id, { payment_method: 'pm_card_chargeDeclined' }, { idempotencyKey: k }));
    const again = await errorOf(h.stripe.paymentIntents.confirm(pi.id, { payment_method: 'pm_card_chargeDeclined' }, { idempotencyKey: k }));
    expect(first).toBeInstanceOf(Stripe.errors.StripeCardError);
    expect(again).toBeInstanceOf(Stripe.errors.StripeCardError);
    expect(again.headers?.['idempotent-replayed']).toBe('true');
    const charges = await h.stripe.charges.list({ payment_intent: pi.id });
    expect(charges.data).toHaveLength(1);
  });

  it('answers raw form requests with the same rules', async () => {
    const k = key('raw');
    const post = (body: string) =>
      fetch(`${h.fake.url}/v1/customers`, {
        method: 'POST',
        headers: { authorization: `Bearer ${SECRET_KEY}`, 'content-type': 'application/x-www-form-urlencoded', 'idempotency-key': k },
        body,
      });
    const a = await post('metadata[zip]=97201');
    const b = await post('metadata[zip]=97201');
    expect(((await a.json()) as { id: string }).id).toBe(((await b.json()) as { id: string }).id);
    expect(b.headers.get('idempotent-replayed')).toBe('true');
  });
});
