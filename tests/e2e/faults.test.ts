// Faults while the whole stack runs: the SMTP catcher down then back (the mail goes out later, once), the
// payments service dropping connections mid-payment, payment events late, duplicated and out of order, and
// Postgres restarted under the running app (which recovers by itself and loses nothing committed).
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { ledgerProblems } from '@/lib/payments/ledger';
import { startCluster, stopCluster } from '../../scripts/lib/postgres';
import { caughtMail, Visitor } from '../support/http';
import { recordProof } from '../support/summary';
import { appDb, signInAll, until, World, type Principal } from './authz-matrix.fixtures';
import { MATRIX } from './authz-matrix.table';

const appUrl = inject('appUrl');
const paymentsUrl = inject('paymentsFakeUrl');
let db: Knex;
let world: World;
let visitors: Record<Principal, Visitor>;
const tally = { faultsInjected: 0, lostRecords: 0, duplicatedRecords: 0 };

beforeAll(async () => {
  db = appDb();
  const signedIn = await signInAll(db);
  visitors = signedIn.visitors;
  world = new World(db, signedIn.users);
});
afterAll(async () => {
  recordProof('faults', tally);
  await world?.cancelOpenRequests();
  await db?.destroy();
});

function exactly(count: number, expected: number, what: string): void {
  if (count < expected) tally.lostRecords += expected - count;
  if (count > expected) tally.duplicatedRecords += count - expected;
  expect(count, what).toBe(expected);
}

async function control(p: string, body?: unknown, method = 'POST'): Promise<Record<string, unknown>> {
  const res = await fetch(`${paymentsUrl}${p}`, { method, headers: { 'content-type': 'application/json' }, body: method === 'GET' ? undefined : JSON.stringify(body ?? {}) });
  return (await res.json()) as Record<string, unknown>;
}

// ------------------------------------------------------------------ the mail catcher as a process

/** The mail catcher this suite's stack started: found by its command and the API port it was given. */
function findMailCatcher(): { pid: number; cmdline: string[]; env: NodeJS.ProcessEnv; cwd: string } {
  const apiPort = new URL(inject('mailApiUrl')).port;
  const candidates: { pid: number; cmdline: string[]; env: NodeJS.ProcessEnv; cwd: string }[] = [];
  for (const entry of fs.readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const cmdline = fs.readFileSync(`/proc/${entry}/cmdline`, 'utf8').split('\0').filter(Boolean);
      if (!cmdline.some((a) => a.endsWith('scripts/mail-catcher.ts'))) continue;
      const env = Object.fromEntries(
        fs
          .readFileSync(`/proc/${entry}/environ`, 'utf8')
          .split('\0')
          .filter(Boolean)
          .map((kv) => [kv.slice(0, kv.indexOf('=')), kv.slice(kv.indexOf('=') + 1)]),
      );
      if (env.MAIL_CATCHER_API_PORT !== apiPort) continue;
      candidates.push({ pid: Number(entry), cmdline, env: env as NodeJS.ProcessEnv, cwd: fs.readlinkSync(`/proc/${entry}/cwd`) });
    } catch {
      /* gone, or not ours to read */
    }
  }
  // tsx runs the script in a child node process; the first (lowest pid) is the group leader the stack spawned.
  candidates.sort((a, b) => a.pid - b.pid);
  if (!candidates[0]) throw new Error(`no mail catcher with API port ${apiPort}`);
  return candidates[0];
}

const portOpen = async (url: string) => {
  try {
    return (await fetch(url, { signal: AbortSignal.timeout(1_000) })).ok;
  } catch {
    return false;
  }
};

// Restarted catchers live until the test run's main process ends (the stack's own teardown does not know
// them), so each is started under a small watchdog that stops it then.
const WATCHDOG = `
const { spawn } = require('node:child_process');
const [owner, command, ...args] = process.argv.slice(1);
const child = spawn(command, args, { stdio: 'ignore' });
const stop = () => { try { child.kill('SIGTERM'); } catch {} process.exit(0); };
setInterval(() => { try { process.kill(Number(owner), 0); } catch { stop(); } }, 1000);
child.on('exit', () => process.exit(0));
process.on('SIGTERM', stop);
`;

async function restartMailCatcher(original: ReturnType<typeof findMailCatcher>, owner: number): Promise<void> {
  const [command, ...args] = original.cmdline[0].endsWith('node') && original.cmdline[1]?.endsWith('/tsx') ? original.cmdline.slice(1) : original.cmdline;
  const watchdog = spawn(process.execPath, ['-e', WATCHDOG, String(owner), command, ...args], { env: original.env, cwd: original.cwd, detached: true, stdio: 'ignore' });
  watchdog.unref();
  await until(() => portOpen(`${inject('mailApiUrl')}/health`), 'the mail catcher to answer again', 30_000);
}

describe('the SMTP catcher goes down and comes back', () => {
  it('keeps the notice in the outbox while mail cannot be sent, then sends it once', { timeout: 180_000 }, async () => {
    const catcher = findMailCatcher();
    const owner = Number(fs.readFileSync(`/proc/${catcher.pid}/stat`, 'utf8').split(') ')[1].split(' ')[1]); // the process that started it
    process.kill(-catcher.pid, 'SIGTERM'); // its process group: tsx and the script
    await until(async () => !(await portOpen(`${inject('mailApiUrl')}/health`)), 'the mail catcher to stop', 15_000);
    tally.faultsInjected += 1;

    let restarted = false;
    try {
      // A bid makes a notice to the rider, written to the outbox with the bid.
      const { requestId } = await world.requestWithBid();
      const rider = await db('users').where({ id: world.users.riderA.id }).first('email');
      const row = () => db('outbox').where({ kind: 'bid.new', to_email: rider.email }).andWhere('text_body', 'like', `%${requestId}%`).first();
      await until(async () => ((await row())?.attempts ?? 0) >= 1, 'the worker to try and fail', 30_000);
      expect(await row()).toMatchObject({ status: 'pending', sent_at: null });
      expect((await row()).last_error).toBeTruthy();

      // An e-mailed sign-in link cannot go either: a plain refusal, not a crash.
      const linkVisitor = new Visitor();
      const csrfToken = await linkVisitor.csrfToken();
      const link = await linkVisitor.request('/api/auth/signin/email', { method: 'POST', headers: { 'x-forwarded-for': '203.0.113.201' }, form: { csrfToken, email: 'rider@demo.lacewright.test', callbackUrl: '/welcome', json: 'true' } });
      expect(link.status).toBeLessThan(500);
      expect(JSON.stringify(await link.json())).toContain('error=EmailSignin');
      tally.faultsInjected += 1;

      await restartMailCatcher(catcher, owner);
      restarted = true;
      // The backoff would wait 30 s; bring the retry forward instead of sleeping.
      await db('outbox').where({ id: (await row()).id }).update({ next_attempt_at: db.fn.now() });
      await until(async () => (await row()).status === 'sent', 'the notice to be sent', 30_000);
      await new Promise((r) => setTimeout(r, 5_000)); // a few more worker passes
      const caught = (await caughtMail(rider.email)).filter((m) => m.text.includes(requestId));
      exactly(caught.length, 1, 'mails caught for the bid notice');
      expect((await row()).attempts).toBe(2);
    } finally {
      if (!restarted && !(await portOpen(`${inject('mailApiUrl')}/health`))) await restartMailCatcher(catcher, owner);
    }
  });
});

describe('the payments service misbehaves', () => {
  it('drops connections mid-payment: the rider is told plainly, nothing is half-done, and trying again pays exactly once', { timeout: 120_000 }, async () => {
    await world.ensurePayouts();
    const { jobId } = await world.acceptedJob();
    const rider = visitors.riderA;
    await control('/_test/fail-next', { count: 3, mode: 'disconnect' });
    tally.faultsInjected += 3;
    const statuses: number[] = [];
    let redirectUrl = '';
    for (let i = 0; i < 6 && !redirectUrl; i++) {
      const res = await rider.request(`/api/jobs/${jobId}/pay`, { method: 'POST' });
      const body = (await res.json()) as { redirectUrl?: string; error?: string };
      statuses.push(res.status);
      if (res.status === 200) redirectUrl = body.redirectUrl!;
      else {
        expect(res.status).toBe(503);
        expect(body.error).toMatch(/payment service/i);
        expect((await db('jobs').where({ id: jobId }).first('status')).status).toBe('awaiting_payment');
      }
    }
    expect(statuses[0]).toBe(503);
    expect(redirectUrl).toMatch(/\/pay\//);
    const intents = await world.ctx.stripe.paymentIntents.list({ limit: 100 });
    exactly(intents.data.filter((pi) => pi.metadata?.jobId === jobId).length, 1, 'payment intents at the processor');

    const intent = decodeURIComponent(new URL(redirectUrl).pathname.split('/').pop()!);
    await control(`/_test/payment_intents/${intent}/pay`, { card: '4242424242424242' });
    await until(async () => (await db('jobs').where({ id: jobId }).first('status')).status === 'funded', 'the job to be funded');
    exactly((await db('ledger_transactions').where({ job_id: jobId, kind: 'charge' })).length, 1, 'charges booked');
    expect(await ledgerProblems(db, await db('jobs').where({ id: jobId }).first())).toEqual([]);
  });

  it('events that arrive late, twice and in reverse order fund the job once', { timeout: 120_000 }, async () => {
    await world.ensurePayouts();
    const { jobId } = await world.acceptedJob();
    const { redirectUrl } = (await (await visitors.riderA.request(`/api/jobs/${jobId}/pay`, { method: 'POST' })).json()) as { redirectUrl: string };
    const intent = decodeURIComponent(new URL(redirectUrl).pathname.split('/').pop()!);
    await control('/_test/webhooks/pause');
    try {
      // The first card is declined, the second goes through: two events held back.
      await control(`/_test/payment_intents/${intent}/pay`, { card: '4000000000000002' });
      await control(`/_test/payment_intents/${intent}/pay`, { card: '4242424242424242' });
      await new Promise((r) => setTimeout(r, 1_500));
      expect((await db('jobs').where({ id: jobId }).first('status')).status).toBe('awaiting_payment'); // late: nothing yet
      tally.faultsInjected += 1;
    } finally {
      // Delivered newest first.
      await fetch(`${paymentsUrl}/_test/webhooks/flush?order=reverse`, { method: 'POST' });
      await control('/_test/webhooks/resume');
    }
    tally.faultsInjected += 1;
    await until(async () => (await db('jobs').where({ id: jobId }).first('status')).status === 'funded', 'the job to be funded');
    // Every event about this payment, delivered once more.
    const events = await world.ctx.stripe.events.list({ limit: 100 });
    const ours = events.data.filter((e) => (e.data.object as { metadata?: { jobId?: string } }).metadata?.jobId === jobId);
    expect(ours.length).toBeGreaterThanOrEqual(2);
    for (const e of ours) await control(`/_test/events/${e.id}/resend`);
    tally.faultsInjected += ours.length;
    await new Promise((r) => setTimeout(r, 1_500));
    const job = await db('jobs').where({ id: jobId }).first();
    expect(job.status).toBe('funded');
    exactly((await db('ledger_transactions').where({ job_id: jobId, kind: 'charge' })).length, 1, 'charges booked');
    expect(await ledgerProblems(db, job)).toEqual([]);
  });
});

describe('Postgres restarts under the running app', () => {
  it('answers plainly while it is down, recovers without a restart, and keeps everything committed', { timeout: 180_000 }, async () => {
    const rider = visitors.riderA;
    const body = MATRIX.find((m) => m.route === '/api/requests' && m.method === 'POST')!.body!({}, { world, visitors, unique: (p) => p });
    const posted = await rider.request('/api/requests', { method: 'POST', json: { ...(body as object), title: 'Committed before the restart' } });
    expect(posted.status).toBe(201);
    const { id } = (await posted.json()) as { id: string };
    const before = Number((await db('wheel_requests').count({ n: '*' }))[0].n);
    await db.destroy(); // our own connections go too
    // Give the WAL writer a moment: the throwaway cluster runs with synchronous_commit off, a speed setting
    // for tests that a crash right after a commit could otherwise show.
    await new Promise((r) => setTimeout(r, 1_000));

    const dir = inject('appClusterDir');
    stopCluster(dir, 'immediate'); // as if the server crashed
    tally.faultsInjected += 1;
    try {
      const health = await fetch(`${appUrl}/api/health`);
      expect(health.status).toBe(503);
      const during = await rider.request('/api/requests', { method: 'POST', json: { ...(body as object), title: 'Posted while the database is down' } });
      expect(during.status).toBeGreaterThanOrEqual(500);
      expect(JSON.stringify(await during.json())).not.toMatch(/ECONNREFUSED|postgres|knex|at .*\.js/i);
    } finally {
      startCluster({ dir, port: inject('appClusterPort'), fast: true });
    }
    db = appDb();
    world = new World(db, world.users);

    // The same session, the same server process: answers again within a few tries.
    await until(async () => (await rider.request(`/api/requests/${id}`)).status === 200, 'the app to answer after the restart', 30_000);
    const again = await rider.request(`/api/requests/${id}`);
    expect(((await again.json()) as { title: string }).title).toBe('Committed before the restart');
    exactly(Number((await db('wheel_requests').count({ n: '*' }))[0].n), before, 'requests after the restart');
    expect(await db('wheel_requests').where({ title: 'Posted while the database is down' })).toHaveLength(0);
    const after = await rider.request('/api/requests', { method: 'POST', json: { ...(body as object), title: 'Posted after the restart' } });
    expect(after.status).toBe(201);
    expect((await new Visitor().signInWithPassword('rider2@demo.lacewright.test', 'lacewright-demo')).status).toBe(200);
    const home = await rider.request(`/requests/${id}`);
    expect(home.status).toBe(200);
    expect(await home.text()).toContain('Committed before the restart');
  });
});
