// Counters in Postgres: exact under concurrency, shared by separate connection pools (two app servers),
// per key, and forgotten when the window ends.
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { consumeRateLimit, counterKey, peekRateLimit, resetRateLimit, sweepExpiredCounters, type RateLimitRule } from '@/lib/security/rateLimit';
import { clientAddress } from '@/lib/security/clientAddress';
import { testDb } from '../../support/db';

let serverA: Knex;
let serverB: Knex;
beforeAll(() => {
  serverA = testDb();
  serverB = testDb();
});
afterAll(async () => {
  await serverA?.destroy();
  await serverB?.destroy();
});

let n = 0;
const rule = (limit: number, windowSeconds = 600): RateLimitRule => ({ name: `test-${process.pid}-${++n}`, limit, windowSeconds });

describe('rate limit counters', () => {
  it('allows exactly the limit, then refuses with the seconds left in the window', async () => {
    const r = rule(3, 600);
    const verdicts = [];
    for (let i = 0; i < 5; i++) verdicts.push(await consumeRateLimit(serverA, r, 'someone'));
    expect(verdicts.map((v) => v.allowed)).toEqual([true, true, true, false, false]);
    expect(verdicts.map((v) => v.hits)).toEqual([1, 2, 3, 4, 5]);
    expect(verdicts[3].retryAfterSeconds).toBeGreaterThan(0);
    expect(verdicts[3].retryAfterSeconds).toBeLessThanOrEqual(600);
    expect(verdicts[0].retryAfterSeconds).toBe(0);
  });

  it('counts exactly under 60 parallel hits split across two app servers', async () => {
    const r = rule(10);
    const hits = await Promise.all(Array.from({ length: 60 }, (_, i) => consumeRateLimit(i % 2 ? serverA : serverB, r, 'burst')));
    expect(hits.filter((v) => v.allowed)).toHaveLength(10);
    expect(hits.map((v) => v.hits).sort((a, b) => a - b)).toEqual(Array.from({ length: 60 }, (_, i) => i + 1));
    const rows = await serverA('rate_limit_counters').where({ key: counterKey(r, 'burst') });
    expect(rows).toHaveLength(1);
    expect(rows[0].hits).toBe(60);
  });

  it('keeps keys and rules apart', async () => {
    const r = rule(1);
    const other = rule(1);
    expect((await consumeRateLimit(serverA, r, 'a')).allowed).toBe(true);
    expect((await consumeRateLimit(serverA, r, 'a')).allowed).toBe(false);
    expect((await consumeRateLimit(serverB, r, 'b')).allowed).toBe(true);
    expect((await consumeRateLimit(serverB, other, 'a')).allowed).toBe(true);
  });

  it('peeks without counting, and says blocked once the next hit would go over', async () => {
    const r = rule(2);
    expect(await peekRateLimit(serverA, r, 'p')).toMatchObject({ allowed: true, hits: 0 });
    await consumeRateLimit(serverA, r, 'p');
    expect(await peekRateLimit(serverA, r, 'p')).toMatchObject({ allowed: true, hits: 2 });
    await consumeRateLimit(serverA, r, 'p');
    const blocked = await peekRateLimit(serverB, r, 'p');
    expect(blocked.allowed).toBe(false);
    expect(blocked.retryAfterSeconds).toBeGreaterThan(0);
    await resetRateLimit(serverA, r, 'p');
    expect(await peekRateLimit(serverA, r, 'p')).toMatchObject({ allowed: true, hits: 0 });
  });

  it('starts afresh in the next window, and sweeps rows long past their window', async () => {
    const r = rule(1, 1);
    // Start just after a window boundary (database clock) so both hits land in the same one-second window.
    const { rows } = await serverA.raw<{ rows: { frac: number }[] }>(`select extract(epoch from now()) - floor(extract(epoch from now())) as frac`);
    await new Promise((res) => setTimeout(res, Math.max(0, (1 - Number(rows[0].frac)) * 1000 + 20)));
    expect((await consumeRateLimit(serverA, r, 'w')).allowed).toBe(true);
    expect((await consumeRateLimit(serverA, r, 'w')).allowed).toBe(false);
    await new Promise((res) => setTimeout(res, 1_100));
    expect((await consumeRateLimit(serverA, r, 'w')).allowed).toBe(true);

    await serverA('rate_limit_counters').insert({ key: 'test-old', window_start: new Date(Date.now() - 7_200_000), hits: 5, expires_at: new Date(Date.now() - 3_600_000) });
    await sweepExpiredCounters(serverA);
    expect(await serverA('rate_limit_counters').where({ key: 'test-old' })).toHaveLength(0);
  });

  it('stores no e-mail or address, only a hash', async () => {
    const r = rule(5);
    await consumeRateLimit(serverA, r, 'private.person@example.test');
    const keys = await serverA('rate_limit_counters').where('key', 'like', `${r.name}:%`).pluck('key');
    expect(keys).toHaveLength(1);
    expect(keys[0]).not.toContain('private');
  });
});

describe('the client address', () => {
  it('takes the nearest hop of X-Forwarded-For, then X-Real-IP', () => {
    expect(clientAddress(new Headers({ 'x-forwarded-for': '203.0.113.9, 10.0.0.2' }))).toBe('10.0.0.2');
    expect(clientAddress(new Headers({ 'x-forwarded-for': '::ffff:127.0.0.1' }))).toBe('127.0.0.1');
    expect(clientAddress({ 'x-real-ip': '198.51.100.4' })).toBe('198.51.100.4');
    expect(clientAddress({})).toBe('unknown');
    expect(clientAddress({ 'x-forwarded-for': 'x'.repeat(10_000) })).toHaveLength(64);
  });
});
