// Rate limits at the doors, counted in Postgres: sign-in failures (per account and per address), e-mailed
// links, sign-ups and the public fit check answer 429 with a plain message and Retry-After once used up,
// and a count written by one app server stops a request at another.
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { createAccount } from '@/lib/auth/accounts';
import { RATE_LIMITS } from '@/lib/security/limits';
import { counterKey, type RateLimitRule } from '@/lib/security/rateLimit';
import { openBrowser } from '../support/browser';
import { caughtMail, Visitor } from '../support/http';
import { appDb } from './authz-matrix.fixtures';
import { FIT_BODY } from './authz-matrix.table';

let db: Knex;
beforeAll(() => {
  db = appDb();
});
afterAll(() => db?.destroy());

let n = 0;
const unique = (prefix: string) => `${prefix}-${Date.now().toString(36)}-${process.pid}-${++n}`;
// Documentation addresses (RFC 5737), one per test, so no test spends another's budget.
let lastOctet = 10;
const nextAddress = () => `203.0.113.${lastOctet++}`;
const from = (address: string) => ({ 'x-forwarded-for': address });

/** Waits for a fresh window when the current one ends within `marginSeconds` (windows follow the clock). */
async function roomInWindow(rule: RateLimitRule, marginSeconds: number): Promise<void> {
  const left = rule.windowSeconds - ((Date.now() / 1000) % rule.windowSeconds);
  if (left < marginSeconds) await new Promise((r) => setTimeout(r, (left + 0.5) * 1000));
}

async function expect429(res: Response, windowSeconds: number): Promise<Record<string, unknown>> {
  expect(res.status).toBe(429);
  const retryAfter = Number(res.headers.get('retry-after'));
  expect(retryAfter).toBeGreaterThanOrEqual(1);
  expect(retryAfter).toBeLessThanOrEqual(windowSeconds);
  const body = (await res.json()) as Record<string, unknown>;
  expect(body.error).toMatch(/^Too many .+\. Please try again in \d+ (seconds|minutes)\.$/);
  return body;
}

async function signIn(visitor: Visitor, email: string, password: string, address: string): Promise<Response> {
  const csrfToken = await visitor.csrfToken();
  return visitor.request('/api/auth/callback/password', { method: 'POST', headers: from(address), form: { csrfToken, email, password, json: 'true' } });
}

describe('sign-in', () => {
  it('locks an account after 10 wrong passwords from anywhere, even for the right one, with a plain message', async () => {
    const rule = RATE_LIMITS.signInFailuresPerAccount;
    await roomInWindow(rule, 60);
    const email = `${unique('locked')}@example.test`;
    await createAccount(db, { role: 'rider', name: 'Locked Rider', email, password: 'the right password' });
    for (let i = 0; i < rule.limit; i++) expect((await signIn(new Visitor(), email, `wrong ${i}`, nextAddress())).status).toBe(401);
    const visitor = new Visitor();
    const body = await expect429(await signIn(visitor, email, 'the right password', nextAddress()), rule.windowSeconds);
    expect(String(body.url)).toContain('/sign-in?error=TooManyAttempts');
    expect((await visitor.me()).status).toBe(401);

    // The sign-in form says so in words.
    const browser = await openBrowser();
    try {
      const { page } = browser;
      await page.goto(`${inject('appUrl')}/sign-in`);
      await page.getByLabel('E-mail', { exact: true }).fill(email);
      await page.getByLabel('Password', { exact: true }).fill('the right password');
      await page.getByRole('button', { name: 'Sign in', exact: true }).click();
      await page.getByText(/Too many sign-in attempts/).waitFor();
    } finally {
      await browser.close();
    }
  });

  it('the right password ends a run of failures, so people who know it are never locked out', async () => {
    const rule = RATE_LIMITS.signInFailuresPerAccount;
    await roomInWindow(rule, 60);
    const email = `${unique('forgetful')}@example.test`;
    await createAccount(db, { role: 'rider', name: 'Forgetful Rider', email, password: 'the right password' });
    const address = nextAddress();
    for (let round = 0; round < 2; round++) {
      for (let i = 0; i < rule.limit - 1; i++) expect((await signIn(new Visitor(), email, 'wrong', address)).status).toBe(401);
      expect((await signIn(new Visitor(), email, 'the right password', address)).status).toBe(200);
    }
  });

  it('stops an address guessing across many accounts after 50 failures', async () => {
    const rule = RATE_LIMITS.signInFailuresPerAddress;
    await roomInWindow(rule, 60);
    const address = nextAddress();
    for (let i = 0; i < rule.limit; i++) expect((await signIn(new Visitor(), `${unique('guess')}@example.test`, 'guess', address)).status).toBe(401);
    await expect429(await signIn(new Visitor(), 'rider@demo.lacewright.test', 'lacewright-demo', address), rule.windowSeconds);
    // Another address is not affected.
    expect((await signIn(new Visitor(), 'rider@demo.lacewright.test', 'lacewright-demo', nextAddress())).status).toBe(200);
  });

  it('sends at most 5 sign-in links an hour to one mailbox', async () => {
    const rule = RATE_LIMITS.signInLinksPerAccount;
    await roomInWindow(rule, 120);
    const email = `${unique('links')}@example.test`;
    const ask = async () => {
      const visitor = new Visitor();
      const csrfToken = await visitor.csrfToken();
      return visitor.request('/api/auth/signin/email', { method: 'POST', headers: from(nextAddress()), form: { csrfToken, email, callbackUrl: '/welcome', json: 'true' } });
    };
    for (let i = 0; i < rule.limit; i++) expect((await ask()).status).toBe(200);
    await expect429(await ask(), rule.windowSeconds);
    await new Promise((r) => setTimeout(r, 500));
    expect(await caughtMail(email)).toHaveLength(rule.limit);
  });
});

describe('sign-up and the public API', () => {
  it('allows 20 accounts an hour from one address, then 429 and no account', { timeout: 120_000 }, async () => {
    const rule = RATE_LIMITS.signUpsPerAddress;
    await roomInWindow(rule, 120);
    const address = nextAddress();
    const signUp = (email: string) => new Visitor().request('/api/accounts', { method: 'POST', headers: from(address), json: { role: 'rider', name: 'Rate Rider', email, password: 'ten chars or more' } });
    for (let i = 0; i < rule.limit; i++) expect((await signUp(`${unique('many')}@example.test`)).status).toBe(201);
    const refused = `${unique('one-too-many')}@example.test`;
    await expect429(await signUp(refused), rule.windowSeconds);
    expect(await db('users').where({ email: refused }).first()).toBeUndefined();
    expect((await new Visitor().request('/api/accounts', { method: 'POST', headers: from(nextAddress()), json: { role: 'rider', name: 'Other', email: `${unique('other')}@example.test`, password: 'ten chars or more' } })).status).toBe(201);
  });

  it('allows 120 fit checks a minute from one address, then 429; the map tiles are not limited', { timeout: 120_000 }, async () => {
    const rule = RATE_LIMITS.publicApiPerAddress;
    await roomInWindow(rule, 30);
    const address = nextAddress();
    const fit = () => new Visitor().request('/api/fit', { method: 'POST', headers: from(address), json: FIT_BODY });
    const statuses: number[] = [];
    for (let i = 0; i < rule.limit; i++) {
      const res = await fit();
      await res.arrayBuffer();
      statuses.push(res.status);
    }
    expect(statuses.every((s) => s === 200)).toBe(true);
    await expect429(await fit(), rule.windowSeconds);
    const tile = await new Visitor().request('/api/tiles/3/1/3.png', { headers: from(address) });
    await tile.arrayBuffer();
    expect(tile.status).toBe(200);
  });

  it('a count written by another app server stops this one: the counters live in Postgres', async () => {
    const rule = RATE_LIMITS.publicApiPerAddress;
    await roomInWindow(rule, 10);
    const address = nextAddress();
    // What another server would have written for this address in the current window.
    await db.raw(
      `insert into rate_limit_counters (key, window_start, hits, expires_at)
       values (?, to_timestamp(floor(extract(epoch from now()) / ?) * ?), ?, to_timestamp(floor(extract(epoch from now()) / ?) * ? + ?))`,
      [counterKey(rule, address), rule.windowSeconds, rule.windowSeconds, rule.limit, rule.windowSeconds, rule.windowSeconds, rule.windowSeconds],
    );
    await expect429(await new Visitor().request('/api/fit', { method: 'POST', headers: from(address), json: FIT_BODY }), rule.windowSeconds);
  });
});
