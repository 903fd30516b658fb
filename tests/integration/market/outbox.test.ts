import nodemailer from 'nodemailer';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { startMailCatcher, type MailCatcher } from '@/lib/fakes/mail/catcher';
import { deliverDueMail, enqueueMail, retryDelayMs, MAX_ATTEMPTS, type MailSender } from '@/lib/mail/outbox';
import { freePort } from '../../../scripts/lib/postgres';
import { uniqueEmail } from '../../support/db';
import { ownDatabase } from './fixtures';

let db: Knex;
let catcher: MailCatcher | null = null;
let smtpPort: number;
let apiPort: number;

beforeAll(async () => {
  db = await ownDatabase('outbox');
  smtpPort = await freePort();
  apiPort = await freePort();
});
afterAll(async () => {
  await catcher?.close();
  await db?.destroy();
});

/** nodemailer over plain SMTP to the test's own catcher port (which may have nobody listening). */
function smtpSender(port: number): MailSender {
  const transport = nodemailer.createTransport({ host: '127.0.0.1', port, secure: false, ignoreTLS: true, connectionTimeout: 2_000 });
  return async (m) => {
    await transport.sendMail({ from: 'Lacewright <no-reply@lacewright.test>', ...m });
  };
}

const caught = async (to: string) =>
  ((await (await fetch(`http://127.0.0.1:${apiPort}/messages?to=${encodeURIComponent(to)}`)).json()) as { subject: string }[]);

async function queue(to: string, n: number, prefix = 'Notice') {
  await enqueueMail(
    db,
    Array.from({ length: n }, (_, i) => ({ kind: 'test', to, subject: `${prefix} ${i + 1}`, text: `Body ${i + 1}`, html: `<p>Body ${i + 1}</p>` })),
  );
}

describe('the outbox', () => {
  it('keeps mail while SMTP is down, retries with backoff, then sends each message exactly once', async () => {
    const to = uniqueEmail('outbox');
    await queue(to, 3);
    const send = smtpSender(smtpPort);

    // Nothing listens on the port yet.
    const down = await deliverDueMail(db, { send });
    expect(down).toEqual({ sent: 0, failed: 3 });
    const waiting = await db('outbox').where({ to_email: to });
    expect(waiting.every((r) => r.status === 'pending' && r.attempts === 1 && r.last_error)).toBe(true);
    expect(waiting.every((r) => r.next_attempt_at.getTime() > Date.now() + retryDelayMs(1) - 5_000)).toBe(true);
    // Not due yet: a second pass right away leaves them alone.
    expect(await deliverDueMail(db, { send })).toEqual({ sent: 0, failed: 0 });

    catcher = await startMailCatcher({ smtpPort, apiPort });
    // Once the backoff has passed the rows are due again.
    const later = new Date(Date.now() + retryDelayMs(1) + 1_000);
    expect(await deliverDueMail(db, { send, now: later })).toEqual({ sent: 3, failed: 0 });
    const rows = await db('outbox').where({ to_email: to });
    expect(rows.every((r) => r.status === 'sent' && r.sent_at && r.attempts === 2)).toBe(true);
    expect((await caught(to)).map((m) => m.subject).sort()).toEqual(['Notice 1', 'Notice 2', 'Notice 3']);

    // And never again.
    expect(await deliverDueMail(db, { send, now: new Date(Date.now() + 86_400_000) })).toEqual({ sent: 0, failed: 0 });
    expect(await caught(to)).toHaveLength(3);
  });

  it('never sends a row twice when several workers deliver at once', async () => {
    catcher ??= await startMailCatcher({ smtpPort, apiPort });
    const to = uniqueEmail('parallel');
    await queue(to, 24, 'Parallel');
    const send = smtpSender(smtpPort);
    const reports = await Promise.all([deliverDueMail(db, { send }), deliverDueMail(db, { send }), deliverDueMail(db, { send })]);
    expect(reports.reduce((n, r) => n + r.sent, 0)).toBe(24);
    const subjects = (await caught(to)).map((m) => m.subject);
    expect(subjects).toHaveLength(24);
    expect(new Set(subjects).size).toBe(24);
  });

  it('sets a row aside after too many failures', async () => {
    const to = uniqueEmail('dead');
    await queue(to, 1, 'Doomed');
    const failing: MailSender = async () => {
      throw new Error('mailbox unavailable');
    };
    let now = Date.now();
    for (let i = 0; i < MAX_ATTEMPTS; i++) {
      await deliverDueMail(db, { send: failing, now: new Date(now) });
      now += retryDelayMs(i + 1) + 1_000;
    }
    const row = await db('outbox').where({ to_email: to }).first();
    expect(row).toMatchObject({ status: 'dead', attempts: MAX_ATTEMPTS, last_error: 'mailbox unavailable' });
  });

  it('writes a deduplicated notice only once', async () => {
    const to = uniqueEmail('dedupe');
    const mail = { kind: 'test', to, subject: 'Once', text: 'Once', html: '<p>Once</p>', dedupeKey: `once:${to}` };
    await enqueueMail(db, mail);
    await enqueueMail(db, mail);
    expect(await db('outbox').where({ to_email: to })).toHaveLength(1);
  });

  it('backs off 30 s, 1 min, 2 min … up to an hour', () => {
    expect([1, 2, 3, 4].map(retryDelayMs)).toEqual([30_000, 60_000, 120_000, 240_000]);
    expect(retryDelayMs(20)).toBe(3_600_000);
  });
});
