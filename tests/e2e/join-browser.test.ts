import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { openBrowser, screenshot } from '../support/browser';
import { inject } from 'vitest';

const appUrl = inject('appUrl');
let browser: Awaited<ReturnType<typeof openBrowser>>;
let page: Page;

beforeAll(async () => {
  browser = await openBrowser();
  page = browser.page;
});
afterAll(() => browser?.close());

async function navLabels(): Promise<string[]> {
  return page.locator('[data-testid="main-nav"] a').allInnerTexts();
}

describe('joining and signing in, in a browser', () => {
  it('shows the visitor navigation on the home page', async () => {
    await page.goto(appUrl);
    await expect(page.getByRole('heading', { level: 1 }).innerText()).resolves.toContain('Built by someone');
    expect(await navLabels()).toEqual(['Fit check', 'Find a builder']);
    await screenshot(page, 'home-visitor');
  });

  it('signs up as a builder with a shop and lands on the builder board with builder navigation', async () => {
    await page.goto(`${appUrl}/join`);
    await page.getByLabel('A wheel builder').check();
    await page.getByLabel('Your name').fill('Browser Builder');
    await page.getByLabel('E-mail').fill(`browser-builder-${Date.now()}@example.test`);
    await page.getByLabel('Password').fill('a good long password');
    await page.getByLabel('Shop name').fill('Browser Spoke Room');
    await page.getByLabel('Shop ZIP code').fill('53202');
    await screenshot(page, 'join-builder-filled');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.waitForURL('**/board');
    await page.getByText(/Browser Spoke Room in Milwaukee, WI/).waitFor(); // the board streams in after the URL changes
    expect(await navLabels()).toEqual(['Open requests', 'My bids', 'Jobs', 'Payouts', 'Shop settings', 'Fit check']);
    await screenshot(page, 'board-after-join');
  });

  it('shows field messages for bad input without losing what was typed', async () => {
    await page.context().clearCookies();
    await page.goto(`${appUrl}/join`);
    await page.getByLabel('Your name').fill('Keeps Typing');
    await page.getByLabel('E-mail').fill('not an email');
    await page.getByRole('button', { name: 'Create account' }).click();
    await expect(page.getByText('Enter a valid e-mail address.').isVisible()).resolves.toBe(true);
    await expect(page.getByText('Use at least 10 characters.').isVisible()).resolves.toBe(true);
    expect(await page.getByLabel('Your name').inputValue()).toBe('Keeps Typing');
    await screenshot(page, 'join-errors');
  });

  it('signs out, signs in as the demo rider with a password, and sees rider navigation', async () => {
    await page.context().clearCookies();
    await page.goto(`${appUrl}/sign-in`);
    await page.getByLabel('E-mail', { exact: true }).fill('rider@demo.lacewright.test');
    await page.getByLabel('Password', { exact: true }).fill('lacewright-demo');
    await page.getByRole('button', { name: 'Sign in', exact: true }).click();
    await page.waitForURL('**/requests');
    expect(await navLabels()).toEqual(['My wheel requests', 'Ask for a build', 'My builds', 'Fit check', 'Find a builder']);
    await expect(page.getByTestId('signed-in-as').innerText()).resolves.toContain('Rider');
    await screenshot(page, 'rider-home');
  });
});
