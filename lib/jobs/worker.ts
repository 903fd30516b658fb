// One tick of the background worker: time-driven market moves first, then the mail they caused.
import type { Knex } from 'knex';
import { deliverDueMail, type DeliveryReport, type MailSender } from '@/lib/mail/outbox';
import { expireDueBids, expireDueRequests, warnExpiringRequests } from '@/lib/market/expiry';
import { runPaymentsTick, type PaymentsTickReport } from '@/lib/payments/worker';
import { sendReviewReminders } from '@/lib/reviews/reminders';

export interface TickReport {
  bidsExpired: number;
  requestsExpired: number;
  requestsWarned: number;
  /** Auto-confirmed receipts, retried payouts and refunds. */
  payments: PaymentsTickReport;
  /** Reminders to write a review, one per side per completed job. */
  reviewReminders: number;
  mail: DeliveryReport;
}

export interface TickOptions {
  now?: Date;
  /** Defaults to the app's SMTP transport. */
  send?: MailSender;
}

export async function runWorkerTick(db: Knex, options: TickOptions = {}): Promise<TickReport> {
  const now = options.now ?? new Date();
  const bidsExpired = await expireDueBids(db, now);
  const requestsExpired = await expireDueRequests(db, now);
  const requestsWarned = await warnExpiringRequests(db, now);
  const payments = await runPaymentsTick(db, { now });
  // A failed reminder pass must not hold up the mail below; the next tick tries again.
  const reviewReminders = await sendReviewReminders(db, now).catch((err) => {
    console.error('worker: review reminders failed; next tick tries again', err);
    return 0;
  });
  const mail = await deliverDueMail(db, { send: options.send, now: options.now });
  return { bidsExpired, requestsExpired, requestsWarned, payments, reviewReminders, mail };
}
