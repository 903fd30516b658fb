// The money path in a browser with the demo accounts: the builder sets up payouts on the payment
// service's page, the rider pays into escrow (a declined card first, then a good one), the payment
// service being down is said plainly, the job is built and shipped, a dispute is opened, and an admin
// splits the money; the ledger balances throughout.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { openBrowser, screenshot } from '../support/browser';

const appUrl = inject('appUrl');
const fakeUrl = inject('paymentsFakeUrl');
const PASSWORD = 'lacewright-demo';
const FIRST_JOB = 'Escrow demo: 26-inch rear, 3-inch rim';
const SECOND_JOB = 'Escrow demo: 24-inch front, 3-inch rim';

let browser: Awaited<ReturnType<typeof openBrowser>>;
let page: Page;

beforeAll(async () => {
  browser = await openBrowser();
  page = browser.page;
});
afterAll(() => browser?.close());

async function signInAs(email: string) {
  await page.context().clearCookies();
  await page.goto(`${appUrl}/sign-in`);
  await page.getByLabel('E-mail', { exact: true }).fill(email);
  await page.getByLabel('Password', { exact: true }).fill(PASSWORD);
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

async function openJob(title: string) {
  await page.goto(`${appUrl}/jobs`);
  await page.getByRole('link', { name: title }).click();
  await page.waitForURL(/\/jobs\/[0-9a-f-]{36}$/);
  await page.getByTestId('next-step').waitFor();
}

async function payOnHostedPage(card: string) {
  await page.getByTestId('pay').click();
  await page.waitForURL(`${fakeUrl}/pay/**`);
  await page.getByLabel('Card number').fill(card);
  await page.getByLabel('Expiry (MM/YY)').fill('12/34');
  await page.getByLabel('Security code').fill('123');
  await page.getByRole('button', { name: /^Pay / }).click();
  await page.waitForURL(/\/payment-return\?/);
}

const status = () => page.getByTestId('job-status').first().getAttribute('data-status');

describe('escrow in the browser, demo accounts', () => {
  it('the builder sets up payouts on the payment service’s page and comes back to “Payouts are on”', async () => {
    await signInAs('builder@demo.lacewright.test');
    await page.goto(`${appUrl}/payouts`);
    // Another browser suite may have set this shop up already; then the builder reviews the details instead.
    const before = await page.getByTestId('payout-status').getAttribute('data-state');
    if (before !== 'active') {
      await openJob(FIRST_JOB);
      await page.getByRole('link', { name: 'Set up payouts first' }).waitFor();
      await screenshot(page, 'payments-builder-needs-payouts');
      await page.getByRole('link', { name: 'Set up payouts first' }).click();
      await page.waitForURL('**/payouts');
    }
    await page.getByRole('button', { name: before === 'active' ? 'Review payout details' : 'Set up payouts' }).click();
    await page.waitForURL(`${fakeUrl}/onboarding/**`);
    await page.getByRole('button', { name: 'Complete onboarding' }).click();
    await page.waitForURL('**/payouts?from=onboarding');
    await page.getByText('Payouts are on').waitFor();
    await expect(page.getByTestId('payout-status').getAttribute('data-state')).resolves.toBe('active');
    await screenshot(page, 'payments-payouts-on');
  });

  it('the rider pays with the success card and sees the job funded once the webhook lands', async () => {
    await signInAs('rider@demo.lacewright.test');
    await openJob(FIRST_JOB);
    expect(await status()).toBe('awaiting_payment');
    await screenshot(page, 'payments-rider-before-paying');
    await payOnHostedPage('4242 4242 4242 4242');
    await page.getByText('Payment received').waitFor({ timeout: 20_000 });
    await screenshot(page, 'payments-return-received');
    await page.getByRole('link', { name: 'Open the job' }).click();
    await page.waitForURL(/\/jobs\/[0-9a-f-]{36}$/);
    await page.getByTestId('next-step').waitFor();
    expect(await status()).toBe('funded');
    await expect(page.getByTestId('held-in-escrow').innerText()).resolves.toBe('$485.00');
    await screenshot(page, 'payments-job-funded');
  });

  it('the service being down is said plainly; a declined card shows a clear error; the job stays awaiting payment until a good card pays', async () => {
    await openJob(SECOND_JOB);
    // The payment service drops the next calls: the rider is told, nothing changes.
    await fetch(`${fakeUrl}/_test/fail-next`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ count: 2, mode: 'disconnect' }) });
    await page.getByTestId('pay').click();
    await page.getByTestId('action-error').waitFor();
    await page.getByText('The payment service is not answering', { exact: true }).waitFor();
    expect(await status()).toBe('awaiting_payment');
    await screenshot(page, 'payments-service-down');

    await payOnHostedPage('4000 0000 0000 0002');
    await page.getByText('Your payment did not go through').waitFor();
    await page.getByTestId('payment-error').filter({ hasText: 'Your card was declined.' }).waitFor();
    await screenshot(page, 'payments-declined');
    await page.getByRole('link', { name: 'Back to the job' }).click();
    await page.waitForURL(/\/jobs\/[0-9a-f-]{36}$/);
    await page.getByTestId('next-step').waitFor();
    expect(await status()).toBe('awaiting_payment');
    await expect(page.getByTestId('payment-error').innerText()).resolves.toContain('Your card was declined.');
    await screenshot(page, 'payments-job-after-decline');

    await payOnHostedPage('4242424242424242');
    await page.getByText('Payment received').waitFor({ timeout: 20_000 });
  });

  it('the builder starts and ships; the rider opens a dispute; the admin splits the money and the ledger balances', async () => {
    await signInAs('builder@demo.lacewright.test');
    await openJob(SECOND_JOB);
    await page.getByRole('button', { name: 'Start the build' }).click();
    await page.getByRole('button', { name: 'Mark ready for pickup' }).waitFor();
    await page.getByRole('button', { name: 'Mark ready for pickup' }).click();
    await page.getByTestId('handover').waitFor();
    expect(await status()).toBe('shipped');

    await signInAs('rider@demo.lacewright.test');
    await openJob(SECOND_JOB);
    await page.getByRole('button', { name: 'Open a dispute' }).click();
    await page.getByLabel('What went wrong?').selectOption('not_as_described');
    await page.getByLabel('What happened').fill('The wheel has 36 spokes laced radial, not 3 cross as agreed in the bid.');
    await screenshot(page, 'payments-dispute-form');
    await page.getByRole('button', { name: 'Open the dispute' }).click();
    await page.getByTestId('dispute').waitFor();
    expect(await status()).toBe('disputed');
    await screenshot(page, 'payments-disputed');

    await signInAs('admin@demo.lacewright.test');
    await page.goto(`${appUrl}/admin/disputes`);
    await page.getByRole('link', { name: SECOND_JOB }).click();
    await page.waitForURL(/\/admin\/disputes\/[0-9a-f-]{36}$/);
    await page.getByLabel('Split it').check();
    await page.getByLabel('Refund to the rider (dollars)').fill('100');
    await page.getByLabel('Reason (both sides read it)').fill('The lacing differs from the bid; the rider keeps the wheel and gets $100 back for the difference.');
    await expect(page.getByTestId('decision-preview').innerText()).resolves.toContain('Rider gets $100.00 back');
    await screenshot(page, 'payments-admin-split-form');
    await page.getByRole('button', { name: 'Settle the dispute' }).click();
    await page.getByTestId('settled').waitFor();
    await expect(page.getByTestId('to-rider').innerText()).resolves.toBe('$100.00');
    // $270 − $100 = $170 for the builder, less the 10% fee = $153.
    await expect(page.getByTestId('to-builder').innerText()).resolves.toBe('$153.00');
    await screenshot(page, 'payments-admin-split-settled');

    await page.goto(`${appUrl}/admin/ledger`);
    await page.getByTestId('ledger-balanced').waitFor();
    await screenshot(page, 'payments-ledger');
    await page.goto(`${appUrl}/admin/audit`);
    await expect(page.getByTestId('audit-table').innerText()).resolves.toContain('Settled a dispute');
    await screenshot(page, 'payments-audit');

    const csv = await page.request.get(`${appUrl}/api/admin/ledger/export`);
    expect(csv.headers()['content-type']).toContain('text/csv');
    expect((await csv.text()).split('\r\n')[0]).toBe('booked_at_utc,job_id,transaction_id,kind,account,debit_cents,credit_cents,reference,memo');

    await signInAs('rider@demo.lacewright.test');
    await openJob(SECOND_JOB);
    await page.getByTestId('dispute-decision').waitFor();
    expect(await status()).toBe('resolved');
    await screenshot(page, 'payments-rider-after-split');
  });

  it('the webhook refuses a missing or wrong signature with 400', async () => {
    const body = JSON.stringify({ id: 'evt_browser_suite', type: 'payment_intent.succeeded', data: { object: {} } });
    const missing = await fetch(`${appUrl}/api/payments/webhook`, { method: 'POST', body });
    expect(missing.status).toBe(400);
    const wrong = await fetch(`${appUrl}/api/payments/webhook`, { method: 'POST', body, headers: { 'stripe-signature': `t=${Math.floor(Date.now() / 1000)},v1=00` } });
    expect(wrong.status).toBe(400);
  });
});
