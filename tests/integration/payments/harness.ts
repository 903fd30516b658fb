// A world for payments tests: a database of this file's own (so the worker passes of other test files never
// touch these jobs), the payments fake on a free port, a webhook receiver that runs the app's handler, and
// makers for people, shops and accepted jobs built through the domain functions.
import http from 'node:http';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import knex, { type Knex } from 'knex';
import Stripe from 'stripe';
import { inject } from 'vitest';
import { knexConfig } from '../../../knexfile';
import { databaseUrl, ensureDatabase } from '../../../scripts/lib/postgres';
import { migrateLatest } from '../../../scripts/lib/database';
import { startPaymentsFake, type PaymentsFake } from '@/lib/fakes/payments/server';
import { createAccount } from '@/lib/auth/accounts';
import type { SessionUser } from '@/lib/auth/roles';
import { acceptBid } from '@/lib/market/acceptBid';
import { createRequest } from '@/lib/market/createRequest';
import { placeBid } from '@/lib/market/placeBid';
import { bidInputSchema, requestInputSchema } from '@/lib/market/schema';
import { createProcessorClient, type PaymentsContext, type PaymentsSettings } from '@/lib/payments/context';
import { startPayment } from '@/lib/payments/pay';
import { startPayoutSetup } from '@/lib/payments/payoutAccounts';
import { handleWebhook } from '@/lib/payments/webhook';
import { DomainError } from '@/lib/errors';
import { uniqueEmail } from '../../support/db';

export const SECRET_KEY = 'sk_test_payments_suite';
export const WEBHOOK_SECRET = 'whsec_payments_suite_secret';
export const SUCCESS_CARD = '4242424242424242';
export const DECLINE_CARD = '4000000000000002';
export const INSUFFICIENT_CARD = '4000000000009995';

export const TEST_SETTINGS: PaymentsSettings = { feeBps: 1000, autoConfirmDays: 14, currency: 'usd', appUrl: 'http://127.0.0.1:3999' };

export interface Harness {
  db: Knex;
  ctx: PaymentsContext;
  fake: PaymentsFake;
  fakeUrl: string;
  /** Webhook deliveries answered by the receiver, by status. */
  deliveries: { status: number; type: string; outcome?: string }[];
  control<T = Record<string, unknown>>(p: string, body?: unknown, method?: string): Promise<{ status: number; body: T }>;
  /** Stops the fake (the processor is "down"); `startFake` brings it back with its saved state. */
  stopFake(): Promise<void>;
  startFake(): Promise<void>;
  /** Waits until the fake has no webhook delivery in flight. */
  settle(timeoutMs?: number): Promise<void>;
  close(): Promise<void>;
}

async function ownDatabase(name: string): Promise<Knex> {
  const port = inject('clusterPort');
  ensureDatabase({ dir: inject('clusterDir'), port }, name);
  const url = databaseUrl(port, name);
  await migrateLatest(url);
  return knex(knexConfig(url));
}

export async function startHarness(name: string, settings: Partial<PaymentsSettings> = {}): Promise<Harness> {
  const db = await ownDatabase(`payments_${name}`);
  const dir = mkdtempSync(path.join(tmpdir(), 'payments-suite-'));
  const ctxSettings = { ...TEST_SETTINGS, ...settings };
  const deliveries: Harness['deliveries'] = [];

  // The fake delivers to this receiver, which hands the raw body and signature to the app's handler.
  const box = {} as { ctx: PaymentsContext };
  const receiver = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      const raw = Buffer.concat(chunks).toString('utf8');
      handleWebhook(box.ctx, raw, (req.headers['stripe-signature'] as string | undefined) ?? null, WEBHOOK_SECRET).then(
        (result) => {
          deliveries.push({ status: 200, type: result.type, outcome: result.outcome });
          res.writeHead(200, { 'content-type': 'application/json' }).end(JSON.stringify(result));
        },
        (err: unknown) => {
          const status = err instanceof DomainError ? err.status : 500;
          if (status === 500) console.error('webhook handler failed', err);
          deliveries.push({ status, type: 'unknown' });
          res.writeHead(status).end(String((err as Error).message));
        },
      );
    });
  });
  await new Promise<void>((resolve) => receiver.listen(0, '127.0.0.1', () => resolve()));
  const webhookUrl = `http://127.0.0.1:${(receiver.address() as AddressInfo).port}/api/payments/webhook`;

  const fakeOptions = { port: 0, dataFile: path.join(dir, 'fake.json'), webhookUrl, webhookSecret: WEBHOOK_SECRET, secretKey: SECRET_KEY, webhookRetryDelaysMs: [50, 100, 200, 400] };
  let fake = await startPaymentsFake(fakeOptions);
  const port = fake.port;
  const stripe: Stripe = createProcessorClient({ host: '127.0.0.1', port, protocol: 'http', secretKey: SECRET_KEY });
  const ctx: PaymentsContext = { db, stripe, settings: ctxSettings };
  box.ctx = ctx;

  const h: Harness = {
    db,
    ctx,
    get fake() {
      return fake;
    },
    fakeUrl: fake.url,
    deliveries,
    async control<T>(p: string, body?: unknown, method = 'POST') {
      const res = await fetch(`${fake.url}${p}`, {
        method,
        headers: body === undefined ? {} : { 'content-type': 'application/json' },
        body: body === undefined ? undefined : JSON.stringify(body),
      });
      return { status: res.status, body: (await res.json()) as T };
    },
    async stopFake() {
      await fake.close();
    },
    async startFake() {
      fake = await startPaymentsFake({ ...fakeOptions, port });
    },
    async settle(timeoutMs = 5_000) {
      const end = Date.now() + timeoutMs;
      for (;;) {
        const { body } = await h.control<{ pending: string[]; held: string[] }>('/_test/webhooks', undefined, 'GET');
        if (body.pending.length === 0) return;
        if (Date.now() > end) throw new Error(`webhooks still pending: ${body.pending.join(', ')}`);
        await new Promise((r) => setTimeout(r, 15));
      }
    },
    async close() {
      await fake.close();
      await new Promise<void>((resolve) => receiver.close(() => resolve()));
      await db.destroy();
      rmSync(dir, { recursive: true, force: true });
    },
  };
  return h;
}

export async function until(check: () => Promise<boolean> | boolean, what: string, timeoutMs = 5_000): Promise<void> {
  const end = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 15));
  }
}

// ------------------------------------------------------------------ people, shops and jobs

const PASSWORD = 'a long test password';

export const makeRider = (db: Knex): Promise<SessionUser> => createAccount(db, { role: 'rider', name: 'Pay Test Rider', email: uniqueEmail('pay-rider'), password: PASSWORD });

let shops = 0;
export async function makeBuilder(db: Knex): Promise<SessionUser> {
  shops += 1;
  return createAccount(db, {
    role: 'builder',
    name: 'Pay Test Builder',
    email: uniqueEmail('pay-builder'),
    password: PASSWORD,
    shopName: `Escrow Test Bench ${process.pid}-${shops}`,
    zip: '87102',
  });
}

export async function makeAdmin(db: Knex): Promise<SessionUser> {
  const user = await createAccount(db, { role: 'rider', name: 'Pay Test Admin', email: uniqueEmail('pay-admin'), password: PASSWORD });
  await db('users').where({ id: user.id }).update({ role: 'admin' });
  return { ...user, role: 'admin' };
}

const daysFromNow = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

/** A rider's request with one bid from the builder, accepted: a job awaiting payment. */
export async function acceptedJob(db: Knex, opts: { rider?: SessionUser; builder?: SessionUser; labourCents?: number } = {}) {
  const rider = opts.rider ?? (await makeRider(db));
  const builder = opts.builder ?? (await makeBuilder(db));
  const request = await createRequest(
    db,
    rider,
    requestInputSchema.parse({
      title: 'Escrow test rear wheel',
      wheels: [
        { position: 'rear', nominalDiameterIn: 26, rimWidthMm: 80, tireWidthMm: 76, spokes: 72, spokeGauge: 12, lacing: { kind: 'cross', crosses: 3 }, hubId: 'rear-igh3-coaster-120', finish: 'polished' },
      ],
      frame: { rearSpacingMm: 120, frontSpacingMm: 100, bbShellWidthMm: 68, bbShellType: 'threaded' },
      zip: '90802',
      delivery: 'ship',
      neededBy: daysFromNow(60),
      budgetCents: 60_000,
      notes: '',
    }),
    { publish: true },
  );
  const bid = await placeBid(
    db,
    builder,
    request.id,
    bidInputSchema.parse({ partsCents: 30_000, labourCents: opts.labourCents ?? 15_000, finishCents: 5_000, shippingCents: 4_000, leadTimeDays: 21, validUntil: daysFromNow(14), message: 'Happy to build it.' }),
  );
  const accepted = await acceptBid(db, rider, request.id, bid.id);
  return { rider, builder, jobId: accepted.job.id, priceCents: accepted.job.priceCents, requestId: request.id };
}

/** The builder finishes payout setup on the fake; the account.updated webhook makes it active here. */
export async function activatePayouts(h: Harness, builder: SessionUser): Promise<string> {
  await startPayoutSetup(h.ctx, builder);
  const row = await h.db('payout_accounts').where({ shop_id: builder.shopId }).first();
  if (row.status !== 'active') {
    const res = await h.control(`/_test/accounts/${row.account_id}/onboard`);
    if (res.status !== 200) throw new Error(`onboarding failed: ${JSON.stringify(res.body)}`);
    await until(async () => (await h.db('payout_accounts').where({ shop_id: builder.shopId }).first()).status === 'active', 'payouts to become active');
  }
  return row.account_id as string;
}

export const intentIdFrom = (redirectUrl: string): string => decodeURIComponent(new URL(redirectUrl).pathname.split('/').pop()!);

/** The rider pays on the hosted page with a test card (through the fake's test hook, as the page would). */
export async function payWithCard(h: Harness, rider: SessionUser, jobId: string, card = SUCCESS_CARD): Promise<string> {
  const { redirectUrl } = await startPayment(h.ctx, rider, jobId);
  const pi = intentIdFrom(redirectUrl);
  const res = await h.control<Stripe.PaymentIntent>(`/_test/payment_intents/${pi}/pay`, { card });
  if (res.status !== 200) throw new Error(`pay failed: ${JSON.stringify(res.body)}`);
  return pi;
}

export async function jobRow(db: Knex, jobId: string) {
  return db('jobs').where({ id: jobId }).first();
}

/** A job paid into escrow and marked funded by the webhook. */
export async function fundedJob(h: Harness, opts: Parameters<typeof acceptedJob>[1] = {}) {
  const world = await acceptedJob(h.db, opts);
  await activatePayouts(h, world.builder);
  await payWithCard(h, world.rider, world.jobId);
  await until(async () => (await jobRow(h.db, world.jobId)).status === 'funded', 'the job to be funded');
  return world;
}
