// Customers, payment intents, errors and lists through the real SDK.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import { sdkFor, startFake, type FakeHandle } from './helpers';

let h: FakeHandle;
beforeAll(async () => {
  h = await startFake();
});
afterAll(async () => {
  await h.close();
});

describe('payments fake: keys', () => {
  it('answers 401 without a secret key', async () => {
    const res = await fetch(`${h.fake.url}/v1/customers`);
    expect(res.status).toBe(401);
    const body = (await res.json()) as { error: { type: string; message: string } };
    expect(body.error.type).toBe('invalid_request_error');
  });

  it('refuses a publishable key through the SDK', async () => {
    const err = await sdkFor(h.fake.port, 'pk_test_nope').customers.create({}).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
    expect((err as Stripe.errors.StripeError).statusCode).toBe(401);
  });
});

describe('payments fake: customers', () => {
  it('creates and retrieves a customer with metadata', async () => {
    const created = await h.stripe.customers.create({ email: 'rider@example.test', name: 'Test Rider', metadata: { userId: '42' } });
    expect(created.id).toMatch(/^cus_/);
    expect(created.object).toBe('customer');
    const again = await h.stripe.customers.retrieve(created.id);
    expect(again).toMatchObject({ id: created.id, email: 'rider@example.test', name: 'Test Rider', metadata: { userId: '42' } });
  });

  it('pages through a list with has_more and starting_after', async () => {
    const email = `pager-${Date.now()}@example.test`;
    const ids: string[] = [];
    for (let i = 0; i < 3; i++) ids.push((await h.stripe.customers.create({ email })).id);
    const first = await h.stripe.customers.list({ email, limit: 2 });
    expect(first.object).toBe('list');
    expect(first.data.map((c) => c.id)).toEqual([ids[2], ids[1]]);
    expect(first.has_more).toBe(true);
    const second = await h.stripe.customers.list({ email, limit: 2, starting_after: ids[1] });
    expect(second.data.map((c) => c.id)).toEqual([ids[0]]);
    expect(second.has_more).toBe(false);
  });
});

describe('payments fake: payment intents', () => {
  it('creates one waiting for a card, with the hosted page in next_action', async () => {
    const customer = await h.stripe.customers.create({});
    const pi = await h.stripe.paymentIntents.create({
      amount: 45_000,
      currency: 'usd',
      customer: customer.id,
      description: 'Wheel build',
      transfer_group: 'job_7',
      metadata: { jobId: '7' },
    });
    expect(pi.id).toMatch(/^pi_/);
    expect(pi).toMatchObject({
      object: 'payment_intent',
      status: 'requires_payment_method',
      amount: 45_000,
      currency: 'usd',
      customer: customer.id,
      transfer_group: 'job_7',
      metadata: { jobId: '7' },
      latest_charge: null,
    });
    expect(pi.client_secret).toMatch(new RegExp(`^${pi.id}_secret_`));
    expect(pi.next_action?.type).toBe('redirect_to_url');
    expect(pi.next_action?.redirect_to_url?.url).toBe(`${h.fake.url}/pay/${pi.id}`);
    const again = await h.stripe.paymentIntents.retrieve(pi.id);
    expect(again.amount).toBe(45_000);
  });

  it('cancels, and refuses to cancel twice', async () => {
    const pi = await h.stripe.paymentIntents.create({ amount: 5_000, currency: 'usd' });
    const canceled = await h.stripe.paymentIntents.cancel(pi.id, { cancellation_reason: 'abandoned' });
    expect(canceled).toMatchObject({ status: 'canceled', cancellation_reason: 'abandoned', next_action: null });
    expect(canceled.canceled_at).toBeTypeOf('number');
    const err = (await h.stripe.paymentIntents.cancel(pi.id).catch((e: unknown) => e)) as Stripe.errors.StripeError;
    expect(err).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(err.code).toBe('payment_intent_unexpected_state');
  });

  it('names the missing or bad parameter', async () => {
    const missing = (await h.stripe.paymentIntents
      .create({ currency: 'usd' } as Stripe.PaymentIntentCreateParams)
      .catch((e: unknown) => e)) as Stripe.errors.StripeError;
    expect(missing).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(missing).toMatchObject({ statusCode: 400, type: 'StripeInvalidRequestError', code: 'parameter_missing', param: 'amount' });
    expect(missing.raw).toMatchObject({ type: 'invalid_request_error' });

    const notInteger = (await h.stripe.paymentIntents
      .create({ amount: 'lots' as unknown as number, currency: 'usd' })
      .catch((e: unknown) => e)) as Stripe.errors.StripeError;
    expect(notInteger).toMatchObject({ code: 'parameter_invalid_integer', param: 'amount' });

    const tooSmall = (await h.stripe.paymentIntents.create({ amount: 10, currency: 'usd' }).catch((e: unknown) => e)) as Stripe.errors.StripeError;
    expect(tooSmall).toMatchObject({ code: 'amount_too_small', param: 'amount' });

    const noCustomer = (await h.stripe.paymentIntents
      .create({ amount: 5_000, currency: 'usd', customer: 'cus_missing' })
      .catch((e: unknown) => e)) as Stripe.errors.StripeError;
    expect(noCustomer).toMatchObject({ statusCode: 400, code: 'resource_missing', param: 'customer' });
  });

  it('answers 404 for an unknown id', async () => {
    const err = (await h.stripe.paymentIntents.retrieve('pi_nothing').catch((e: unknown) => e)) as Stripe.errors.StripeError;
    expect(err).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(err).toMatchObject({ statusCode: 404, code: 'resource_missing' });
  });
});
