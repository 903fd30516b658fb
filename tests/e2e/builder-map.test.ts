import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { openBrowser, screenshot } from '../support/browser';

const appUrl = inject('appUrl');
let browser: Awaited<ReturnType<typeof openBrowser>>;
let page: Page;
const requested: string[] = [];

beforeAll(async () => {
  browser = await openBrowser();
  page = browser.page;
  page.on('request', (r) => requested.push(r.url()));
});
afterAll(() => browser?.close());

describe('the builder map', () => {
  it('draws tiles served by the app and a marker per shop, and never asks another host for anything', async () => {
    await page.goto(`${appUrl}/builders`);
    await page.locator('.leaflet-tile-loaded').first().waitFor();
    await page.waitForLoadState('networkidle');
    const tiles = requested.filter((u) => u.includes('/api/tiles/'));
    expect(tiles.length).toBeGreaterThan(3);
    const shops = Number((await page.getByTestId('shop-count').innerText()).match(/\d+/)![0]);
    expect(shops).toBeGreaterThanOrEqual(8); // the demo shops
    await screenshot(page, 'builders-map');
    const outside = requested.filter((u) => !u.startsWith('data:') && new URL(u).hostname !== '127.0.0.1');
    expect(outside).toEqual([]);
  });

  it('opens a shop card from a marker', async () => {
    await page.goto(`${appUrl}/builders?width=5`);
    await page.locator('.leaflet-tile-loaded').first().waitFor();
    const marker = page.locator('.leaflet-marker-icon').first();
    await marker.click();
    const clusterOpened = await page.getByTestId('shop-card').isVisible().catch(() => false);
    if (!clusterOpened) {
      // A cluster zooms in on click; click a single marker after that.
      await page.waitForTimeout(600);
      await page.locator('.leaflet-marker-icon').first().click();
    }
    await page.getByTestId('shop-card').waitFor();
    await expect(page.getByTestId('shop-card').innerText()).resolves.toContain('See the shop');
    await screenshot(page, 'builders-map-card');
  });

  it('filters by capability and says so when nothing matches', async () => {
    await page.goto(`${appUrl}/builders?width=5&gauge=8&diameter=29`);
    await expect(page.getByTestId('shop-count').innerText()).resolves.toContain('No shop matches');
  });
});
