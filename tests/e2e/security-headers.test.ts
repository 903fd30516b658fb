// Security headers on pages and API answers, and a content security policy the pages really pass: every
// main page, for each kind of visitor, loads in chromium with no policy violation.
import type { Knex } from 'knex';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { openBrowser } from '../support/browser';
import { Visitor } from '../support/http';
import { appDb, signInAll, World, type Principal } from './authz-matrix.fixtures';

const appUrl = inject('appUrl');
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

function directives(policy: string): Record<string, string[]> {
  return Object.fromEntries(
    policy
      .split(';')
      .map((d) => d.trim().split(/\s+/))
      .filter((parts) => parts[0])
      .map(([name, ...values]) => [name, values]),
  );
}

describe('security headers', () => {
  it('pages carry a strict policy with a fresh script nonce that every script tag uses', async () => {
    const first = await fetch(`${appUrl}/`);
    const html = await first.text();
    const policy = first.headers.get('content-security-policy')!;
    expect(policy).toBeTruthy();
    const d = directives(policy);
    expect(d['default-src']).toEqual(["'self'"]);
    expect(d['frame-ancestors']).toEqual(["'none'"]);
    expect(d['object-src']).toEqual(["'none'"]);
    expect(d['form-action']).toEqual(["'self'"]);
    expect(d['img-src']).toEqual(expect.arrayContaining(["'self'", 'data:', 'blob:']));
    expect(d['script-src']).not.toContain("'unsafe-inline'");
    expect(d['script-src']).not.toContain("'unsafe-eval'");
    const nonce = d['script-src'].find((v) => v.startsWith("'nonce-"))!.slice(7, -1);
    expect(nonce.length).toBeGreaterThanOrEqual(16);
    const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
    expect(scripts.length).toBeGreaterThan(0);
    for (const tag of scripts) expect(tag).toContain(`nonce="${nonce}"`);

    const second = await fetch(`${appUrl}/`);
    await second.text();
    expect(second.headers.get('content-security-policy')).not.toBe(policy);

    for (const res of [first, second]) {
      expect(res.headers.get('x-content-type-options')).toBe('nosniff');
      expect(res.headers.get('referrer-policy')).toBe('strict-origin-when-cross-origin');
      expect(res.headers.get('x-frame-options')).toBe('DENY');
      expect(res.headers.get('permissions-policy')).toMatch(/camera=\(\)/);
      expect(res.headers.get('x-powered-by')).toBeNull();
    }
  });

  it('API answers run nothing and cannot be framed', async () => {
    for (const path of ['/api/health', '/api/me', '/api/auth/session']) {
      const res = await fetch(`${appUrl}${path}`);
      await res.arrayBuffer();
      expect(res.headers.get('content-security-policy'), path).toContain("default-src 'none'");
      expect(res.headers.get('content-security-policy'), path).toContain("frame-ancestors 'none'");
      expect(res.headers.get('x-content-type-options'), path).toBe('nosniff');
    }
  });

  it('the session cookie is httpOnly, SameSite=Lax and scoped to the whole site (Secure only over https)', async () => {
    const visitor = new Visitor();
    const csrfToken = await visitor.csrfToken();
    const res = await visitor.request('/api/auth/callback/password', { method: 'POST', form: { csrfToken, email: 'rider2@demo.lacewright.test', password: 'lacewright-demo', json: 'true' } });
    const cookie = res.headers.getSetCookie().find((c) => c.startsWith('lacewright.session='))!;
    expect(cookie).toMatch(/;\s*HttpOnly/i);
    expect(cookie).toMatch(/;\s*SameSite=Lax/i);
    expect(cookie).toMatch(/;\s*Path=\//i);
    expect(appUrl.startsWith('http://')).toBe(true);
    expect(cookie).not.toMatch(/;\s*Secure/i);
    // The CSRF cookie next-auth keeps is httpOnly too.
    const csrf = (await fetch(`${appUrl}/api/auth/csrf`)).headers.getSetCookie().find((c) => c.includes('csrf-token'));
    expect(csrf).toMatch(/HttpOnly/i);
  });
});

// ------------------------------------------------------------------ the policy in a real browser

interface Violation {
  page: string;
  what: string;
}

async function watchViolations(page: Page, found: Violation[]): Promise<void> {
  await page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      console.error(`csp-violation: ${e.violatedDirective} blocked ${e.blockedURI || 'inline'} (${e.sourceFile}:${e.lineNumber})`);
    });
  });
  page.on('console', (msg) => {
    const text = msg.text();
    if (text.startsWith('csp-violation:') || /Content Security Policy/i.test(text)) found.push({ page: page.url(), what: text });
  });
}

describe('the content security policy in chromium', () => {
  it('every main page, for visitors, riders, builders and admins, loads and works with no violation', { timeout: 300_000 }, async () => {
    const request = await world.requestWithBid();
    const job = await world.fundedJob();
    const shop = await db('shops').where({ id: world.users.builderX.shopId }).first('slug');
    const pages: Record<Principal, string[]> = {
      anonymous: ['/', '/fit', '/join', '/sign-in', '/builders', `/shops/${shop.slug}`, '/not-allowed', '/no-such-page'],
      riderA: ['/requests', '/requests/new', `/requests/${request.requestId}`, `/requests/${request.requestId}/edit`, '/jobs', `/jobs/${job.jobId}`],
      riderB: [],
      builderX: ['/board', `/board/${request.requestId}`, '/bids', '/shop/settings', '/payouts', `/jobs/${job.jobId}`],
      builderY: [],
      admin: ['/admin', '/admin/mailbox'],
    };
    const found: Violation[] = [];
    const browser = await openBrowser();
    try {
      const { page, context } = browser;
      await watchViolations(page, found);
      for (const [principal, paths] of Object.entries(pages) as [Principal, string[]][]) {
        await context.clearCookies();
        if (principal !== 'anonymous') {
          await context.addCookies([{ name: 'lacewright.session', value: visitors[principal].rawCookie('lacewright.session')!, url: appUrl }]);
        }
        for (const path of paths) {
          await page.goto(`${appUrl}${path}`);
          await page.waitForLoadState('networkidle');
          if (path === '/fit') {
            // The live fit check calls the API from the page: scripts and fetches both have to pass.
            await page.getByLabel(/Rim width/).first().fill('100');
            await page.waitForLoadState('networkidle');
          }
          if (path === '/builders') await page.locator('.leaflet-tile-loaded').first().waitFor();
          // The page's own scripts ran (hydration), so the nonce reached them.
          expect(await page.evaluate(() => Boolean((window as unknown as { next?: unknown }).next)), `${path} hydrated`).toBe(true);
        }
      }
    } finally {
      await browser.close();
    }
    expect(found).toEqual([]);
  });

  it('markup slipped into a page cannot run: an inline script and an event handler without the nonce are refused', async () => {
    const found: Violation[] = [];
    const browser = await openBrowser();
    try {
      const { page } = browser;
      await watchViolations(page, found);
      // As if stored markup got past escaping: the page as served, with the CSP header, plus injected tags.
      await page.route(`${appUrl}/`, async (route) => {
        const res = await route.fetch();
        const html = (await res.text()).replace('</main>', '<script>window.__injected = 1</script><img src="/x.png" onerror="window.__injected = 2"></main>');
        await route.fulfill({ response: res, body: html });
      });
      await page.goto(`${appUrl}/`);
      await page.waitForLoadState('networkidle');
      expect(await page.evaluate(() => (window as unknown as { __injected?: number }).__injected)).toBeUndefined();
    } finally {
      await browser.close();
    }
    expect(found.filter((v) => /script-src/.test(v.what)).length).toBeGreaterThanOrEqual(2);
  });
});
