// Starts a payments fake on a free port with a throwaway data file, a real SDK client for it,
// and a small webhook receiver that checks signatures with the SDK.
import http from 'node:http';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';
import { startPaymentsFake, type PaymentsFake, type PaymentsFakeOptions } from '@/lib/fakes/payments/server';

export const SECRET_KEY = 'sk_test_lacewright_fake';
export const WEBHOOK_SECRET = 'whsec_lacewright_test_secret';

export function sdkFor(port: number, key = SECRET_KEY): Stripe {
  return new Stripe(key, { host: '127.0.0.1', port, protocol: 'http', maxNetworkRetries: 0, telemetry: false });
}

export interface FakeHandle {
  fake: PaymentsFake;
  stripe: Stripe;
  dataFile: string;
  dir: string;
  /** Calls a test control and returns its JSON. */
  control<T = Record<string, unknown>>(path: string, body?: unknown, method?: string): Promise<{ status: number; body: T }>;
  restart(overrides?: Partial<PaymentsFakeOptions>): Promise<void>;
  close(): Promise<void>;
}

export async function startFake(options: Partial<PaymentsFakeOptions> = {}): Promise<FakeHandle> {
  const dir = mkdtempSync(path.join(tmpdir(), 'payments-fake-'));
  const dataFile = path.join(dir, 'state.json');
  const base: PaymentsFakeOptions = { port: 0, dataFile, webhookRetryDelaysMs: [30, 60], ...options };
  const handle: FakeHandle = {
    fake: await startPaymentsFake(base),
    stripe: undefined as unknown as Stripe,
    dataFile,
    dir,
    async control<T>(p: string, body?: unknown, method = 'POST') {
      const res = await fetch(`${handle.fake.url}${p}`, {
        method,
        headers: body === undefined ? {} : { 'content-type': 'application/json' },
        body: body === undefined ? undefined : JSON.stringify(body),
      });
      return { status: res.status, body: (await res.json()) as T };
    },
    async restart(overrides = {}) {
      await handle.fake.close();
      handle.fake = await startPaymentsFake({ ...base, ...overrides });
      handle.stripe = sdkFor(handle.fake.port);
    },
    async close() {
      await handle.fake.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
  handle.stripe = sdkFor(handle.fake.port);
  return handle;
}

/** Pays a payment intent through the JSON test helper, as the hosted page would. */
export async function payWith(h: FakeHandle, paymentIntentId: string, card: string): Promise<Stripe.PaymentIntent> {
  const res = await h.control<Stripe.PaymentIntent>(`/_test/payment_intents/${paymentIntentId}/pay`, { card });
  if (res.status !== 200) throw new Error(`pay failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body;
}

export async function paidIntent(h: FakeHandle, amount: number, extra: Partial<Stripe.PaymentIntentCreateParams> = {}) {
  const pi = await h.stripe.paymentIntents.create({ amount, currency: 'usd', ...extra });
  const paid = await payWith(h, pi.id, '4242424242424242');
  return { pi: paid, chargeId: paid.latest_charge as string };
}

export interface Received {
  event: Stripe.Event;
  raw: string;
  signature: string;
}

export interface Receiver {
  url: string;
  received: Received[];
  /** Status to answer with for the nth request (0-based); 200 by default. */
  respond: (n: number) => number;
  requests: number;
  waitFor(predicate: (r: Received[]) => boolean, timeoutMs?: number): Promise<void>;
  close(): Promise<void>;
}

export async function startReceiver(secret = WEBHOOK_SECRET): Promise<Receiver> {
  const verifier = new Stripe('sk_test_unused', { telemetry: false });
  const receiver: Receiver = {
    url: '',
    received: [],
    respond: () => 200,
    requests: 0,
    async waitFor(predicate, timeoutMs = 3000) {
      const until = Date.now() + timeoutMs;
      while (!predicate(receiver.received)) {
        if (Date.now() > until) throw new Error(`webhooks not received in time; got ${receiver.received.map((r) => r.event.type).join(', ')}`);
        await new Promise((r) => setTimeout(r, 10));
      }
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
  const server = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      const n = receiver.requests++;
      const status = receiver.respond(n);
      if (status >= 200 && status < 300) {
        const raw = Buffer.concat(chunks).toString('utf8');
        const signature = String(req.headers['stripe-signature'] ?? '');
        try {
          const event = verifier.webhooks.constructEvent(raw, signature, secret);
          receiver.received.push({ event, raw, signature });
        } catch {
          res.writeHead(400).end('bad signature');
          return;
        }
      }
      res.writeHead(status).end();
    });
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
  receiver.url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/webhooks`;
  return receiver;
}

/** A port nothing listens on (bound then released). */
export async function closedPort(): Promise<number> {
  const s = http.createServer();
  await new Promise<void>((resolve) => s.listen(0, '127.0.0.1', () => resolve()));
  const port = (s.address() as AddressInfo).port;
  await new Promise<void>((resolve) => s.close(() => resolve()));
  return port;
}

export async function until(check: () => Promise<boolean> | boolean, timeoutMs = 3000): Promise<void> {
  const end = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > end) throw new Error('condition not met in time');
    await new Promise((r) => setTimeout(r, 10));
  }
}
