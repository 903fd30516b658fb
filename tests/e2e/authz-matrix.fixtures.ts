// People and things for the adversarial app tests, made through the domain functions against the app's own
// database (and the payments stand-in the app uses), so each test file has rows nobody else touches.
import knex, { type Knex } from 'knex';
import sharp from 'sharp';
import { inject } from 'vitest';
import { knexConfig } from '../../knexfile';
import { createAccount, loadSessionUser } from '@/lib/auth/accounts';
import type { SessionUser } from '@/lib/auth/roles';
import { acceptBid } from '@/lib/market/acceptBid';
import { cancelRequest } from '@/lib/market/cancelRequest';
import { createRequest } from '@/lib/market/createRequest';
import { placeBid } from '@/lib/market/placeBid';
import { postMessage } from '@/lib/market/messages';
import { bidInputSchema, requestInputSchema, type BidFormValues, type RequestFormValues } from '@/lib/market/schema';
import { createProcessorClient, type PaymentsContext } from '@/lib/payments/context';
import { openDispute } from '@/lib/payments/disputes';
import { confirmReceipt, markShipped, startBuild } from '@/lib/payments/fulfilment';
import { LOCAL_PAYMENTS } from '@/lib/payments/localDefaults';
import { startPayment } from '@/lib/payments/pay';
import { startPayoutSetup } from '@/lib/payments/payoutAccounts';
import { Visitor } from '../support/http';

export const PRINCIPALS = ['anonymous', 'riderA', 'riderB', 'builderX', 'builderY', 'admin'] as const;
export type Principal = (typeof PRINCIPALS)[number];
type Person = Exclude<Principal, 'anonymous'>;

const PASSWORD = 'an adversarial test password';

export function appDb(): Knex {
  return knex(knexConfig(inject('appDatabaseUrl')));
}

export async function until(check: () => Promise<boolean>, what: string, timeoutMs = 15_000): Promise<void> {
  const end = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

/**
 * Fresh people for one test file (so its mail, jobs and lists are its own): two riders, builders of two new
 * shops and an admin, each signed in over HTTP; anonymous has no cookie.
 */
export async function signInAll(db: Knex): Promise<{ visitors: Record<Principal, Visitor>; users: Record<Person, SessionUser> }> {
  const tag = `${Date.now().toString(36)}-${process.pid}`;
  const email = (who: string) => `${who}-${tag}@example.test`;
  const made: Record<Person, SessionUser> = {
    riderA: await createAccount(db, { role: 'rider', name: 'Adversarial Rider A', email: email('rider-a'), password: PASSWORD }),
    riderB: await createAccount(db, { role: 'rider', name: 'Adversarial Rider B', email: email('rider-b'), password: PASSWORD }),
    builderX: await createAccount(db, { role: 'builder', name: 'Adversarial Builder X', email: email('builder-x'), password: PASSWORD, shopName: `Test Truing Bench X ${tag}`, zip: '87102' }),
    builderY: await createAccount(db, { role: 'builder', name: 'Adversarial Builder Y', email: email('builder-y'), password: PASSWORD, shopName: `Test Truing Bench Y ${tag}`, zip: '90802' }),
    admin: await createAccount(db, { role: 'rider', name: 'Adversarial Admin', email: email('admin'), password: PASSWORD }),
  };
  await db('users').where({ id: made.admin.id }).update({ role: 'admin' });
  const visitors = { anonymous: new Visitor() } as Record<Principal, Visitor>;
  const users = {} as Record<Person, SessionUser>;
  for (const [principal, user] of Object.entries(made) as [Person, SessionUser][]) {
    const visitor = new Visitor();
    const res = await visitor.signInWithPassword(user.email, PASSWORD);
    if (res.status !== 200) throw new Error(`sign-in as ${user.email} answered ${res.status}`);
    visitors[principal] = visitor;
    users[principal] = (await loadSessionUser(db, user.id))!;
  }
  return { visitors, users };
}

const daysFromNow = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

export function requestValues(overrides: Partial<RequestFormValues> = {}): RequestFormValues {
  return {
    title: 'Adversarial test: 26-inch rear',
    wheels: [{ position: 'rear', nominalDiameterIn: 26, rimWidthMm: 80, tireWidthMm: 76, spokes: 72, spokeGauge: 12, lacing: { kind: 'cross', crosses: 3 }, hubId: 'rear-igh3-coaster-120', finish: 'polished' }],
    frame: { rearSpacingMm: 120, frontSpacingMm: 100, bbShellWidthMm: 68, bbShellType: 'threaded' },
    zip: '87102',
    delivery: 'ship',
    neededBy: daysFromNow(60),
    budgetCents: 60_000,
    notes: '',
    ...overrides,
  } as RequestFormValues;
}

export function bidValues(overrides: Partial<BidFormValues> = {}): BidFormValues {
  return { partsCents: 30_000, labourCents: 15_000, finishCents: 5_000, shippingCents: 4_000, leadTimeDays: 21, validUntil: daysFromNow(14), message: 'Happy to build this.', ...overrides };
}

/** Makers bound to the app's database and the payments stand-in the app talks to. */
export class World {
  readonly ctx: PaymentsContext;
  private payoutsReady = new Set<string>();

  constructor(
    readonly db: Knex,
    readonly users: Record<Person, SessionUser>,
  ) {
    const fake = new URL(inject('paymentsFakeUrl'));
    this.ctx = {
      db,
      stripe: createProcessorClient({ host: fake.hostname, port: Number(fake.port), protocol: 'http', secretKey: process.env.PAYMENTS_SECRET_KEY ?? LOCAL_PAYMENTS.secretKey }),
      settings: { feeBps: 1000, autoConfirmDays: 14, currency: 'usd', appUrl: inject('appUrl') },
    };
  }

  private async fake(path: string, body?: unknown): Promise<Record<string, unknown>> {
    const res = await fetch(`${inject('paymentsFakeUrl')}${path}`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body ?? {}) });
    const json = (await res.json()) as Record<string, unknown>;
    if (!res.ok) throw new Error(`payments stand-in ${path}: ${res.status} ${JSON.stringify(json)}`);
    return json;
  }

  /** Takes this file's open requests off the builders' board, so other files see the board they expect. */
  async cancelOpenRequests(): Promise<void> {
    for (const rider of [this.users.riderA, this.users.riderB]) {
      const open = await this.db('wheel_requests').where({ rider_id: rider.id, status: 'open' }).pluck('id');
      for (const id of open) await cancelRequest(this.db, rider, id);
    }
  }

  /**
   * Waits (at most `timeoutMs`) until the payments stand-in has delivered the events it has made, which
   * arrive a moment after the calls that cause them. Best effort: a delivery in a long retry goes on later.
   */
  async settleWebhooks(timeoutMs = 20_000): Promise<boolean> {
    const end = Date.now() + timeoutMs;
    while (Date.now() < end) {
      const state = (await (await fetch(`${inject('paymentsFakeUrl')}/_test/webhooks`)).json()) as { pending: string[]; held: string[] };
      if (state.pending.length === 0 && state.held.length === 0) return true;
      await new Promise((r) => setTimeout(r, 100));
    }
    return false;
  }

  async draftRequest(rider = this.users.riderA, overrides: Partial<RequestFormValues> = {}) {
    return createRequest(this.db, rider, requestInputSchema.parse(requestValues(overrides)), { publish: false });
  }

  async openRequest(rider = this.users.riderA, overrides: Partial<RequestFormValues> = {}) {
    return createRequest(this.db, rider, requestInputSchema.parse(requestValues(overrides)), { publish: true });
  }

  async bid(requestId: string, builder = this.users.builderX, overrides: Partial<BidFormValues> = {}) {
    return placeBid(this.db, builder, requestId, bidInputSchema.parse(bidValues(overrides)));
  }

  /** An open request of rider A with a live bid and a message from shop X. */
  async requestWithBid() {
    const request = await this.openRequest();
    const bid = await this.bid(request.id);
    await postMessage(this.db, this.users.builderX, request.id, this.users.builderX.shopId!, 'Which hub do you have in hand?');
    return { requestId: request.id, bidId: bid.id, shopId: this.users.builderX.shopId! };
  }

  /** Rider A accepted shop X's bid: a job awaiting payment. */
  async acceptedJob() {
    const { requestId, bidId, shopId } = await this.requestWithBid();
    const { job } = await acceptBid(this.db, this.users.riderA, requestId, bidId);
    return { requestId, bidId, shopId, jobId: job.id };
  }

  async ensurePayouts(builder = this.users.builderX): Promise<void> {
    if (this.payoutsReady.has(builder.shopId!)) return;
    const ready = async () => (await this.db('payout_accounts').where({ shop_id: builder.shopId }).first('status'))?.status === 'active';
    if (!(await ready())) {
      await startPayoutSetup(this.ctx, builder);
      const row = await this.db('payout_accounts').where({ shop_id: builder.shopId }).first('account_id');
      await this.fake(`/_test/accounts/${row.account_id}/onboard`);
      await until(ready, 'payouts to become active (account webhook)');
    }
    this.payoutsReady.add(builder.shopId!);
  }

  /** Paid into escrow through the stand-in; the app's webhook route marks it funded. */
  async fundedJob() {
    await this.ensurePayouts();
    const world = await this.acceptedJob();
    const { redirectUrl } = await startPayment(this.ctx, this.users.riderA, world.jobId);
    const intent = decodeURIComponent(new URL(redirectUrl).pathname.split('/').pop()!);
    await this.fake(`/_test/payment_intents/${intent}/pay`, { card: '4242424242424242' });
    await until(async () => (await this.db('jobs').where({ id: world.jobId }).first('status')).status === 'funded', 'the job to be funded (payment webhook)');
    return world;
  }

  async buildingJob() {
    const world = await this.fundedJob();
    await startBuild(this.ctx, this.users.builderX, world.jobId);
    return world;
  }

  async shippedJob() {
    const world = await this.buildingJob();
    await markShipped(this.ctx, this.users.builderX, world.jobId, { handover: 'carrier', carrier: 'Lanternline Freight', trackingNumber: 'TRK 1234-5678' });
    return world;
  }

  async disputedJob() {
    const world = await this.shippedJob();
    await openDispute(this.ctx, this.users.riderA, world.jobId, { reason: 'not_as_described', details: 'The rim is narrower than the one agreed in the bid.' });
    const dispute = await this.db('disputes').where({ job_id: world.jobId }).first('id');
    return { ...world, disputeId: dispute.id as string };
  }

  async completedJob() {
    const world = await this.shippedJob();
    await confirmReceipt(this.ctx, this.users.riderA, world.jobId);
    return world;
  }
}

/** A small real photo. */
export function photoBytes(): Promise<Buffer> {
  return sharp({ create: { width: 64, height: 48, channels: 3, background: '#b08040' } }).png().toBuffer();
}

/** A request photo uploaded over HTTP by the visitor (the rider), through storage, finalized. */
export async function uploadRequestPhoto(rider: Visitor, requestId: string): Promise<string> {
  const bytes = await photoBytes();
  const created = await rider.request('/api/uploads', { method: 'POST', json: { purpose: 'request_photo', subjectId: requestId, fileName: 'frame.png', contentType: 'image/png', bytes: bytes.length } });
  if (created.status !== 201) throw new Error(`upload start answered ${created.status}: ${await created.text()}`);
  const { uploadId, uploadUrl, headers } = (await created.json()) as { uploadId: string; uploadUrl: string; headers: Record<string, string> };
  const put = await fetch(uploadUrl, { method: 'PUT', headers, body: new Uint8Array(bytes) });
  if (!put.ok) throw new Error(`storage PUT answered ${put.status}`);
  const done = await rider.request(`/api/uploads/${uploadId}/finalize`, { method: 'POST' });
  if (done.status !== 200) throw new Error(`finalize answered ${done.status}: ${await done.text()}`);
  return uploadId;
}
