// The benchmark: a production build served against the scale database, driven by wrk from a second
// process on loopback, one endpoint at a time for a fixed time at 32 connections; then largest contentful
// paint for the home page and the board in headless Chromium. Prints a table and writes
// test-results/bench.json.
//   npm run bench
//   BENCH_SECONDS=20 BENCH_CONNECTIONS=32 BENCH_SKIP_BUILD=1 npm run bench
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { execFileSync } from 'node:child_process';
import pg from 'pg';
import { migrateLatest } from './lib/database';
import { freePort } from './lib/postgres';
import { startService, stopAll, waitForHttp } from './lib/processes';
import { SCALE_PASSWORD } from './lib/scale/generate';
import { databaseExists, scaleTarget } from './lib/scale/target';
import { BENCH_DIST_DIR, buildIfChanged } from './lib/bench/build';
import { databaseCpuDelta, databaseSessionsCpuMs, processGroupCpuMs } from './lib/bench/cpu';
import { measureLcp, type LcpResult } from './lib/bench/lcp';
import { SESSION_COOKIE, signIn, type SignedIn } from './lib/bench/session';
import { ensureDebianPackage } from './lib/bench/system';
import { BOARD_QUERIES, FIT_BODIES, bidBody, builderEmails, openRequestsWithoutBid, riderEmails, riderRequestIds } from './lib/bench/targets';
import { runWrk, type WrkLine, type WrkResult } from './lib/bench/wrk';

const root = process.cwd();
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 32);
const SECONDS = Number(process.env.BENCH_SECONDS ?? 15);
const WARMUP_SECONDS = Number(process.env.BENCH_WARMUP_SECONDS ?? 3);
const OUT_FILE = path.join(root, 'test-results', 'bench.json');

/** p99 ceilings and the share of the health route's throughput each route should reach. */
const TARGETS: Record<string, { p99Ms?: number; minRatio?: number }> = {
  board: { p99Ms: 50, minRatio: 0.4 },
  request: { p99Ms: 30, minRatio: 0.4 },
  bid: { p99Ms: 80, minRatio: 0.4 },
};
const LCP_TARGET_MS = 1500;

const load = () => os.loadavg().map((v) => Math.round(v * 100) / 100);

function step(text: string) {
  console.log(`\n▸ ${text}`);
}

async function mapLimit<T, R>(items: T[], limit: number, fn: (item: T) => Promise<R>): Promise<R[]> {
  const out: R[] = new Array(items.length);
  let next = 0;
  await Promise.all(
    Array.from({ length: Math.min(limit, items.length) }, async () => {
      while (next < items.length) {
        const i = next++;
        out[i] = await fn(items[i]);
      }
    }),
  );
  return out;
}

async function expectStatus(baseUrl: string, line: WrkLine, status: number): Promise<void> {
  const res = await fetch(new URL(line.path, baseUrl), {
    method: line.method,
    headers: { ...(line.cookie ? { cookie: line.cookie } : {}), ...(line.body !== undefined ? { 'content-type': 'application/json' } : {}) },
    body: line.body === undefined ? undefined : JSON.stringify(line.body),
  });
  if (res.status !== status) throw new Error(`${line.method} ${line.path} answered ${res.status}, expected ${status}: ${(await res.text()).slice(0, 300)}`);
}

interface EndpointResult extends WrkResult {
  name: string;
  what: string;
  ratioToHealth: number;
  /** CPU per request: the app's processes and its database sessions, in milliseconds. */
  appCpuMsPerRequest: number;
  dbCpuMsPerRequest: number;
  /** Health's CPU per request over this route's: the throughput ratio an otherwise idle machine would show. */
  cpuRatioToHealth: number;
}

async function main() {
  const startedAt = new Date();
  console.log(`Lacewright benchmark: ${CONNECTIONS} connections, ${SECONDS} s per endpoint after ${WARMUP_SECONDS} s of warm-up; load average ${load().join(' ')}`);

  step('Tools');
  ensureDebianPackage('wrk', '/usr/bin/wrk');
  ensureDebianPackage('chromium', '/usr/bin/chromium');

  step('Scale database');
  const target = await scaleTarget();
  if (!(await databaseExists(target))) {
    console.log('  not there yet: making it (npm run seed:scale)');
    execFileSync(path.join(root, 'node_modules/.bin/tsx'), [path.join(root, 'scripts/seed-scale.ts')], { stdio: 'inherit' });
  }
  const applied = await migrateLatest(target.url);
  console.log(`  ${target.url}${applied.length ? ` (applied ${applied.length} new migrations)` : ''}`);
  const db = new pg.Client({ connectionString: target.url });
  await db.connect();

  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: 'production',
    NEXT_TELEMETRY_DISABLED: '1',
    NEXT_DIST_DIR: BENCH_DIST_DIR,
    DATABASE_URL: target.url,
    APP_URL: baseUrl,
    NEXTAUTH_URL: baseUrl,
    AUTH_SECRET: crypto.randomBytes(32).toString('hex'),
    PORT: String(port),
  };

  step(`Production build (${BENCH_DIST_DIR})`);
  if (process.env.BENCH_SKIP_BUILD === '1' && fs.existsSync(path.join(root, BENCH_DIST_DIR, 'BUILD_ID'))) console.log('  skipped (BENCH_SKIP_BUILD=1)');
  else console.log(`  ${buildIfChanged(root, env)}`);

  const benchBuilders = builderEmails();
  let bidsWritten = 0;
  try {
    step('Server');
    // Only the app: the measured routes need nothing else (a bid's e-mail goes to the outbox table in the
    // bid's transaction; sending it is the worker's job, left out so it does not compete for the CPU).
    const app = startService('app', path.join(root, 'node_modules/.bin/next'), ['start', '-p', String(port)], env, { quiet: true });
    await waitForHttp(`${baseUrl}/api/health`, 60_000);
    console.log(`  ${baseUrl}`);

    step('Sign-ins (scale data)');
    const builders = await mapLimit(benchBuilders, 4, (email) => signIn(baseUrl, email, SCALE_PASSWORD));
    const riders = await mapLimit(riderEmails(), 4, (email) => signIn(baseUrl, email, SCALE_PASSWORD));
    console.log(`  ${builders.length} builders, ${riders.length} riders`);
    const cookieOf = new Map<string, SignedIn>([...builders, ...riders].map((s) => [s.email, s]));

    step('What each endpoint is sent');
    const healthLines: WrkLine[] = [{ method: 'GET', path: '/api/health' }];
    const boardLines: WrkLine[] = builders.flatMap((b) => BOARD_QUERIES.map((q) => ({ method: 'GET' as const, path: q, cookie: b.cookie })));
    const requestIds = await riderRequestIds(db, riderEmails());
    const requestLines: WrkLine[] = [...requestIds].flatMap(([email, ids]) => ids.map((id) => ({ method: 'GET' as const, path: `/api/requests/${id}`, cookie: cookieOf.get(email)!.cookie })));
    // Each bid goes to an open request its shop has not bid on; the lists are interleaved across shops.
    const perBuilder = 500;
    const openByBuilder = await openRequestsWithoutBid(db, benchBuilders, perBuilder);
    const bidLines: WrkLine[] = [];
    for (let k = 0; k < perBuilder; k++) {
      for (const b of builders) {
        const id = openByBuilder.get(b.email)?.[k];
        if (id) bidLines.push({ method: 'POST', path: `/api/requests/${id}/bids`, cookie: b.cookie, body: bidBody(bidLines.length) });
      }
    }
    const warmBids = Math.floor(bidLines.length * 0.1);
    const fitLines: WrkLine[] = FIT_BODIES.map((body) => ({ method: 'POST', path: '/api/fit', body }));
    console.log(`  board: ${BOARD_QUERIES.length} queries × ${builders.length} shops; request pages: ${requestLines.length}; open requests to bid on: ${bidLines.length}`);

    // One of each first, so a broken route stops the run before the timings.
    await expectStatus(baseUrl, healthLines[0], 200);
    await expectStatus(baseUrl, boardLines[0], 200);
    await expectStatus(baseUrl, requestLines[0], 200);
    await expectStatus(baseUrl, { ...fitLines[0] }, 200);

    step('Load');
    const results: EndpointResult[] = [];
    const endpoint = async (name: string, what: string, lines: WrkLine[], warm: WrkLine[] = lines, uniqueAddress = false) => {
      if (WARMUP_SECONDS > 0) await runWrk({ baseUrl, lines: warm, connections: CONNECTIONS, seconds: WARMUP_SECONDS, uniqueAddress });
      const appCpuBefore = processGroupCpuMs(app.child.pid!);
      const dbCpuBefore = await databaseSessionsCpuMs(db, target.database);
      const r = await runWrk({ baseUrl, lines, connections: CONNECTIONS, seconds: SECONDS, uniqueAddress });
      const appCpu = processGroupCpuMs(app.child.pid!) - appCpuBefore;
      const dbCpu = databaseCpuDelta(dbCpuBefore, await databaseSessionsCpuMs(db, target.database));
      const perRequest = (ms: number) => Math.round((ms / Math.max(1, r.requests)) * 100) / 100;
      const result: EndpointResult = { name, what, ...r, ratioToHealth: 1, cpuRatioToHealth: 1, appCpuMsPerRequest: perRequest(appCpu), dbCpuMsPerRequest: perRequest(dbCpu) };
      results.push(result);
      console.log(
        `  ${name.padEnd(14)} ${String(r.requestsPerSecond).padStart(8)} req/s  p50 ${String(r.p50Ms).padStart(7)} ms  p99 ${String(r.p99Ms).padStart(7)} ms  ` +
          `CPU/request app ${result.appCpuMsPerRequest} ms + db ${result.dbCpuMsPerRequest} ms  non-2xx ${r.badStatus}  load ${r.loadAverage}`,
      );
      return result;
    };
    await endpoint('health', 'GET /api/health (a database round trip)', healthLines);
    await endpoint('board', `GET ${BOARD_QUERIES.join(' | ')}`, boardLines);
    await endpoint('request', 'GET /api/requests/[id] as its rider (with bids)', requestLines);
    const bidStart = new Date();
    await expectStatus(baseUrl, bidLines[0], 201);
    const bid = await endpoint('bid', 'POST /api/requests/[id]/bids (a new bid on an open request)', bidLines.slice(warmBids + 1), bidLines.slice(1, warmBids + 1));
    // The public fit check is limited per address; many visitors each with their own address are simulated.
    await endpoint('fit', 'POST /api/fit (one wheel, many visitors)', fitLines, fitLines, true);
    // The ceiling again: other work on a shared machine comes and goes, so the better of the two is the reference.
    await endpoint('health-again', 'GET /api/health, after the others', healthLines);
    const ceiling = results.filter((r) => r.name.startsWith('health')).reduce((a, b) => (b.requestsPerSecond > a.requestsPerSecond ? b : a));
    const ceilingCpu = ceiling.appCpuMsPerRequest + ceiling.dbCpuMsPerRequest;
    for (const r of results) {
      r.ratioToHealth = Math.round((r.requestsPerSecond / ceiling.requestsPerSecond) * 1000) / 1000;
      r.cpuRatioToHealth = Math.round((ceilingCpu / Math.max(0.01, r.appCpuMsPerRequest + r.dbCpuMsPerRequest)) * 1000) / 1000;
    }
    console.log(`\n  Against the better health run (${ceiling.name}, ${ceiling.requestsPerSecond} req/s):`);
    for (const r of results) {
      console.log(`  ${r.name.padEnd(14)} ${(r.ratioToHealth * 100).toFixed(1).padStart(6)} % of its throughput;  by CPU per request ${(r.cpuRatioToHealth * 100).toFixed(1).padStart(6)} %`);
    }

    const written = await db.query<{ n: number }>(
      `select count(*)::int as n from bids b join shop_members m on m.shop_id = b.shop_id join users u on u.id = m.user_id
        where u.email = any($1) and b.created_at >= $2`,
      [benchBuilders, bidStart],
    );
    bidsWritten = written.rows[0].n;
    console.log(`  bids written during the bid runs: ${bidsWritten} (wrk counted ${bid.requests} in the timed run, ${bid.badStatus} not 2xx)`);

    step('Largest contentful paint (headless Chromium, loopback)');
    const lcp: LcpResult[] = [];
    lcp.push(await measureLcp(baseUrl, '/'));
    lcp.push(await measureLcp(baseUrl, '/board', { sessionCookie: { name: SESSION_COOKIE, value: builders[0].sessionValue } }));
    for (const l of lcp) {
      console.log(`  ${l.path.padEnd(8)} empty cache: median ${l.coldMedianMs} ms (${l.coldSamplesMs.join(', ')});  cached: median ${l.warmMedianMs} ms (${l.warmSamplesMs.join(', ')})`);
    }

    report({ startedAt, baseUrl, results, lcp, bidsWritten });
  } finally {
    await stopAll();
    // The data stays as seeded: the bids, their notices and the rate-limit counters made by this run go.
    const since = startedAt;
    await db.query(`delete from outbox where created_at >= $1 and kind = 'bid.new'`, [since]).catch(() => undefined);
    await db
      .query(
        `delete from bids b using shop_members m, users u where m.shop_id = b.shop_id and u.id = m.user_id and u.email = any($1) and b.created_at >= $2`,
        [benchBuilders, since],
      )
      .catch(() => undefined);
    await db.query(`delete from rate_limit_counters where key like 'public-api:%'`).catch(() => undefined);
    await db.end();
  }
}

function report(o: { startedAt: Date; baseUrl: string; results: EndpointResult[]; lcp: LcpResult[]; bidsWritten: number }) {
  const checks: { what: string; target: string; measured: string; met: boolean; missedBy: string | null }[] = [];
  for (const r of o.results) {
    const t = TARGETS[r.name];
    if (!t) continue;
    if (t.p99Ms !== undefined) {
      const met = r.p99Ms <= t.p99Ms;
      checks.push({ what: `${r.name} p99`, target: `≤ ${t.p99Ms} ms`, measured: `${r.p99Ms} ms`, met, missedBy: met ? null : `${Math.round((r.p99Ms - t.p99Ms) * 10) / 10} ms` });
    }
    if (t.minRatio !== undefined) {
      const met = r.ratioToHealth >= t.minRatio;
      checks.push({
        what: `${r.name} throughput / health`,
        target: `≥ ${t.minRatio * 100} %`,
        measured: `${(r.ratioToHealth * 100).toFixed(1)} % (by CPU ${(r.cpuRatioToHealth * 100).toFixed(1)} %)`,
        met,
        missedBy: met ? null : `${((t.minRatio - r.ratioToHealth) * 100).toFixed(1)} points`,
      });
    }
  }
  for (const l of o.lcp) {
    const met = l.coldMedianMs < LCP_TARGET_MS;
    checks.push({ what: `LCP ${l.path} (empty cache)`, target: `< ${LCP_TARGET_MS} ms`, measured: `${l.coldMedianMs} ms`, met, missedBy: met ? null : `${l.coldMedianMs - LCP_TARGET_MS} ms` });
  }
  console.log('\nTargets');
  for (const c of checks) console.log(`  ${c.met ? 'met   ' : 'MISSED'} ${c.what.padEnd(28)} ${c.measured.padStart(24)}  (target ${c.target}${c.missedBy ? `, missed by ${c.missedBy}` : ''})`);
  const summary = {
    startedAt: o.startedAt.toISOString(),
    finishedAt: new Date().toISOString(),
    machine: { cpus: os.cpus().length, model: os.cpus()[0]?.model ?? 'unknown', memoryGiB: Math.round(os.totalmem() / 2 ** 30), loadAverageAtEnd: load() },
    driver: 'wrk (2 threads) with scripts/lib/bench/wrk.lua',
    connections: CONNECTIONS,
    secondsPerEndpoint: SECONDS,
    warmupSeconds: WARMUP_SECONDS,
    endpoints: o.results,
    bidsWritten: o.bidsWritten,
    largestContentfulPaint: o.lcp,
    targets: checks,
  };
  fs.mkdirSync(path.dirname(OUT_FILE), { recursive: true });
  fs.writeFileSync(OUT_FILE, JSON.stringify(summary, null, 2) + '\n');
  console.log(`\nFigures written to ${path.relative(root, OUT_FILE)}`);
}

main().then(
  () => process.exit(0),
  async (err) => {
    console.error('\nThe benchmark failed:', err instanceof Error ? err.message : err);
    await stopAll();
    process.exit(1);
  },
);
