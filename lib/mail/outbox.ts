// E-mail outbox: notices are written in the same transaction as the change that causes them, and a
// worker sends them later. Each row is sent while its lock is held, so two workers never send it twice.
import type { Knex } from 'knex';
import type { MailContent } from './transport';

export interface OutboxMail extends MailContent {
  /** What the notice is about, e.g. "bid.new"; for the mailbox and the logs. */
  kind: string;
  /** Notices that must go out at most once (an expiry warning) carry a key; a repeat is ignored. */
  dedupeKey?: string;
}

export type MailSender = (message: MailContent) => Promise<void>;

/** After this many failed attempts a row is set aside as dead instead of retried. */
export const MAX_ATTEMPTS = 10;
const FIRST_RETRY_MS = 30_000;
const MAX_RETRY_MS = 60 * 60_000;

/** 30 s, 1 min, 2 min, … up to an hour between attempts. */
export function retryDelayMs(attempts: number): number {
  return Math.min(MAX_RETRY_MS, FIRST_RETRY_MS * 2 ** Math.max(0, attempts - 1));
}

/** Writes notices inside the caller's transaction; they go out only if it commits. */
export async function enqueueMail(trx: Knex, mails: OutboxMail | OutboxMail[]): Promise<void> {
  const list = Array.isArray(mails) ? mails : [mails];
  if (list.length === 0) return;
  await trx('outbox')
    .insert(
      list.map((m) => ({
        kind: m.kind,
        to_email: m.to,
        subject: m.subject,
        text_body: m.text,
        html_body: m.html,
        dedupe_key: m.dedupeKey ?? null,
      })),
    )
    .onConflict('dedupe_key')
    .ignore();
}

export interface DeliveryOptions {
  /** Defaults to the app's SMTP transport; tests pass their own. */
  send?: MailSender;
  now?: Date;
  /** Most rows to try in one call. */
  limit?: number;
}

export interface DeliveryReport {
  sent: number;
  failed: number;
}

async function defaultSender(): Promise<MailSender> {
  // Loaded on first use: the transport is server-only, and seeds import this module for enqueueMail.
  const { sendMail } = await import('./transport');
  return sendMail;
}

/** Sends the mail that is due, one locked row at a time; failures wait longer before each retry. */
export async function deliverDueMail(db: Knex, options: DeliveryOptions = {}): Promise<DeliveryReport> {
  const send = options.send ?? (await defaultSender());
  const limit = options.limit ?? 100;
  const report: DeliveryReport = { sent: 0, failed: 0 };
  for (let i = 0; i < limit; i++) {
    const now = options.now ?? new Date();
    const done = await db.transaction(async (trx) => {
      const row = await trx('outbox')
        .where({ status: 'pending' })
        .andWhere('next_attempt_at', '<=', now)
        .orderBy('next_attempt_at')
        .first('id', 'to_email', 'subject', 'text_body', 'html_body', 'attempts')
        .forUpdate()
        .skipLocked();
      if (!row) return true;
      try {
        await send({ to: row.to_email, subject: row.subject, text: row.text_body, html: row.html_body });
        await trx('outbox').where({ id: row.id }).update({ status: 'sent', sent_at: trx.fn.now(), attempts: row.attempts + 1, last_error: null });
        report.sent += 1;
      } catch (err) {
        const attempts = row.attempts + 1;
        await trx('outbox')
          .where({ id: row.id })
          .update({
            attempts,
            status: attempts >= MAX_ATTEMPTS ? 'dead' : 'pending',
            next_attempt_at: new Date(now.getTime() + retryDelayMs(attempts)),
            last_error: String((err as Error)?.message ?? err).slice(0, 500),
          });
        report.failed += 1;
      }
      return false;
    });
    if (done) break;
  }
  return report;
}
