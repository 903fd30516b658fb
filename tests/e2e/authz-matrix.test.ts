// The authorization matrix: every API route and method, called as each of six principals, answers the
// status the table says. A route file or method missing from the table fails here.
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appDb, PRINCIPALS, signInAll, World, type Principal } from './authz-matrix.fixtures';
import { discoverApiRoutes } from './authz-matrix.routes';
import { MATRIX, type MatrixCase, type MatrixContext, type Subject } from './authz-matrix.table';
import { recordProof } from '../support/summary';
import type { Visitor } from '../support/http';

let db: Knex;
let ctx: MatrixContext;
let checks = 0;

beforeAll(async () => {
  db = appDb();
  const { visitors, users } = await signInAll(db);
  let n = 0;
  ctx = { world: new World(db, users), visitors, unique: (prefix) => `${prefix}-${Date.now().toString(36)}-${process.pid}-${++n}` };
});
afterAll(async () => {
  recordProof('authz-matrix', { routeChecks: checks });
  await ctx?.world.cancelOpenRequests();
  await db?.destroy();
});

const key = (route: string, method: string) => `${method} ${route}`;

async function call(c: MatrixCase, visitor: Visitor, subject: Subject): Promise<Response> {
  if (c.send) return c.send(visitor, subject, ctx);
  const body = c.body?.(subject, ctx);
  return visitor.request(c.path(subject), { method: c.method, ...(body === undefined ? {} : { json: body }) });
}

describe('the authorization matrix', () => {
  it('covers every API route and method, and names none that do not exist', () => {
    const discovered = discoverApiRoutes();
    expect(discovered.length).toBeGreaterThan(30);
    const inTable = new Set(MATRIX.map((c) => key(c.route, c.method)));
    const onDisk = new Set(discovered.map((d) => key(d.route, d.method)));
    const missing = discovered.filter((d) => !inTable.has(key(d.route, d.method))).map((d) => `${key(d.route, d.method)} (${d.file})`);
    const stale = [...inTable].filter((k) => !onDisk.has(k));
    expect(missing, 'routes with no row in tests/e2e/authz-matrix.table.ts').toEqual([]);
    expect(stale, 'rows for routes that no longer exist').toEqual([]);
  });

  it('gives every principal the expected status on every route', { timeout: 600_000 }, async () => {
    const wrong: string[] = [];
    for (const c of MATRIX) {
      let shared: Subject | undefined;
      const sharedSubject = async () => (shared ??= c.subject ? await c.subject(ctx) : {});
      // Refusals first, on the shared subject; then each principal expected to succeed (on a fresh one if the call changes it).
      const order = [...PRINCIPALS].sort((a, b) => Number(c.expect[a] < 300) - Number(c.expect[b] < 300));
      for (const principal of order as Principal[]) {
        const succeeds = c.expect[principal] < 300;
        const subject = succeeds && c.fresh && c.subject ? await c.subject(ctx) : await sharedSubject();
        const res = await call(c, ctx.visitors[principal], subject);
        checks += 1;
        if (res.status !== c.expect[principal]) {
          const text = (await res.text()).slice(0, 200);
          wrong.push(`${key(c.route, c.method)} [${c.about}] as ${principal}: expected ${c.expect[principal]}, got ${res.status} ${text}`);
        } else {
          await res.arrayBuffer();
        }
      }
    }
    expect(wrong).toEqual([]);
    expect(checks).toBeGreaterThanOrEqual(MATRIX.length * PRINCIPALS.length);
  });
});
