// Signed event delivery, retries, and the controls for duplicate and out-of-order delivery.
import { afterEach, describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import { closedPort, paidIntent, startFake, startReceiver, until, WEBHOOK_SECRET, type FakeHandle, type Receiver } from './helpers';

const cleanups: (() => Promise<void>)[] = [];
afterEach(async () => {
  while (cleanups.length) await cleanups.pop()!();
});

async function setup(options: Parameters<typeof startFake>[0] = {}): Promise<{ h: FakeHandle; receiver: Receiver }> {
  const receiver = await startReceiver();
  const h = await startFake({ webhookUrl: receiver.url, webhookSecret: WEBHOOK_SECRET, ...options });
  cleanups.push(() => receiver.close(), () => h.close());
  return { h, receiver };
}

const verifier = new Stripe('sk_test_unused', { telemetry: false });

describe('payments fake: webhook delivery', () => {
  it('posts each event signed so that constructEvent accepts it', async () => {
    const { h, receiver } = await setup();
    const { pi } = await paidIntent(h, 15_000);
    await receiver.waitFor((r) => r.some((x) => x.event.type === 'payment_intent.succeeded'));
    const types = receiver.received.map((r) => r.event.type);
    expect(types).toEqual(['payment_intent.created', 'charge.succeeded', 'payment_intent.succeeded']);

    const succeeded = receiver.received[2];
    expect(succeeded.signature).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/);
    expect(succeeded.event.id).toMatch(/^evt_/);
    expect(succeeded.event).toMatchObject({ object: 'event', livemode: false, type: 'payment_intent.succeeded' });
    expect(succeeded.event.api_version).toBeTypeOf('string');
    expect((succeeded.event.data.object as Stripe.PaymentIntent).id).toBe(pi.id);

    const stored = await h.stripe.events.retrieve(succeeded.event.id);
    expect(stored.id).toBe(succeeded.event.id);
    const listed = await h.stripe.events.list({ type: 'payment_intent.succeeded' });
    expect(listed.data.map((e) => e.id)).toEqual([succeeded.event.id]);
  });

  it('produces a signature that fails for a tampered body or another secret', async () => {
    const { h, receiver } = await setup();
    await h.stripe.customers.create({ email: 'sig@example.test' });
    await receiver.waitFor((r) => r.length === 1);
    const { raw, signature } = receiver.received[0];
    expect(() => verifier.webhooks.constructEvent(raw, signature, WEBHOOK_SECRET)).not.toThrow();
    const tampered = raw.replace('sig@example.test', 'evil@example.test');
    expect(() => verifier.webhooks.constructEvent(tampered, signature, WEBHOOK_SECRET)).toThrow(
      Stripe.errors.StripeSignatureVerificationError,
    );
    expect(() => verifier.webhooks.constructEvent(raw, signature, 'whsec_other')).toThrow(Stripe.errors.StripeSignatureVerificationError);
  });

  it('retries when the endpoint fails, without holding up the API', async () => {
    const { h, receiver } = await setup({ webhookRetryDelaysMs: [20, 20, 20] });
    receiver.respond = (n) => (n < 2 ? 500 : 200);
    const customer = await h.stripe.customers.create({});
    await receiver.waitFor((r) => r.length === 1);
    expect((receiver.received[0].event.data.object as Stripe.Customer).id).toBe(customer.id);
    const evtId = receiver.received[0].event.id;
    const record = (await h.control<{ status: string; attempts: { status: number }[] }>(`/_test/events/${evtId}/delivery`, undefined, 'GET')).body;
    expect(record.status).toBe('delivered');
    expect(record.attempts.map((a) => a.status)).toEqual([500, 500, 200]);
  });

  it('gives up after the last retry when the endpoint is unreachable', async () => {
    const port = await closedPort();
    const h = await startFake({ webhookUrl: `http://127.0.0.1:${port}/hook`, webhookSecret: WEBHOOK_SECRET, webhookRetryDelaysMs: [10, 10] });
    cleanups.push(() => h.close());
    const started = Date.now();
    await h.stripe.customers.create({});
    expect(Date.now() - started).toBeLessThan(1000);
    const [evt] = (await h.stripe.events.list({ limit: 1 })).data;
    await until(async () => (await h.control<{ status: string }>(`/_test/events/${evt.id}/delivery`, undefined, 'GET')).body.status === 'failed');
    const record = (await h.control<{ attempts: { status: number | null; error: string | null }[] }>(`/_test/events/${evt.id}/delivery`, undefined, 'GET')).body;
    expect(record.attempts).toHaveLength(3);
    expect(record.attempts.every((a) => a.status === null && a.error)).toBe(true);
  });

  it('holds deliveries while paused and releases them in reverse order', async () => {
    const { h, receiver } = await setup();
    await h.control('/_test/webhooks/pause');
    const pi = await h.stripe.paymentIntents.create({ amount: 5_000, currency: 'usd' });
    await h.control(`/_test/payment_intents/${pi.id}/pay`, { card: '4242424242424242' });
    await new Promise((r) => setTimeout(r, 50));
    expect(receiver.received).toHaveLength(0);
    const status = (await h.control<{ held: string[] }>('/_test/webhooks', undefined, 'GET')).body;
    expect(status.held).toHaveLength(3);

    const flushed = await h.control<{ delivered: { status: number }[] }>('/_test/webhooks/flush?order=reverse');
    expect(flushed.body.delivered.map((d) => d.status)).toEqual([200, 200, 200]);
    expect(receiver.received.map((r) => r.event.type)).toEqual(['payment_intent.succeeded', 'charge.succeeded', 'payment_intent.created']);

    // Still paused: the next event waits for resume.
    await h.stripe.customers.create({});
    await new Promise((r) => setTimeout(r, 30));
    expect(receiver.received).toHaveLength(3);
    await h.control('/_test/webhooks/resume');
    expect(receiver.received.map((r) => r.event.type)).toContain('customer.created');
  });

  it('re-sends an event on request, giving the receiver a duplicate', async () => {
    const { h, receiver } = await setup();
    await h.stripe.customers.create({});
    await receiver.waitFor((r) => r.length === 1);
    const id = receiver.received[0].event.id;
    const res = await h.control<{ status: number }>(`/_test/events/${id}/resend`);
    expect(res.body.status).toBe(200);
    expect(receiver.received.map((r) => r.event.id)).toEqual([id, id]);
  });
});
