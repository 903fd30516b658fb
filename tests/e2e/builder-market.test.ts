// The builder's side of the marketplace in a browser: the board, a request, bidding, My bids, messages
// and shop settings, against the production build with demo data.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { openBrowser, screenshot } from '../support/browser';
import { Visitor } from '../support/http';

const appUrl = inject('appUrl');
const PASSWORD = 'lacewright-demo';
const BUILDER = 'builder@demo.lacewright.test';
const RIDER = 'rider@demo.lacewright.test';

let browser: Awaited<ReturnType<typeof openBrowser>>;
let page: Page;

beforeAll(async () => {
  browser = await openBrowser();
  page = browser.page;
});
afterAll(() => browser?.close());

const inDays = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

/** A published request from the demo rider that the demo builder's shop can build (26 inch, 3 inch rim, 72 × 12 g). */
async function publishRequest(title: string): Promise<string> {
  const rider = new Visitor();
  expect((await rider.signInWithPassword(RIDER, PASSWORD)).status).toBeLessThan(400);
  const res = await rider.request('/api/requests', {
    method: 'POST',
    json: {
      title,
      wheels: [
        {
          position: 'rear',
          nominalDiameterIn: 26,
          rimWidthMm: 80,
          tireWidthMm: 76,
          spokes: 72,
          spokeGauge: 12,
          lacing: { kind: 'cross', crosses: 3 },
          hubId: 'rear-igh3-coaster-120',
          finish: 'polished',
        },
      ],
      frame: { rearSpacingMm: 120, frontSpacingMm: 100, bbShellWidthMm: 69.85, bbShellType: 'one-piece' },
      zip: '85004',
      delivery: 'ship',
      neededBy: inDays(45),
      budgetCents: 52_000,
      notes: 'Lowrider cruiser, polished rear to match the front.',
      publish: true,
    },
  });
  const body = (await res.json()) as { id?: string; request?: { id: string } };
  expect(res.status, JSON.stringify(body)).toBeLessThan(300);
  const id = body.id ?? body.request?.id;
  expect(id).toBeTruthy();
  return id!;
}

async function builderVisitor(): Promise<Visitor> {
  const builder = new Visitor();
  expect((await builder.signInWithPassword(BUILDER, PASSWORD)).status).toBeLessThan(400);
  return builder;
}

async function signInAsBuilder(): Promise<void> {
  await page.context().clearCookies();
  await page.goto(`${appUrl}/sign-in`);
  await page.getByLabel('E-mail', { exact: true }).fill(BUILDER);
  await page.getByLabel('Password', { exact: true }).fill(PASSWORD);
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await page.waitForURL('**/board');
}

async function fillMoney(label: string, dollars: string): Promise<void> {
  await page.getByLabel(label, { exact: true }).fill(dollars);
}

describe('the builder side of the marketplace, in a browser', () => {
  it('shows the board with open requests, filters it and sorts it', async () => {
    const title = `Board check rear ${Date.now()}`;
    await publishRequest(title);
    await signInAsBuilder();
    await page.getByRole('link', { name: title }).waitFor();
    const rows = page.getByTestId('board-row');
    await rows.first().waitFor();
    expect(await rows.count()).toBeGreaterThan(0);
    await expect(page.getByLabel('My capabilities only').isChecked()).resolves.toBe(true);
    await screenshot(page, 'builder-board');

    // The shop does not build 29 inch wheels, so with its capability filter on nothing is left.
    await page.getByLabel('Wheel size').selectOption('29');
    await page.getByTestId('board-empty').waitFor();
    await screenshot(page, 'builder-board-empty');

    // 26 inch requests: every row lists a 26 inch wheel.
    await page.getByLabel('Wheel size').selectOption('26');
    await rows.first().waitFor();
    await page.waitForFunction(() => !document.querySelector('[data-testid="board-table"][aria-busy="true"]'));
    for (const text of await rows.allInnerTexts()) expect(text).toContain('26″');
    const withCapabilities = await rows.count();

    // Turning the capability filter off never shows fewer.
    await page.getByLabel('My capabilities only').uncheck();
    await page.waitForTimeout(500);
    await page.waitForFunction(() => !document.querySelector('[data-testid="board-table"][aria-busy="true"]'));
    expect(await rows.count()).toBeGreaterThanOrEqual(withCapabilities);

    // Sort by budget, highest first, then lowest first.
    const budgetHeader = page.getByRole('columnheader', { name: /Budget/ });
    await budgetHeader.getByRole('button').click();
    await expect.poll(() => budgetHeader.getAttribute('aria-sort')).toBe('descending');
    await budgetHeader.getByRole('button').click();
    await expect.poll(() => budgetHeader.getAttribute('aria-sort')).toBe('ascending');
    await page.waitForFunction(() => !document.querySelector('[data-testid="board-table"][aria-busy="true"]'));
    await screenshot(page, 'builder-board-filtered');
  });

  it('shows the demo pair the shop has already bid on, with its bid, Revise and Withdraw', async () => {
    await signInAsBuilder();
    // A demo request from the seed; the demo builder's shop has a live bid on it.
    const demo = page.getByTestId('board-row').filter({ hasText: '26-inch pair, 3-inch rims, 72 spokes' });
    await demo.waitFor();
    await expect(demo.innerText()).resolves.toContain('Yours: Live');
    await demo.getByRole('link').click();
    await page.waitForURL('**/board/*');
    await page.getByTestId('my-bid').waitFor();
    await expect(page.getByRole('button', { name: 'Revise bid' }).isVisible()).resolves.toBe(true);
    await expect(page.getByRole('button', { name: 'Withdraw bid' }).isVisible()).resolves.toBe(true);
    await expect(page.getByTestId('fit-front').isVisible()).resolves.toBe(true);
    await expect(page.getByTestId('fit-rear').isVisible()).resolves.toBe(true);
    await expect(page.getByTestId('distance').innerText()).resolves.toMatch(/mi from your shop/);
    await screenshot(page, 'builder-demo-request');
  });

  it('opens a request, bids with a live total and the ready date, and finds the bid under My bids', async () => {
    const title = `Polished 72-spoke rear ${Date.now()}`;
    const requestId = await publishRequest(title);
    await signInAsBuilder();
    await page.getByRole('link', { name: title }).click();
    await page.waitForURL(`**/board/${requestId}`);
    await expect(page.getByRole('heading', { level: 1 }).innerText()).resolves.toBe(title);
    await expect(page.getByTestId('budget').innerText()).resolves.toContain('$520');
    await expect(page.getByTestId('distance').innerText()).resolves.toMatch(/mi from your shop/);
    await expect(page.getByText('Before you price it').isVisible()).resolves.toBe(true);

    await fillMoney('Parts ($)', '310');
    await fillMoney('Labour ($)', '120.50');
    await fillMoney('Finish ($)', '40');
    await fillMoney('Shipping ($)', '35');
    await expect(page.getByTestId('bid-total').innerText()).resolves.toBe('$505.50');
    await page.getByLabel('Lead time (days)').fill('21');
    await expect(page.getByTestId('ready-date').innerText()).resolves.toContain('before the needed-by date');
    await page.getByLabel('Message to the rider').fill('Polished 80 mm rim, 12 g spokes, three cross. Shipped boxed with the rim strip fitted.');
    await screenshot(page, 'builder-bid-form');
    await page.getByRole('button', { name: 'Send bid' }).click();
    await page.getByTestId('my-bid').waitFor();
    await expect(page.getByTestId('my-bid-total').innerText()).resolves.toBe('$505.50');
    await expect(page.getByRole('button', { name: 'Revise bid' }).isVisible()).resolves.toBe(true);
    await screenshot(page, 'builder-bid-sent');

    await page.getByRole('link', { name: 'My bids', exact: true }).first().click();
    await page.waitForURL('**/bids');
    const row = page.getByTestId('my-bid-row').filter({ hasText: title });
    await row.waitFor();
    await expect(row.innerText()).resolves.toContain('$505.50');
    await expect(row.innerText()).resolves.toContain('Live');
    await screenshot(page, 'builder-my-bids');
  });

  it('keeps what was typed when the bid has mistakes', async () => {
    const title = `Rear wheel with a typo ${Date.now()}`;
    const requestId = await publishRequest(title);
    await signInAsBuilder();
    await page.goto(`${appUrl}/board/${requestId}`);
    await fillMoney('Parts ($)', '280');
    await fillMoney('Labour ($)', 'ninety');
    await page.getByLabel('Lead time (days)').fill('0');
    await page.getByLabel('Message to the rider').fill('Keep this text.');
    await page.getByRole('button', { name: 'Send bid' }).click();
    await expect(page.getByText('Enter an amount in dollars, such as 120 or 120.50.').first().isVisible()).resolves.toBe(true);
    await expect(page.getByText('Lead time (days) must be at least 1.').isVisible()).resolves.toBe(true);
    expect(await page.getByLabel('Labour ($)', { exact: true }).inputValue()).toBe('ninety');
    expect(await page.getByLabel('Message to the rider').inputValue()).toBe('Keep this text.');
    await screenshot(page, 'builder-bid-errors');
  });

  it('revises and then withdraws a bid', async () => {
    const title = `Rear wheel to revise ${Date.now()}`;
    const requestId = await publishRequest(title);
    const builder = await builderVisitor();
    const placed = await builder.request(`/api/requests/${requestId}/bids`, {
      method: 'POST',
      json: { partsCents: 30_000, labourCents: 12_000, finishCents: 0, shippingCents: 3_000, leadTimeDays: 20, validUntil: inDays(14), message: 'First price.' },
    });
    expect(placed.status, await placed.clone().text()).toBeLessThan(300);

    await signInAsBuilder();
    await page.goto(`${appUrl}/board/${requestId}`);
    await expect(page.getByTestId('my-bid-total').innerText()).resolves.toBe('$450.00');
    await page.getByRole('button', { name: 'Revise bid' }).click();
    expect(await page.getByLabel('Parts ($)', { exact: true }).inputValue()).toBe('300');
    await fillMoney('Labour ($)', '100');
    await page.getByLabel('Lead time (days)').fill('14');
    await expect(page.getByTestId('bid-total').innerText()).resolves.toBe('$430.00');
    // Propose lighter spokes; the engine re-checks the changed wheel when the bid is saved.
    await page.getByLabel('Propose a change').check();
    await page.getByLabel('What you propose and why').fill('13 gauge spokes go through the stock flange holes without drilling.');
    await page.getByLabel('Spoke gauge').fill('13');
    await screenshot(page, 'builder-bid-revise');
    await page.getByRole('button', { name: 'Save revised bid' }).click();
    await page.getByText('Your revised bid is saved.').waitFor();
    await expect(page.getByTestId('my-bid-total').innerText()).resolves.toBe('$430.00');
    await expect(page.getByText('Revised once').isVisible()).resolves.toBe(true);
    await expect(page.getByTestId('my-bid').innerText()).resolves.toContain('Rear: 13 gauge');

    await page.getByRole('button', { name: 'Withdraw bid' }).click();
    await page.getByRole('button', { name: 'Yes, withdraw it' }).click();
    await page.getByText('Your bid is withdrawn.').waitFor();
    // Withdrawn, the shop may bid again while the request is open.
    await expect(page.getByRole('button', { name: 'Send bid' }).isVisible()).resolves.toBe(true);
    await screenshot(page, 'builder-bid-withdrawn');
  });

  it('writes to the rider in the request thread, and flags the rider’s reply as new', async () => {
    const title = `Rear wheel with questions ${Date.now()}`;
    const requestId = await publishRequest(title);
    await signInAsBuilder();
    await page.goto(`${appUrl}/board/${requestId}`);
    await page.getByTestId('thread-empty').waitFor();
    await page.getByLabel('Your message').fill('Is the frame spacing measured at the dropouts, 120 mm?');
    await page.getByRole('button', { name: 'Send message' }).click();
    await page.getByTestId('message').filter({ hasText: 'measured at the dropouts' }).waitFor();
    await expect.poll(() => page.getByLabel('Your message').inputValue()).toBe('');

    // The rider answers; the builder's open page picks it up on its next poll.
    const me = await builderVisitor();
    const shopId = (await me.me()).body.shopId!;
    const rider = new Visitor();
    await rider.signInWithPassword(RIDER, PASSWORD);
    const reply = await rider.request(`/api/requests/${requestId}/threads/${shopId}/messages`, { method: 'POST', json: { body: 'Yes, 120 mm at the dropouts.' } });
    expect(reply.status, await reply.clone().text()).toBeLessThan(300);
    const answer = page.getByTestId('message').filter({ hasText: 'Yes, 120 mm at the dropouts.' });
    await answer.waitFor({ timeout: 20_000 });
    await expect(answer.getAttribute('data-new')).resolves.toBe('true');
    await expect(page.getByText('1 new message').isVisible()).resolves.toBe(true);
    await screenshot(page, 'builder-messages');
  });

  it('saves the shop settings and keeps them', async () => {
    await signInAsBuilder();
    await page.getByRole('link', { name: 'Shop settings' }).first().click();
    await page.waitForURL('**/shop/settings');
    await page.getByLabel('Builds at once').fill('5');
    await page.getByLabel('Labour rate ($ per hour)').fill('68');
    await page.getByRole('button', { name: 'Save settings' }).click();
    await page.getByText(/^Saved\./).waitFor();
    await screenshot(page, 'builder-shop-settings');
    await page.reload();
    // The form fills in once it hydrates.
    await expect.poll(() => page.getByLabel('Builds at once').inputValue(), { timeout: 10_000 }).toBe('5');
    expect(await page.getByLabel('Labour rate ($ per hour)').inputValue()).toBe('68');

    await page.getByLabel('Shop ZIP code').fill('00000');
    await page.getByRole('button', { name: 'Save settings' }).click();
    // The code has the right shape, so the server looks it up and answers under the field.
    await page.getByText('We could not find that ZIP code.').waitFor();
    await screenshot(page, 'builder-shop-settings-error');
    expect(await page.getByLabel('Shop ZIP code').inputValue()).toBe('00000');
  });
});
