// Makers for review and matching tests: people, shops and jobs written straight into the tables in the shapes
// the migrations define, so a test can have a completed job at any moment it likes.
import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { inject } from 'vitest';
import type { SessionUser } from '@/lib/auth/roles';
import { createRequest } from '@/lib/market/createRequest';
import { requestInputSchema, type RequestFormValues } from '@/lib/market/schema';
import { testDb, uniqueEmail } from '../../support/db';
import { migrateLatest } from '../../../scripts/lib/database';
import { databaseUrl, ensureDatabase } from '../../../scripts/lib/postgres';

export const DAY = 86_400_000;
export const daysAfter = (from: Date, days: number): Date => new Date(from.getTime() + days * DAY);

/** A freshly migrated database for tests that look across every shop or every job (ranking, reminders). */
export async function ownDatabase(name: string): Promise<Knex> {
  const port = inject('clusterPort');
  const database = `reviews_${name}_${Date.now().toString(36)}_${process.pid}`;
  ensureDatabase({ dir: inject('clusterDir'), port }, database);
  await migrateLatest(databaseUrl(port, database));
  return testDb(databaseUrl(port, database));
}

export async function makeRider(db: Knex, name = 'Ottilie Brandwater'): Promise<SessionUser> {
  const [row] = await db('users').insert({ email: uniqueEmail('review-rider'), name, role: 'rider' }).returning(['id', 'email', 'name', 'role']);
  return { ...row, shopId: null };
}

export async function makeAdmin(db: Knex): Promise<SessionUser> {
  const [row] = await db('users').insert({ email: uniqueEmail('review-admin'), name: 'Admin Person', role: 'admin' }).returning(['id', 'email', 'name', 'role']);
  return { ...row, shopId: null };
}

export interface ShopOptions {
  name?: string;
  /** Defaults to Albuquerque, NM. */
  latitude?: number;
  longitude?: number;
  capabilities?: Record<string, unknown>;
  buildsAtOnce?: number;
}

let shopCounter = 0;
/** A shop with one builder; returns the builder (whose shopId is the shop). */
export async function makeShop(db: Knex, opts: ShopOptions = {}): Promise<SessionUser & { shopId: string; slug: string }> {
  shopCounter += 1;
  const slug = `review-test-shop-${Date.now().toString(36)}-${process.pid}-${shopCounter}`;
  const [shop] = await db('shops')
    .insert({
      name: opts.name ?? `Spoke Test Bench ${shopCounter}`,
      slug,
      city: 'Albuquerque',
      region: 'NM',
      zip: '87102',
      latitude: opts.latitude ?? 35.0844,
      longitude: opts.longitude ?? -106.6504,
      capabilities: JSON.stringify(opts.capabilities ?? {}),
      builds_at_once: opts.buildsAtOnce ?? 1,
    })
    .returning('id');
  const builder = await addMember(db, shop.id);
  return { ...builder, shopId: shop.id, slug };
}

export async function addMember(db: Knex, shopId: string): Promise<SessionUser & { shopId: string }> {
  const [user] = await db('users').insert({ email: uniqueEmail('review-builder'), name: 'Bench Builder', role: 'builder' }).returning(['id', 'email', 'name', 'role']);
  await db('shop_members').insert({ shop_id: shopId, user_id: user.id, member_role: 'owner' });
  return { ...user, shopId };
}

const WHEEL = {
  position: 'rear',
  nominalDiameterIn: 26,
  rimWidthMm: 80,
  tireWidthMm: 76,
  spokes: 72,
  spokeGauge: 12,
  lacing: { kind: 'cross', crosses: 3 },
  hubId: 'rear-igh3-coaster-120',
  finish: 'polished',
};

export interface JobOptions {
  status?: string;
  /** When the job completed; its payment and shipping times are set before it. */
  completedAt?: Date;
  fundedAt?: Date;
  shippedAt?: Date;
  leadTimeDays?: number;
}

/** A request, an accepted bid and a job between a rider and a shop, inserted as they would stand after the flow. */
export async function makeJob(db: Knex, rider: SessionUser, shopId: string, opts: JobOptions = {}): Promise<{ jobId: string; requestId: string }> {
  const status = opts.status ?? 'completed';
  const completedAt = opts.completedAt ?? new Date();
  const fundedAt = opts.fundedAt ?? daysAfter(completedAt, -25);
  const shippedAt = opts.shippedAt ?? daysAfter(completedAt, -4);
  const requestId = randomUUID();
  const bidId = randomUUID();
  await db('wheel_requests').insert({
    id: requestId,
    rider_id: rider.id,
    title: '26-inch rear on a 3-inch rim',
    status: 'open', // awarded below, once the accepted bid exists
    spec: JSON.stringify({ wheels: [WHEEL], frame: { rearSpacingMm: 120, frontSpacingMm: 100, bbShellWidthMm: 68, bbShellType: 'threaded' } }),
    diameters_in: [26],
    rim_widths_in: [3],
    spoke_gauges: [12],
    spoke_counts: [72],
    zip: '90802',
    city: 'Long Beach',
    region: 'CA',
    latitude: 33.7701,
    longitude: -118.1937,
    delivery: 'ship',
    needed_by: daysAfter(completedAt, 30).toISOString().slice(0, 10),
    budget_cents: 60_000,
    fit_verdict: 'fits',
    baseline_low_cents: 30_000,
    baseline_cents: 40_000,
    baseline_high_cents: 50_000,
    published_at: daysAfter(fundedAt, -5),
    expires_at: daysAfter(fundedAt, 25),
  });
  await db('bids').insert({
    id: bidId,
    request_id: requestId,
    shop_id: shopId,
    status: 'accepted',
    parts_cents: 30_000,
    labour_cents: 15_000,
    finish_cents: 3_000,
    shipping_cents: 2_000,
    lead_time_days: opts.leadTimeDays ?? 21,
    valid_until: daysAfter(fundedAt, 10),
    closed_at: fundedAt,
  });
  await db('wheel_requests').where({ id: requestId }).update({ status: 'awarded', accepted_bid_id: bidId });
  const done = status === 'completed';
  const [job] = await db('jobs')
    .insert({
      request_id: requestId,
      bid_id: bidId,
      rider_id: rider.id,
      shop_id: shopId,
      price_cents: 50_000,
      status,
      fee_bps: 1000,
      funded_at: status === 'awaiting_payment' ? null : fundedAt,
      shipped_at: done || status === 'shipped' ? shippedAt : null,
      completed_at: done ? completedAt : null,
      completed_by: done ? 'rider' : null,
    })
    .returning('id');
  return { jobId: job.id, requestId };
}

export const shopReviewInput = (jobId: string, overall = 5, text = 'True, round and on time.') =>
  ({ jobId, side: 'rider', overall, aspects: { buildQuality: overall, communication: overall, onTime: overall }, text }) as const;

export const riderReviewInput = (jobId: string, overall = 5, text = 'Clear measurements, paid promptly.') =>
  ({ jobId, side: 'shop', overall, aspects: { clearSpec: overall, communication: overall, payment: overall }, text }) as const;

export function requestValues(overrides: Partial<RequestFormValues> = {}): RequestFormValues {
  return {
    title: '26-inch 72-spoke rear',
    wheels: [WHEEL],
    frame: { rearSpacingMm: 120, frontSpacingMm: 100, bbShellWidthMm: 68, bbShellType: 'threaded' },
    zip: '90802',
    delivery: 'ship',
    neededBy: new Date(Date.now() + 60 * DAY).toISOString().slice(0, 10),
    budgetCents: 60_000,
    notes: '',
    ...overrides,
  } as RequestFormValues;
}

/** Publishes a request the way a rider does, so the matcher runs inside the publishing transaction. */
export async function publishNewRequest(db: Knex, rider: SessionUser, overrides: Partial<RequestFormValues> = {}) {
  return createRequest(db, rider, requestInputSchema.parse(requestValues(overrides)), { publish: true });
}
