// Accessibility: axe-core on the main pages, as each kind of visitor sees them. No serious or critical
// violation (WCAG 2.1 A and AA rules plus axe's best practices).
import fs from 'node:fs';
import { createRequire } from 'node:module';
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { openBrowser, screenshot } from '../support/browser';
import type { Visitor } from '../support/http';
import { appDb, signInAll, World, type Principal } from './authz-matrix.fixtures';

const appUrl = inject('appUrl');
const AXE_SOURCE = fs.readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');

let db: Knex;
let world: World;
let visitors: Record<Principal, Visitor>;
beforeAll(async () => {
  db = appDb();
  const signedIn = await signInAll(db);
  visitors = signedIn.visitors;
  world = new World(db, signedIn.users);
});
afterAll(async () => {
  await world?.cancelOpenRequests();
  await db?.destroy();
});

interface AxeResult {
  violations: { id: string; impact: string | null; help: string; nodes: { target: string[]; failureSummary?: string }[] }[];
}

describe('accessibility', () => {
  it('the main pages have no serious or critical violations', { timeout: 300_000 }, async () => {
    const request = await world.requestWithBid();
    const job = await world.fundedJob();
    const shop = await db('shops').where({ id: world.users.builderX.shopId }).first('slug');
    const pages: [Principal, string][] = [
      ['anonymous', '/'],
      ['anonymous', '/fit'],
      ['anonymous', '/join'],
      ['anonymous', '/sign-in'],
      ['anonymous', '/builders'],
      ['anonymous', `/shops/${shop.slug}`],
      ['riderA', '/requests'],
      ['riderA', '/requests/new'],
      ['riderA', `/requests/${request.requestId}`],
      ['riderA', `/jobs/${job.jobId}`],
      ['builderX', '/board'],
      ['builderX', `/board/${request.requestId}`],
      ['builderX', '/bids'],
      ['builderX', '/shop/settings'],
      ['builderX', `/jobs/${job.jobId}`],
      ['admin', '/admin'],
    ];
    const problems: string[] = [];
    const browser = await openBrowser();
    try {
      const { page, context } = browser;
      for (const [principal, path] of pages) {
        await context.clearCookies();
        if (principal !== 'anonymous') await context.addCookies([{ name: 'lacewright.session', value: visitors[principal].rawCookie('lacewright.session')!, url: appUrl }]);
        await page.goto(`${appUrl}${path}`);
        await page.waitForLoadState('networkidle');
        if (path === '/builders') await page.locator('.leaflet-tile-loaded').first().waitFor();
        // Evaluated through the browser's debugging channel, so the page's own policy does not apply to axe.
        await page.evaluate(AXE_SOURCE);
        const result = (await page.evaluate(() =>
          (window as unknown as { axe: { run: (ctx: Document, opts: unknown) => Promise<unknown> } }).axe.run(document, {
            runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'best-practice'] },
            resultTypes: ['violations'],
          }),
        )) as AxeResult;
        const bad = result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
        if (bad.length) await screenshot(page, `a11y-${principal}-${path.replace(/[^a-z0-9]+/gi, '-')}`);
        for (const v of bad) {
          problems.push(`${path} (${principal}): ${v.impact} ${v.id}: ${v.help} at ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(' | ')}`);
        }
      }
    } finally {
      await browser.close();
    }
    expect(problems).toEqual([]);
  });
});
