// Connected accounts, onboarding links, transfers from the platform balance, and reversals.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import { paidIntent, startFake, type FakeHandle } from './helpers';

const APP = 'http://app.test/builder/payouts';
const errorOf = (p: Promise<unknown>) => p.catch((e: unknown) => e) as Promise<Stripe.errors.StripeError>;

let h: FakeHandle;
beforeAll(async () => {
  // Funds stay pending for an hour, so a transfer must name its source charge (or wait for the settle control).
  h = await startFake({ fundsAvailableAfterSeconds: 3600 });
});
afterAll(async () => {
  await h.close();
});

async function newBuilderAccount() {
  return h.stripe.accounts.create({
    type: 'express',
    country: 'US',
    email: 'builder@example.test',
    capabilities: { transfers: { requested: true } },
  });
}

async function onboarded() {
  const acct = await newBuilderAccount();
  const res = await h.control<Stripe.Account>(`/_test/accounts/${acct.id}/onboard`);
  expect(res.body.capabilities?.transfers).toBe('active');
  return acct;
}

function linkFor(account: string) {
  return h.stripe.accountLinks.create({
    account,
    type: 'account_onboarding',
    refresh_url: `${APP}?refresh=1`,
    return_url: `${APP}?done=1`,
  });
}

describe('payments fake: connected accounts and onboarding', () => {
  it('creates an account that cannot receive money yet', async () => {
    const acct = await newBuilderAccount();
    expect(acct.id).toMatch(/^acct_/);
    expect(acct).toMatchObject({
      object: 'account',
      type: 'express',
      country: 'US',
      email: 'builder@example.test',
      charges_enabled: false,
      payouts_enabled: false,
      details_submitted: false,
      capabilities: { transfers: 'inactive' },
    });
    expect(acct.requirements?.currently_due?.length).toBeGreaterThan(0);
    expect((await h.stripe.accounts.retrieve(acct.id)).id).toBe(acct.id);
  });

  it('onboards through a single-use link and then sends the link back to refresh_url', async () => {
    const acct = await newBuilderAccount();
    const link = await linkFor(acct.id);
    expect(link.object).toBe('account_link');
    expect(link.url.startsWith(`${h.fake.url}/onboarding/`)).toBe(true);
    expect(link.expires_at - link.created).toBe(300);

    const page = await fetch(link.url, { redirect: 'manual' });
    expect(page.status).toBe(200);
    const html = await page.text();
    expect(html).toContain('Complete onboarding');
    const session = /name="session" value="([^"]+)"/.exec(html)![1];

    const done = await fetch(link.url, {
      method: 'POST',
      redirect: 'manual',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ session, choice: 'complete' }).toString(),
    });
    expect(done.status).toBe(303);
    expect(done.headers.get('location')).toBe(`${APP}?done=1`);

    const after = await h.stripe.accounts.retrieve(acct.id);
    expect(after).toMatchObject({ charges_enabled: true, payouts_enabled: true, details_submitted: true, capabilities: { transfers: 'active' } });
    expect(after.requirements?.currently_due).toEqual([]);

    const reused = await fetch(link.url, { redirect: 'manual' });
    expect(reused.status).toBe(303);
    expect(reused.headers.get('location')).toBe(`${APP}?refresh=1`);

    const events = await h.stripe.events.list({ type: 'account.updated', limit: 3 });
    const updated = events.data.find((e) => (e.data.object as Stripe.Account).id === acct.id)!;
    expect(updated.account).toBe(acct.id);
    expect(updated.data.previous_attributes).toMatchObject({ charges_enabled: false });
  });

  it('sends an expired link to refresh_url, and leaving early changes nothing', async () => {
    const acct = await newBuilderAccount();
    const stale = await linkFor(acct.id);
    await h.control('/_test/account_links/expire');
    const res = await fetch(stale.url, { redirect: 'manual' });
    expect(res.headers.get('location')).toBe(`${APP}?refresh=1`);

    const fresh = await linkFor(acct.id);
    const html = await (await fetch(fresh.url)).text();
    const session = /name="session" value="([^"]+)"/.exec(html)![1];
    const left = await fetch(fresh.url, {
      method: 'POST',
      redirect: 'manual',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ session, choice: 'leave' }).toString(),
    });
    expect(left.headers.get('location')).toBe(`${APP}?done=1`);
    expect((await h.stripe.accounts.retrieve(acct.id)).details_submitted).toBe(false);
  });

  it('requires every link parameter', async () => {
    const acct = await newBuilderAccount();
    const err = await errorOf(
      h.stripe.accountLinks.create({ account: acct.id, type: 'account_onboarding', return_url: APP } as Stripe.AccountLinkCreateParams),
    );
    expect(err).toMatchObject({ statusCode: 400, code: 'parameter_missing', param: 'refresh_url' });
  });
});

describe('payments fake: transfers and balance', () => {
  it('holds charge funds as pending, refuses a plain transfer, and allows one from the source charge', async () => {
    const builder = await onboarded();
    const { chargeId } = await paidIntent(h, 10_000, { transfer_group: 'job_21' });
    const balance = await h.stripe.balance.retrieve();
    expect(balance.object).toBe('balance');
    expect(balance.pending.find((b) => b.currency === 'usd')!.amount).toBeGreaterThanOrEqual(10_000);

    const available = balance.available.find((b) => b.currency === 'usd')!.amount;
    const plain = await errorOf(
      h.stripe.transfers.create({ amount: available + 8_000, currency: 'usd', destination: builder.id, transfer_group: 'job_21' }),
    );
    expect(plain).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(plain.code).toBe('balance_insufficient');

    const transfer = await h.stripe.transfers.create({
      amount: 8_000,
      currency: 'usd',
      destination: builder.id,
      transfer_group: 'job_21',
      source_transaction: chargeId,
      metadata: { jobId: '21' },
    });
    expect(transfer.id).toMatch(/^tr_/);
    expect(transfer).toMatchObject({
      object: 'transfer',
      amount: 8_000,
      amount_reversed: 0,
      destination: builder.id,
      source_transaction: chargeId,
      transfer_group: 'job_21',
      reversed: false,
      metadata: { jobId: '21' },
    });

    // Only 2 000 of that charge is left to transfer.
    const tooMuch = await errorOf(
      h.stripe.transfers.create({ amount: 3_000, currency: 'usd', destination: builder.id, source_transaction: chargeId }),
    );
    expect(tooMuch.code).toBe('balance_insufficient');

    const listed = await h.stripe.transfers.list({ transfer_group: 'job_21' });
    expect(listed.data.map((t) => t.id)).toEqual([transfer.id]);
    expect((await h.stripe.transfers.retrieve(transfer.id)).amount).toBe(8_000);
  });

  it('pays from available funds once they settle', async () => {
    const builder = await onboarded();
    await paidIntent(h, 6_000);
    await h.control('/_test/balance/settle');
    const available = (await h.stripe.balance.retrieve()).available.find((b) => b.currency === 'usd')!.amount;
    expect(available).toBeGreaterThanOrEqual(6_000);
    const transfer = await h.stripe.transfers.create({ amount: 6_000, currency: 'usd', destination: builder.id });
    expect(transfer.source_transaction).toBeNull();
    const after = (await h.stripe.balance.retrieve()).available.find((b) => b.currency === 'usd')!.amount;
    expect(available - after).toBe(6_000);
  });

  it('refuses a destination that has not finished onboarding, or does not exist', async () => {
    const fresh = await newBuilderAccount();
    const { chargeId } = await paidIntent(h, 5_000);
    const notReady = await errorOf(
      h.stripe.transfers.create({ amount: 1_000, currency: 'usd', destination: fresh.id, source_transaction: chargeId }),
    );
    expect(notReady).toMatchObject({ code: 'insufficient_capabilities_for_transfer', param: 'destination' });
    const missing = await errorOf(
      h.stripe.transfers.create({ amount: 1_000, currency: 'usd', destination: 'acct_missing', source_transaction: chargeId }),
    );
    expect(missing).toMatchObject({ code: 'resource_missing', param: 'destination' });
  });

  it('reverses part, then the rest, and returns the money to the platform', async () => {
    const builder = await onboarded();
    await paidIntent(h, 9_000);
    await h.control('/_test/balance/settle');
    const transfer = await h.stripe.transfers.create({ amount: 8_000, currency: 'usd', destination: builder.id });
    const availableAt = async () => (await h.stripe.balance.retrieve()).available.find((b) => b.currency === 'usd')!.amount;
    const start = await availableAt();

    const part = await h.stripe.transfers.createReversal(transfer.id, { amount: 3_000 });
    expect(part.id).toMatch(/^trr_/);
    expect(part).toMatchObject({ object: 'transfer_reversal', amount: 3_000, transfer: transfer.id });
    const rest = await h.stripe.transfers.createReversal(transfer.id);
    expect(rest.amount).toBe(5_000);

    const after = await h.stripe.transfers.retrieve(transfer.id);
    expect(after).toMatchObject({ amount_reversed: 8_000, reversed: true });
    expect(after.reversals.data.map((r) => r.id)).toEqual([rest.id, part.id]);
    expect(await availableAt()).toBe(start + 8_000);

    const again = await errorOf(h.stripe.transfers.createReversal(transfer.id, { amount: 1 }));
    expect(again.code).toBe('amount_too_large');
    const reversed = await h.stripe.events.list({ type: 'transfer.reversed', limit: 1 });
    expect((reversed.data[0].data.object as Stripe.Transfer).id).toBe(transfer.id);
  });
});
