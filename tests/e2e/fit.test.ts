import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { openBrowser, screenshot } from '../support/browser';

const appUrl = inject('appUrl');

async function postFit(body: unknown) {
  const res = await fetch(`${appUrl}/api/fit`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
  return { status: res.status, body: await res.json() };
}

describe('POST /api/fit', () => {
  it('answers a 3-inch rear wheel on the 120 mm 3-speed hub with a verdict, spoke lengths and a cost', async () => {
    const { status, body } = await postFit({ position: 'rear', nominalDiameterIn: 26, rimWidthMm: 80, tireWidthMm: 76, spokes: 36, spokeGauge: 12, crosses: 3 });
    expect(status).toBe(200);
    expect(body.verdict).toBe('fits'); // common practice, no source: 3-inch wheels run on the 120 mm 3-speed hub with the flat cog
    expect(body.spokes.leftMm).toBeGreaterThan(200);
    expect(Number.isInteger(body.cost.typicalCents)).toBe(true);
  });

  it('answers bad input with 400 and a message per field', async () => {
    const { status, body } = await postFit({ nominalDiameterIn: 23, rimWidthMm: 'wide', spokes: -4 });
    expect(status).toBe(400);
    expect(Object.keys(body.fieldErrors)).toEqual(expect.arrayContaining(['nominalDiameterIn', 'rimWidthMm', 'spokes']));
  });

  it('answers a body that is not JSON with 400', async () => {
    const res = await fetch(`${appUrl}/api/fit`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: '{not json' });
    expect(res.status).toBe(400);
  });
});

describe('the fit check page', () => {
  let browser: Awaited<ReturnType<typeof import('../support/browser').openBrowser>>;
  let page: Page;
  beforeAll(async () => {
    browser = await openBrowser();
    page = browser.page;
  });
  afterAll(() => browser?.close());

  it('shows a verdict, cautions and both diagrams, and updates when the rim gets wider', async () => {
    await page.goto(`${appUrl}/fit`);
    await page.getByTestId('verdict').waitFor();
    expect(await page.getByTestId('verdict').getAttribute('data-verdict')).toBe('fits');
    await page.getByTestId('lacing-diagram').waitFor();
    await page.getByTestId('topview-diagram').waitFor();
    await screenshot(page, 'fit-3in-standard-cog');

    await page.getByLabel('Rim width (mm)').fill('100');
    await page.getByLabel('Tire width (mm)').fill('100');
    await page.getByLabel('Bottom-bracket shell').selectOption({ label: '100 mm wide shell' });
    await page.locator('[data-verdict]:not([data-verdict="fits"])').waitFor();
    const verdict = await page.getByTestId('verdict').getAttribute('data-verdict');
    expect(verdict).not.toBe('fits'); // common practice, no source: a 4-inch wheel on the 120 mm 3-speed needs the offset cog
    await screenshot(page, 'fit-4in-standard-cog');

    await page.getByLabel('Cog', { exact: true }).selectOption('offset');
    await page.locator('[data-verdict="fits"]').waitFor(); // common practice, no source: the offset cog makes room for the 4-inch tire
    await page.getByTestId('cautions').waitFor();
    await expect(page.getByTestId('cautions').innerText()).resolves.toMatch(/offset cog/i);
    await screenshot(page, 'fit-4in-offset-cog');
  });

  it('switches lengths to inches', async () => {
    await page.goto(`${appUrl}/fit`);
    await page.getByTestId('spoke-lengths').waitFor();
    await page.getByRole('button', { name: 'Inches' }).click();
    await expect(page.getByTestId('spoke-lengths').innerText()).resolves.toMatch(/ in/);
    expect(await page.getByLabel('Rim width (in)').inputValue()).toBe('3.15');
  });
});
