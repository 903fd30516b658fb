// Paying with each test card: through the JSON helper, the hosted page and `confirm`.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import { payWith, startFake, type FakeHandle } from './helpers';

// Test card numbers and their outcomes: the provider's "Testing" documentation.
const SUCCESS = '4242424242424242';
const INSUFFICIENT_FUNDS = '4000000000009995';
const GENERIC_DECLINE = '4000000000000002';
const NEEDS_AUTHENTICATION = '4000002500003155';
const RETURN_URL = 'http://app.test/jobs/7/payment-return';

let h: FakeHandle;
beforeAll(async () => {
  h = await startFake();
});
afterAll(async () => {
  await h.close();
});

const newIntent = (params: Partial<Stripe.PaymentIntentCreateParams> = {}) =>
  h.stripe.paymentIntents.create({ amount: 12_500, currency: 'usd', transfer_group: 'job_7', ...params });

describe('payments fake: test cards through the JSON helper', () => {
  it('succeeds with 4242…, creating a retrievable charge', async () => {
    const pi = await newIntent({ metadata: { jobId: '7' } });
    const paid = await payWith(h, pi.id, SUCCESS);
    expect(paid).toMatchObject({ status: 'succeeded', amount_received: 12_500, last_payment_error: null, next_action: null });
    expect(paid.latest_charge).toMatch(/^ch_/);
    const charge = await h.stripe.charges.retrieve(paid.latest_charge as string);
    expect(charge).toMatchObject({
      object: 'charge',
      status: 'succeeded',
      paid: true,
      captured: true,
      amount: 12_500,
      amount_refunded: 0,
      payment_intent: pi.id,
      transfer_group: 'job_7',
      metadata: { jobId: '7' },
    });
    expect(charge.payment_method_details?.card?.last4).toBe('4242');
    const expanded = await h.stripe.paymentIntents.retrieve(pi.id, { expand: ['latest_charge'] });
    expect((expanded.latest_charge as Stripe.Charge).id).toBe(charge.id);
  });

  it('declines 4000…9995 with insufficient_funds and lets the rider try again', async () => {
    const pi = await newIntent();
    const declined = await payWith(h, pi.id, INSUFFICIENT_FUNDS);
    expect(declined.status).toBe('requires_payment_method');
    expect(declined.last_payment_error).toMatchObject({ type: 'card_error', code: 'card_declined', decline_code: 'insufficient_funds' });
    const failedCharge = await h.stripe.charges.retrieve(declined.last_payment_error!.charge as string);
    expect(failedCharge).toMatchObject({ status: 'failed', paid: false, failure_code: 'card_declined' });
    const paid = await payWith(h, pi.id, SUCCESS);
    expect(paid.status).toBe('succeeded');
    expect(paid.last_payment_error).toBeNull();
  });

  it('declines 4000…0002 as a generic decline', async () => {
    const pi = await newIntent();
    const declined = await payWith(h, pi.id, GENERIC_DECLINE);
    expect(declined.status).toBe('requires_payment_method');
    expect(declined.last_payment_error).toMatchObject({ code: 'card_declined', decline_code: 'generic_decline' });
  });

  it('asks for confirmation with 4000…3155, then succeeds or fails on the answer', async () => {
    const approved = await newIntent();
    expect((await payWith(h, approved.id, NEEDS_AUTHENTICATION)).status).toBe('requires_action');
    const ok = await h.control<Stripe.PaymentIntent>(`/_test/payment_intents/${approved.id}/authenticate`, { outcome: 'approve' });
    expect(ok.body.status).toBe('succeeded');

    const refused = await newIntent();
    await payWith(h, refused.id, NEEDS_AUTHENTICATION);
    const no = await h.control<Stripe.PaymentIntent>(`/_test/payment_intents/${refused.id}/authenticate`, { outcome: 'fail' });
    expect(no.body.status).toBe('requires_payment_method');
    expect(no.body.last_payment_error?.code).toBe('payment_intent_authentication_failure');
  });

  it('refuses a card on an intent that is already paid', async () => {
    const pi = await newIntent();
    await payWith(h, pi.id, SUCCESS);
    const again = await h.control(`/_test/payment_intents/${pi.id}/pay`, { card: SUCCESS });
    expect(again.status).toBe(400);
    expect(again.body).toMatchObject({ error: { code: 'payment_intent_unexpected_state' } });
  });
});

describe('payments fake: hosted payment page', () => {
  const submit = (piId: string, fields: Record<string, string>) =>
    fetch(`${h.fake.url}/pay/${piId}`, {
      method: 'POST',
      redirect: 'manual',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ expiry: '12/40', cvc: '123', return_url: RETURN_URL, ...fields }).toString(),
    });

  it('shows a plain card form with the amount', async () => {
    const pi = await newIntent({ description: 'Rear wheel, 32 spokes' });
    const res = await fetch(`${h.fake.url}/pay/${pi.id}?return_url=${encodeURIComponent(RETURN_URL)}`);
    expect(res.status).toBe(200);
    const page = await res.text();
    expect(page).toContain('Lacewright test payments');
    expect(page).toContain('125.00 USD');
    expect(page).toContain('Rear wheel, 32 spokes');
    expect(page).toContain('name="card_number"');
  });

  it('pays and redirects to return_url with the intent id', async () => {
    const pi = await newIntent();
    const res = await submit(pi.id, { card_number: '4242 4242 4242 4242' });
    expect(res.status).toBe(303);
    const location = new URL(res.headers.get('location')!);
    expect(`${location.origin}${location.pathname}`).toBe(RETURN_URL);
    expect(location.searchParams.get('payment_intent')).toBe(pi.id);
    expect(location.searchParams.get('redirect_status')).toBe('succeeded');
    expect((await h.stripe.paymentIntents.retrieve(pi.id)).status).toBe('succeeded');
  });

  it('redirects a declined card with redirect_status=failed and records the error', async () => {
    const pi = await newIntent();
    const res = await submit(pi.id, { card_number: INSUFFICIENT_FUNDS });
    expect(res.status).toBe(303);
    const location = new URL(res.headers.get('location')!);
    expect(location.searchParams.get('payment_intent')).toBe(pi.id);
    expect(location.searchParams.get('redirect_status')).toBe('failed');
    const after = await h.stripe.paymentIntents.retrieve(pi.id);
    expect(after.status).toBe('requires_payment_method');
    expect(after.last_payment_error?.decline_code).toBe('insufficient_funds');
  });

  it('sends 4000…3155 through the confirm page', async () => {
    const pi = await newIntent();
    const first = await submit(pi.id, { card_number: NEEDS_AUTHENTICATION });
    expect(first.status).toBe(303);
    expect(first.headers.get('location')).toContain(`/pay/${pi.id}/authenticate`);
    const confirmPage = await fetch(new URL(first.headers.get('location')!, h.fake.url));
    expect(await confirmPage.text()).toContain('Confirm the payment');
    const confirmed = await fetch(`${h.fake.url}/pay/${pi.id}/authenticate`, {
      method: 'POST',
      redirect: 'manual',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ outcome: 'approve', return_url: RETURN_URL }).toString(),
    });
    expect(new URL(confirmed.headers.get('location')!).searchParams.get('redirect_status')).toBe('succeeded');
  });

  it('keeps the rider on the form for a mistyped or non-test number', async () => {
    const pi = await newIntent();
    const typo = await submit(pi.id, { card_number: '4242 4242 4242 4241' });
    expect(typo.status).toBe(200);
    expect(await typo.text()).toContain('not valid');
    const real = await submit(pi.id, { card_number: '4111111111111111' });
    expect(await real.text()).toContain('only the test card numbers');
    expect((await h.stripe.paymentIntents.retrieve(pi.id)).status).toBe('requires_payment_method');
  });

  it('carries a return_url given at creation into next_action and the page', async () => {
    const pi = await h.stripe.paymentIntents.create({ amount: 9_900, currency: 'usd', return_url: RETURN_URL });
    expect(pi.next_action?.redirect_to_url?.return_url).toBe(RETURN_URL);
    const res = await fetch(pi.next_action!.redirect_to_url!.url!);
    expect(await res.text()).toContain(`value="${RETURN_URL}"`);
  });
});

describe('payments fake: confirm through the API', () => {
  it('succeeds with pm_card_visa and returns a card error for a declining token', async () => {
    const ok = await newIntent();
    const confirmed = await h.stripe.paymentIntents.confirm(ok.id, { payment_method: 'pm_card_visa' });
    expect(confirmed.status).toBe('succeeded');

    const bad = await newIntent();
    const err = (await h.stripe.paymentIntents
      .confirm(bad.id, { payment_method: 'pm_card_chargeDeclinedInsufficientFunds' })
      .catch((e: unknown) => e)) as Stripe.errors.StripeCardError;
    expect(err).toBeInstanceOf(Stripe.errors.StripeCardError);
    expect(err).toMatchObject({ statusCode: 402, code: 'card_declined', decline_code: 'insufficient_funds' });
    expect(err.payment_intent?.id).toBe(bad.id);
  });
});
