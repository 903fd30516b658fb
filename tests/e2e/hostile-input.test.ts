/// <reference types="vite/client" />
// Hostile input against every write route, as the principal allowed to write there: generated bodies
// (wrong types, missing and extra fields, huge strings and numbers, negative money, unicode, SQL and HTML)
// never get a 5xx, always a 400 (413 when too big) that names the fields, and change no row. Hostile ids in
// paths and hostile query strings never get a 5xx either. HTML people write shows as text in the pages.
import fc from 'fast-check';
import fs from 'node:fs';
import type { Knex } from 'knex';
import type { ZodType } from 'zod';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { openBrowser } from '../support/browser';
import { Visitor } from '../support/http';
import { recordProof } from '../support/summary';
import { appDb, signInAll, World, type Principal } from './authz-matrix.fixtures';
import { discoverApiRoutes, type DiscoveredRoute } from './authz-matrix.routes';
import { MATRIX, type MatrixCase, type MatrixContext, type Subject } from './authz-matrix.table';

// Generated cases per route: modest, so the whole file runs in a couple of minutes on two cores.
const BODY_RUNS = 40;
const PATH_RUNS = 15;
const QUERY_RUNS = 15;

// Every zod schema the route handlers parse bodies with, by export name: the oracle for "is this body invalid".
const schemaModules = import.meta.glob('/lib/**/schema.ts', { eager: true }) as Record<string, Record<string, unknown>>;
function schemaNamed(name: string): ZodType | undefined {
  for (const mod of Object.values(schemaModules)) {
    const candidate = mod[name] as ZodType | undefined;
    if (candidate && typeof (candidate as { safeParse?: unknown }).safeParse === 'function') return candidate;
  }
  return undefined;
}

/** The name of the body schema a route handler hands to route(), if any. */
function bodySchemaName(file: string, method: string): string | undefined {
  const source = fs.readFileSync(file, 'utf8');
  const start = source.search(new RegExp(`export\\s+const\\s+${method}\\b`));
  if (start < 0) return undefined;
  const rest = source.slice(start);
  const next = rest.slice(1).search(/export\s+const\s+(GET|POST|PUT|PATCH|DELETE)\b/);
  // The options object's `body: somethingSchema` (not a `{ body: string }` type argument).
  return (next < 0 ? rest : rest.slice(0, next + 1)).match(/body:\s*([A-Za-z0-9_]*Schema)\b/)?.[1];
}

// Tables whose every row is fingerprinted before and after (inserts, updates and deletes all show), and
// tables that are only counted because the worker legitimately updates their rows in the background.
const FINGERPRINTED = ['users', 'shops', 'shop_members', 'wheel_requests', 'bids', 'jobs', 'messages', 'disputes', 'uploads', 'reviews', 'ledger_transactions', 'ledger_entries', 'admin_audit_log', 'payout_accounts', 'verification_tokens'];
const COUNTED = ['outbox', 'payments', 'payouts', 'refunds', 'webhook_events'];

let db: Knex;
let ctx: MatrixContext;
let tables: { fingerprinted: string[]; counted: string[] };
let sent = 0;
const anonymous = new Visitor();

beforeAll(async () => {
  db = appDb();
  const { visitors, users } = await signInAll(db);
  let n = 0;
  ctx = { world: new World(db, users), visitors, unique: (prefix) => `${prefix}-${Date.now().toString(36)}-${process.pid}-${++n}` };
  const existing = new Set((await db('pg_tables').where({ schemaname: 'public' }).pluck('tablename')) as string[]);
  tables = { fingerprinted: FINGERPRINTED.filter((t) => existing.has(t)), counted: COUNTED.filter((t) => existing.has(t)) };
});
afterAll(async () => {
  recordProof('hostile-input', { hostileBodies: sent });
  await ctx?.world.cancelOpenRequests();
  await db?.destroy();
});

async function snapshot(): Promise<Record<string, string>> {
  const out: Record<string, string> = {};
  for (const t of tables.fingerprinted) {
    const { rows } = await db.raw<{ rows: { n: string; md5: string | null }[] }>(`select count(*) as n, md5(string_agg(x::text, '|' order by x::text)) as md5 from ${t} x`);
    out[t] = `${rows[0].n}:${rows[0].md5}`;
  }
  for (const t of tables.counted) out[t] = String((await db(t).count({ n: '*' }))[0].n);
  return out;
}

// ------------------------------------------------------------------ generators

const SQL = ["'; drop table users; --", "' or '1'='1", '1; select pg_sleep(5)', "\\'; delete from bids where ''='"];
const HTML = ['<script>alert(1)</script>', '<img src=x onerror=alert(1)>', '"><svg onload=alert(1)>', '{{7*7}}${7*7}'];
const UNICODE = ['\u0000', 'nul\u0000inside', '\u202eevil\u202c', '\u200b\ufeff', '🚲'.repeat(40), 'Ünïcödé ñ 漢字 عربى', '\ud800'];
const hostileString = fc.oneof(
  fc.constantFrom(...SQL, ...HTML, ...UNICODE, '', ' ', 'null', 'undefined', '../../etc/passwd', '%00'),
  fc.string({ unit: 'grapheme', maxLength: 40 }),
  fc.integer({ min: 2_000, max: 20_000 }).map((n) => 'w'.repeat(n)),
);
const hostileNumber = fc.oneof(
  fc.constantFrom(-1, -100_000, 0, 0.5, -0.01, 1e308, -1e308, Number.MAX_SAFE_INTEGER + 2, 2 ** 31, -(2 ** 31) - 1, 1e-9),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.integer(),
);
const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  hostileString,
  hostileNumber,
  fc.boolean(),
  fc.constant(null),
  fc.array(fc.jsonValue({ maxDepth: 2 }), { maxLength: 4 }),
  fc.dictionary(fc.string({ maxLength: 8 }), fc.jsonValue({ maxDepth: 2 }), { maxKeys: 4 }),
);
const EXTRA_KEYS = ['__proto__', 'constructor', 'prototype', 'role', 'id', 'status', 'riderId', 'rider_id', 'shopId', 'totalCents', 'isAdmin', 'accepted'];

type Path = (string | number)[];
function paths(value: unknown, prefix: Path = []): Path[] {
  if (Array.isArray(value)) return [prefix, ...value.flatMap((v, i) => paths(v, [...prefix, i]))];
  if (value && typeof value === 'object') return [prefix, ...Object.entries(value).flatMap(([k, v]) => paths(v, [...prefix, k]))];
  return [prefix];
}

function mutate(body: unknown, path: Path, op: 'set' | 'drop', value: unknown): unknown {
  if (path.length === 0) return op === 'set' ? value : undefined;
  if (!body || typeof body !== 'object') return body; // an earlier change already replaced it
  const copy = structuredClone(body) as Record<string | number, unknown>;
  let parent = copy;
  for (const key of path.slice(0, -1)) {
    const next = parent[key];
    if (!next || typeof next !== 'object') return body;
    parent = next as Record<string | number, unknown>;
  }
  const last = path[path.length - 1];
  if (op === 'drop') {
    if (Array.isArray(parent)) parent.splice(Number(last), 1);
    else delete parent[last];
  } else parent[last] = value;
  return copy;
}

/** A valid body bent out of shape: one to three fields set to hostile values or dropped, plus stray fields. */
function hostileBodies(valid: unknown): fc.Arbitrary<unknown> {
  const all = paths(valid);
  const change = fc.record({ path: fc.constantFrom(...all), op: fc.constantFrom('set', 'set', 'drop') as fc.Arbitrary<'set' | 'drop'>, value: hostileValue });
  const bent = fc.tuple(fc.array(change, { minLength: 1, maxLength: 3 }), fc.dictionary(fc.constantFrom(...EXTRA_KEYS), hostileValue, { maxKeys: 3 })).map(([changes, extras]) => {
    let body = changes.reduce<unknown>((b, c) => mutate(b, c.path, c.op, c.value), valid);
    if (body && typeof body === 'object' && !Array.isArray(body)) body = Object.assign(Object.create(null), body, extras);
    return body;
  });
  // Now and then something that is not the right shape at all.
  return fc.oneof({ weight: 5, arbitrary: bent }, { weight: 1, arbitrary: hostileValue });
}

// ------------------------------------------------------------------ calling

interface Target {
  route: DiscoveredRoute;
  c: MatrixCase;
  principal: Principal;
  visitor: Visitor;
  subject: Subject;
  schema?: ZodType;
  schemaName?: string;
}

const PREFERRED: Principal[] = ['riderA', 'builderX', 'admin', 'riderB', 'builderY', 'anonymous'];

async function targetFor(route: DiscoveredRoute): Promise<Target> {
  const c = MATRIX.find((m) => m.route === route.route && m.method === route.method);
  if (!c) throw new Error(`${route.method} ${route.route} has no row in the authorization matrix`);
  const principal = PREFERRED.find((p) => c.expect[p] < 300) ?? 'riderA';
  const subject = c.subject ? await c.subject(ctx) : {};
  await ctx.world.settleWebhooks(); // events about the subject land before anything is counted
  const schemaName = bodySchemaName(route.file, route.method);
  const schema = schemaName ? schemaNamed(schemaName) : undefined;
  if (schemaName && !schema) throw new Error(`${route.file} parses its body with ${schemaName}; export it from a lib/**/schema.ts so this test can judge bodies`);
  return { route, c, principal, visitor: ctx.visitors[principal], subject, schema, schemaName };
}

async function send(t: Target, init: { path?: string; raw?: string; json?: unknown; contentType?: string }): Promise<{ status: number; body: Record<string, unknown> | null; text: string }> {
  sent += 1;
  const headers: Record<string, string> = {};
  let body: string | undefined;
  if (init.raw !== undefined) {
    body = init.raw;
    headers['content-type'] = init.contentType ?? 'application/json';
  } else if (init.json !== undefined) {
    body = JSON.stringify(init.json);
    headers['content-type'] = 'application/json';
  }
  const res = await t.visitor.request(init.path ?? t.c.path(t.subject), { method: t.route.method, headers, body });
  const text = await res.text();
  let parsed: Record<string, unknown> | null = null;
  try {
    parsed = JSON.parse(text) as Record<string, unknown>;
  } catch {
    /* not JSON */
  }
  return { status: res.status, body: parsed, text };
}

const GENERIC_400 = 'Some fields need attention.';

function judge400(bodySent: unknown, res: { status: number; body: Record<string, unknown> | null; text: string }): string | null {
  if (res.status >= 500) return `answered ${res.status}: ${res.text.slice(0, 300)}`;
  if (res.status === 413) return null;
  if (res.status !== 400) return `answered ${res.status} (expected 400): ${res.text.slice(0, 300)}`;
  if (typeof res.body?.error !== 'string' || !res.body.error) return `400 without a plain message: ${res.text.slice(0, 200)}`;
  if (bodySent && typeof bodySent === 'object' && !Array.isArray(bodySent)) {
    const fieldErrors = res.body.fieldErrors as Record<string, string[]> | undefined;
    const named = fieldErrors && Object.keys(fieldErrors).length > 0;
    if (!named && res.body.error === GENERIC_400) return `400 that names no field: ${res.text.slice(0, 300)}`;
  }
  return null;
}

const writeRoutes = () => discoverApiRoutes().filter((r) => r.method !== 'GET');
const SPECIAL = new Set(['/api/auth/[...nextauth]', '/api/payments/webhook']);

describe('hostile bodies on every write route', () => {
  it('covers every write route', () => {
    const routes = writeRoutes();
    expect(routes.length).toBeGreaterThan(20);
    for (const r of routes) expect(MATRIX.some((m) => m.route === r.route && m.method === r.method), `${r.method} ${r.route}`).toBe(true);
  });

  for (const route of writeRoutes().filter((r) => !SPECIAL.has(r.route))) {
    it(`${route.method} ${route.route}: never a 5xx, a 400 naming the fields, no row changed`, { timeout: 180_000 }, async () => {
      const t = await targetFor(route);
      const before = await snapshot();
      const problems: string[] = [];
      if (t.schema) {
        const valid = t.c.body?.(t.subject, ctx);
        expect(t.schema.safeParse(valid).success, 'the matrix body is valid').toBe(true);
        await fc.assert(
          fc.asyncProperty(hostileBodies(valid), async (body) => {
            const json = JSON.parse(JSON.stringify(body ?? null)) as unknown;
            fc.pre(!t.schema!.safeParse(json).success); // only bodies the handler must refuse
            const problem = judge400(json, await send(t, { json }));
            if (problem) problems.push(`${JSON.stringify(json).slice(0, 300)} → ${problem}`);
            return problem === null;
          }),
          { numRuns: BODY_RUNS, maxSkipsPerRun: 50 },
        );
        // Bodies that are not JSON objects at all, and one over the size limit.
        for (const raw of ['not json', '{"a":', 'null', '[]', '"text"', '12', 'true', '{"x":1}'.padEnd(70_000, ' ')]) {
          let parsed: unknown = undefined;
          try {
            parsed = JSON.parse(raw);
          } catch {
            /* not JSON */
          }
          if (parsed !== undefined && t.schema.safeParse(parsed).success) continue;
          const res = await send(t, { raw });
          if (res.status >= 500 || ![400, 413].includes(res.status)) problems.push(`raw ${JSON.stringify(raw.slice(0, 20))} → ${res.status} ${res.text.slice(0, 200)}`);
        }
        const form = await send(t, { raw: 'a=1&b=<script>', contentType: 'application/x-www-form-urlencoded' });
        if (form.status !== 400) problems.push(`a form body → ${form.status}`);
      }
      expect(problems).toEqual([]);
      expect(await snapshot()).toEqual(before);
    });
  }

  it('the webhook refuses generated events without a good signature, and books nothing', { timeout: 120_000 }, async () => {
    const before = await snapshot();
    await fc.assert(
      fc.asyncProperty(hostileValue, fc.option(hostileString, { nil: undefined }), async (event, signature) => {
        sent += 1;
        const res = await fetch(`${inject('appUrl')}/api/payments/webhook`, {
          method: 'POST',
          headers: { 'content-type': 'application/json', ...(signature === undefined ? {} : { 'stripe-signature': signature.replace(/[^\x20-\x7e]/g, '') }) },
          body: JSON.stringify(event),
        });
        // 431 is Node refusing a header too large to read, before the app sees it.
        expect([400, 431], await res.text()).toContain(res.status);
      }),
      { numRuns: BODY_RUNS },
    );
    expect(await snapshot()).toEqual(before);
  });

  it('sign-in refuses generated credentials without a 5xx and without a session', { timeout: 120_000 }, async () => {
    const before = await snapshot();
    let n = 0;
    await fc.assert(
      fc.asyncProperty(fc.dictionary(fc.constantFrom('email', 'password', 'csrfToken', 'callbackUrl', 'json', 'role'), hostileString, { maxKeys: 5 }), async (fields) => {
        const visitor = new Visitor();
        const csrfToken = await visitor.csrfToken();
        sent += 1;
        const res = await visitor.request('/api/auth/callback/password', {
          method: 'POST',
          headers: { 'x-forwarded-for': `198.51.100.${(n++ % 200) + 20}` },
          form: { csrfToken, json: 'true', ...fields },
        });
        expect(res.status).toBeLessThan(500);
        expect((await visitor.me()).status).toBe(401);
      }),
      { numRuns: BODY_RUNS },
    );
    expect(await snapshot()).toEqual(before);
  });
});

describe('hostile ids and query strings', () => {
  // Lone surrogates cannot be put in a URL at all, so ids are made well-formed first.
  const hostileId = fc.oneof(hostileString.filter((v) => v.length > 0 && v.length < 2_000), fc.uuid(), fc.integer().map(String)).map((v) => v.toWellFormed());

  const withParams = () => discoverApiRoutes().filter((r) => /\[[^\]]+\]/.test(r.route) && !r.route.startsWith('/api/auth/') && !r.route.startsWith('/api/tiles/'));
  for (const route of withParams()) {
    it(`${route.method} ${route.route} with hostile ids: never a 5xx, nothing changed`, { timeout: 120_000 }, async () => {
      const t = await targetFor(route);
      const valid = t.c.body?.(t.subject, ctx);
      const before = await snapshot();
      await fc.assert(
        fc.asyncProperty(hostileId, async (id) => {
          const path = route.route.replace(/\[(\.\.\.)?[^\]]+\]/g, () => encodeURIComponent(id));
          const res = await send(t, { path, ...(valid === undefined ? {} : { json: valid }) });
          expect(res.status, `${path} → ${res.text.slice(0, 200)}`).toBeLessThan(500);
          expect([400, 403, 404, 405, 409]).toContain(res.status);
        }),
        { numRuns: PATH_RUNS },
      );
      expect(await snapshot()).toEqual(before);
    });
  }

  const QUERIES: { path: string; params: string[]; as: Principal }[] = [
    { path: '/api/board', params: ['diameterIn', 'rimWidthIn', 'gauge', 'spokes', 'maxMiles', 'budgetMinCents', 'budgetMaxCents', 'neededByFrom', 'neededByTo', 'sort', 'order', 'capabilityFilter', 'limit', 'cursor'], as: 'builderX' },
    { path: '/api/bids', params: ['status'], as: 'builderX' },
    { path: '/api/admin/audit', params: ['before'], as: 'admin' },
    { path: '/api/admin/disputes', params: ['status'], as: 'admin' },
    { path: '/api/admin/ledger/export', params: ['month'], as: 'admin' },
    { path: '/api/uploads', params: ['purpose', 'subjectId'], as: 'riderA' },
    { path: '/api/reviews', params: ['jobId'], as: 'riderA' },
  ];
  for (const q of QUERIES) {
    it(`GET ${q.path} with hostile query strings: never a 5xx`, { timeout: 120_000 }, async () => {
      await fc.assert(
        fc.asyncProperty(fc.dictionary(fc.constantFrom(...q.params), hostileString.filter((v) => v.length < 2_000), { minKeys: 1, maxKeys: 4 }), async (params) => {
          sent += 1;
          const res = await ctx.visitors[q.as].request(`${q.path}?${new URLSearchParams(params)}`);
          const text = await res.text();
          expect(res.status, `${q.path}?${new URLSearchParams(params)} → ${text.slice(0, 200)}`).toBeLessThan(500);
        }),
        { numRuns: QUERY_RUNS },
      );
    });
  }

  it('tiles with hostile coordinates: never a 5xx', { timeout: 120_000 }, async () => {
    await fc.assert(
      fc.asyncProperty(fc.tuple(hostileId, hostileId, hostileId), async ([z, x, y]) => {
        sent += 1;
        const res = await anonymous.request(`/api/tiles/${encodeURIComponent(z)}/${encodeURIComponent(x)}/${encodeURIComponent(y)}`);
        await res.arrayBuffer();
        expect(res.status).toBeLessThan(500);
      }),
      { numRuns: QUERY_RUNS },
    );
  });
});

describe('a NUL character in otherwise good text', () => {
  // Postgres cannot store U+0000 in text, so a body that is valid in every other way must still be refused
  // with a 400 naming the field, not fail on the insert.
  for (const route of writeRoutes().filter((r) => !SPECIAL.has(r.route))) {
    it(`${route.method} ${route.route}`, { timeout: 60_000 }, async () => {
      const t = await targetFor(route);
      if (!t.schema) return;
      const valid = t.c.body?.(t.subject, ctx);
      const textFields = paths(valid).filter((p) => p.length > 0 && typeof p.reduce<unknown>((v, k) => (v as Record<string | number, unknown>)[k], valid) === 'string');
      const before = await snapshot();
      for (const field of textFields) {
        const json = mutate(valid, field, 'set', 'first part\u0000second part');
        const res = await send(t, { json });
        expect(res.status, `${field.join('.')}: ${res.text.slice(0, 200)}`).toBe(400);
        expect(Object.keys((res.body?.fieldErrors as object | undefined) ?? {}), field.join('.')).not.toEqual([]);
      }
      expect(await snapshot()).toEqual(before);
    });
  }
});

describe('limits and stray fields', () => {
  it('answers 413 to a body over 64 KB, declared or streamed, and 400 to one just under', async () => {
    const rider = ctx.visitors.riderA;
    const big = JSON.stringify({ title: 'x'.repeat(70_000) });
    expect((await rider.request('/api/requests', { method: 'POST', headers: { 'content-type': 'application/json' }, body: big })).status).toBe(413);
    // No content-length: sent in chunks, so only the bytes read can tell.
    const stream = new ReadableStream<Uint8Array>({
      start(controller) {
        const encoder = new TextEncoder();
        controller.enqueue(encoder.encode('{"notes":"'));
        for (let i = 0; i < 10; i++) controller.enqueue(encoder.encode('y'.repeat(9_000)));
        controller.enqueue(encoder.encode('"}'));
        controller.close();
      },
    });
    const streamed = await fetch(new URL('/api/requests', inject('appUrl')), {
      method: 'POST',
      headers: { 'content-type': 'application/json', cookie: rider.cookieHeader() },
      body: stream,
      duplex: 'half',
    } as RequestInit);
    expect(streamed.status).toBe(413);
    const under = await rider.request('/api/requests', { method: 'POST', json: { title: 'x'.repeat(60_000) } });
    expect(under.status).toBe(400);
    sent += 3;
  });

  it('ignores fields nobody may set: a request posted with another rider, a status and an id belongs to its poster as a draft', async () => {
    const { users } = ctx.world;
    const forcedId = '00000000-0000-4000-8000-000000000001';
    const res = await ctx.visitors.riderA.request('/api/requests', {
      method: 'POST',
      json: { ...(MATRIX.find((m) => m.route === '/api/requests' && m.method === 'POST')!.body!({}, ctx) as object), id: forcedId, riderId: users.riderB.id, rider_id: users.riderB.id, status: 'awarded', accepted_bid_id: forcedId },
    });
    expect(res.status).toBe(201);
    const { id } = (await res.json()) as { id: string };
    expect(id).not.toBe(forcedId);
    expect(await db('wheel_requests').where({ id }).first('rider_id', 'status', 'accepted_bid_id')).toEqual({ rider_id: users.riderA.id, status: 'draft', accepted_bid_id: null });
    sent += 1;
  });

  it('will not let a builder sign up as an admin', async () => {
    const email = `${ctx.unique('climber')}@example.test`;
    const res = await anonymous.request('/api/accounts', {
      method: 'POST',
      headers: { 'x-forwarded-for': '198.51.100.250' },
      json: { role: 'admin', name: 'Climber', email, password: 'ten chars or more' },
    });
    expect(res.status).toBe(400);
    expect(await db('users').where({ email }).first()).toBeUndefined();
    sent += 1;
  });
});

describe('HTML people write is shown as text', () => {
  const PAYLOAD = `<script>window.__pwned=1</script><img src=x onerror="window.__pwned=2">`;

  it('in a request title and a message, on the rider’s and the builder’s pages', { timeout: 120_000 }, async () => {
    const rider = ctx.visitors.riderA;
    const created = await rider.request('/api/requests', {
      method: 'POST',
      json: { ...(MATRIX.find((m) => m.route === '/api/requests' && m.method === 'POST')!.body!({}, ctx) as object), title: `Hostile ${PAYLOAD}`, notes: `Notes ${PAYLOAD}`, publish: true },
    });
    expect(created.status).toBe(201);
    const { id } = (await created.json()) as { id: string };
    const shopId = ctx.world.users.builderX.shopId!;
    expect((await ctx.visitors.builderX.request(`/api/requests/${id}/threads/${shopId}/messages`, { method: 'POST', json: { body: `Message ${PAYLOAD}` } })).status).toBe(201);
    sent += 2;

    const browser = await openBrowser();
    try {
      const { page, context } = browser;
      for (const [principal, path] of [
        ['riderA', `/requests/${id}`],
        ['builderX', `/board/${id}`],
        ['builderX', '/board'],
      ] as const) {
        await context.clearCookies();
        await context.addCookies([{ name: 'lacewright.session', value: ctx.visitors[principal].rawCookie('lacewright.session')!, url: inject('appUrl') }]);
        await page.goto(`${inject('appUrl')}${path}`);
        await page.waitForLoadState('networkidle');
        const text = await page.locator('main').innerText();
        expect(text, path).toContain('<script>window.__pwned=1</script>');
        expect(await page.evaluate(() => (window as unknown as { __pwned?: number }).__pwned), path).toBeUndefined();
        expect(await page.locator('main img[src="x"]').count(), path).toBe(0);
      }
    } finally {
      await browser.close();
    }
  });
});
