// Makers for market tests: each test creates its own people, shops and requests.
import type { Knex } from 'knex';
import { inject } from 'vitest';
import { createAccount } from '@/lib/auth/accounts';
import type { SessionUser } from '@/lib/auth/roles';
import { createRequest } from '@/lib/market/createRequest';
import { placeBid } from '@/lib/market/placeBid';
import { bidInputSchema, requestInputSchema, type BidFormValues, type RequestFormValues } from '@/lib/market/schema';
import { testDb, uniqueEmail } from '../../support/db';
import { migrateLatest } from '../../../scripts/lib/database';
import { databaseUrl, ensureDatabase } from '../../../scripts/lib/postgres';

/**
 * A freshly migrated database of the test's own, for tests whose worker ticks sweep every row
 * (expiry, outbox) and so must not touch rows other test files are watching.
 */
export async function ownDatabase(name: string): Promise<Knex> {
  const port = inject('clusterPort');
  const database = `market_${name}_${Date.now().toString(36)}_${process.pid}`;
  ensureDatabase({ dir: inject('clusterDir'), port }, database);
  await migrateLatest(databaseUrl(port, database));
  return testDb(databaseUrl(port, database));
}

const PASSWORD = 'a long test password';

export const daysFromNow = (days: number): string => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

export async function makeRider(db: Knex): Promise<SessionUser> {
  return createAccount(db, { role: 'rider', name: 'Test Rider', email: uniqueEmail('rider'), password: PASSWORD });
}

export async function makeAdmin(db: Knex): Promise<SessionUser> {
  const user = await createAccount(db, { role: 'rider', name: 'Test Admin', email: uniqueEmail('admin'), password: PASSWORD });
  await db('users').where({ id: user.id }).update({ role: 'admin' });
  return { ...user, role: 'admin' };
}

let shopCounter = 0;
export async function makeBuilder(db: Knex, opts: { zip?: string; capabilities?: Record<string, unknown> } = {}): Promise<SessionUser> {
  shopCounter += 1;
  const user = await createAccount(db, {
    role: 'builder',
    name: 'Test Builder',
    email: uniqueEmail('builder'),
    password: PASSWORD,
    shopName: `Test Truing Bench ${shopCounter}`,
    zip: opts.zip ?? '87102',
  });
  if (opts.capabilities) await db('shops').where({ id: user.shopId }).update({ capabilities: JSON.stringify(opts.capabilities) });
  return user;
}

/** A second member of an existing shop. */
export async function addShopMember(db: Knex, shopId: string): Promise<SessionUser> {
  const user = await createAccount(db, { role: 'rider', name: 'Second Builder', email: uniqueEmail('member'), password: PASSWORD });
  await db('users').where({ id: user.id }).update({ role: 'builder' });
  await db('shop_members').insert({ shop_id: shopId, user_id: user.id, member_role: 'member' });
  return { ...user, role: 'builder', shopId };
}

export const rearWheel = {
  position: 'rear',
  nominalDiameterIn: 26,
  rimWidthMm: 80,
  tireWidthMm: 76,
  spokes: 72,
  spokeGauge: 12,
  lacing: { kind: 'cross', crosses: 3 },
  hubId: 'rear-igh3-coaster-120',
  finish: 'polished',
} as const;

export const frontWheel = { ...rearWheel, position: 'front', hubId: 'front-100' } as const;

export function requestValues(overrides: Partial<RequestFormValues> = {}): RequestFormValues {
  return {
    title: '26-inch 72-spoke rear',
    wheels: [rearWheel],
    frame: { rearSpacingMm: 120, frontSpacingMm: 100, bbShellWidthMm: 68, bbShellType: 'threaded' },
    zip: '90802',
    delivery: 'ship',
    neededBy: daysFromNow(60),
    budgetCents: 60_000,
    notes: '',
    ...overrides,
  } as RequestFormValues;
}

export function bidValues(overrides: Partial<BidFormValues> = {}): BidFormValues {
  return {
    partsCents: 30_000,
    labourCents: 15_000,
    finishCents: 5_000,
    shippingCents: 4_000,
    leadTimeDays: 21,
    validUntil: daysFromNow(14),
    message: 'Happy to build this.',
    ...overrides,
  };
}

export async function openRequest(db: Knex, rider: SessionUser, overrides: Partial<RequestFormValues> = {}) {
  return createRequest(db, rider, requestInputSchema.parse(requestValues(overrides)), { publish: true });
}

export async function bid(db: Knex, builder: SessionUser, requestId: string, overrides: Partial<BidFormValues> = {}) {
  return placeBid(db, builder, requestId, bidInputSchema.parse(bidValues(overrides)));
}

export async function outboxFor(db: Knex, email: string) {
  return db('outbox').where({ to_email: email }).orderBy('created_at');
}
