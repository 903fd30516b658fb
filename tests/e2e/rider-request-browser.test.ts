import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { openBrowser, screenshot } from '../support/browser';
import { Visitor } from '../support/http';

const appUrl = inject('appUrl');
let browser: Awaited<ReturnType<typeof openBrowser>>;
let page: Page;

beforeAll(async () => {
  browser = await openBrowser();
  page = browser.page;
});
afterAll(() => browser?.close());

async function signIn(email: string) {
  await page.context().clearCookies();
  await page.goto(`${appUrl}/sign-in`);
  await page.getByLabel('E-mail', { exact: true }).fill(email);
  await page.getByLabel('Password', { exact: true }).fill('lacewright-demo');
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

const inDays = (n: number) => new Date(Date.now() + n * 86_400_000).toISOString().slice(0, 10);

describe('a rider posts a request, a builder bids, the rider compares and accepts', () => {
  let requestUrl = '';

  it('posts a 4-inch rear wheel request through the steps, seeing the fit update beside the form', async () => {
    await signIn('rider2@demo.lacewright.test');
    await page.goto(`${appUrl}/requests/new`);
    await page.getByTestId('live-fit').getByTestId('verdict').waitFor();
    const wheel = page.getByTestId('wheel-rear');
    await wheel.getByLabel('Rim width (mm)').fill('100');
    await wheel.getByLabel('Tire width (mm)').fill('100');
    await wheel.getByLabel('Spoke count').fill('144');
    await wheel.getByLabel('Hub and brake').selectOption('rear-igh3-coaster-120');
    await page.locator('[data-testid="live-fit"] [data-verdict]').first().waitFor();
    await screenshot(page, 'request-step-wheels');
    await page.getByRole('button', { name: 'Next' }).click();
    await page.getByLabel('Bottom-bracket shell width (mm)').fill('100');
    await page.getByRole('button', { name: 'Next' }).click();
    await page.getByLabel('Title').fill('Browser test: 144-spoke 4-inch rear');
    await page.getByLabel('Your ZIP code').fill('87501');
    await page.getByLabel('Needed by').fill(inDays(60));
    await page.getByLabel('Budget (US dollars)').fill('900');
    await screenshot(page, 'request-step-where');
    await page.getByRole('button', { name: 'Next' }).click();
    await page.getByRole('button', { name: 'Publish to builders' }).click();
    await page.waitForURL(/\/requests\/[0-9a-f-]{36}$/);
    requestUrl = page.url();
    await expect(page.getByTestId('status').first().getAttribute('data-status')).resolves.toBe('open');
    await page.getByTestId('no-bids').waitFor();
    await screenshot(page, 'request-published');
  });

  it('keeps what was typed and shows messages when a step has a problem', async () => {
    await page.goto(`${appUrl}/requests/new`);
    await page.getByRole('button', { name: 'Next' }).click();
    await page.getByRole('button', { name: 'Next' }).click();
    await page.getByLabel('Title').fill('x');
    await page.getByLabel('Your ZIP code').fill('1234');
    await page.getByRole('button', { name: 'Next' }).click();
    await expect(page.getByText('Enter a 5-digit US ZIP code.').isVisible()).resolves.toBe(true);
    expect(await page.getByLabel('Your ZIP code').inputValue()).toBe('1234');
    await screenshot(page, 'request-step-errors');
  });

  it('shows a builder bid in the comparison, and accepting it declines the rest', async () => {
    const requestId = requestUrl.split('/').pop()!;
    for (const [email, parts] of [
      ['builder@demo.lacewright.test', 42000],
      ['builder3@demo.lacewright.test', 51000],
    ] as const) {
      const builder = new Visitor();
      await builder.signInWithPassword(email, 'lacewright-demo');
      const bid = await builder.request(`/api/requests/${requestId}/bids`, {
        method: 'POST',
        json: { partsCents: parts, labourCents: 18000, finishCents: 4000, shippingCents: 6500, leadTimeDays: 21, validUntil: inDays(20), message: 'Flanges drilled for 144 holes; offset cog included.' },
      });
      expect(bid.status).toBe(201);
    }
    await page.goto(requestUrl);
    await page.getByTestId('bid-comparison').waitFor();
    expect(await page.getByTestId('bid-row').count()).toBe(2);
    await screenshot(page, 'request-compare-bids');
    page.once('dialog', (d) => d.accept());
    await page.getByTestId('bid-row').first().getByRole('button', { name: 'Accept' }).click();
    await page.waitForURL(/\/jobs\/[0-9a-f-]{36}$/);
    await screenshot(page, 'job-after-accept');
    await page.goto(requestUrl);
    await page.getByTestId('job-link').waitFor();
    await page.getByTestId('bid-row').first().waitFor();
    await expect(page.getByTestId('status').first().getAttribute('data-status')).resolves.toBe('awarded');
    const statuses = await page.getByTestId('bid-row').locator('[data-status]').evaluateAll((els) => els.map((e) => e.getAttribute('data-status')));
    expect(statuses).toEqual(['accepted']);
    await screenshot(page, 'request-accepted');
  });
});
