// One tick of the background worker: time-driven market moves first, then the mail they caused.
import type { Knex } from 'knex';
import { deliverDueMail, type DeliveryReport, type MailSender } from '@/lib/mail/outbox';
import { expireDueBids, expireDueRequests, warnExpiringRequests } from '@/lib/market/expiry';
import { runPaymentsTick, type PaymentsTickReport } from '@/lib/payments/worker';

export interface TickReport {
  bidsExpired: number;
  requestsExpired: number;
  requestsWarned: number;
  /** Auto-confirmed receipts, retried payouts and refunds. */
  payments: PaymentsTickReport;
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
  const mail = await deliverDueMail(db, { send: options.send, now: options.now });
  return { bidsExpired, requestsExpired, requestsWarned, payments, mail };
}
