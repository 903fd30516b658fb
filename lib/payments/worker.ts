// The payments part of the worker's tick: confirm receipt for shipped jobs whose waiting period is over
// (never for a disputed job), retry payouts and refunds that failed, and close payment pages of cancelled jobs.
import type { Knex } from 'knex';
import { closeAbandonedIntents } from './cancel';
import type { PaymentsContext } from './context';
import { contextFor } from './envContext';
import { autoConfirmDueJobs } from './fulfilment';
import { retryDuePayouts } from './payouts';
import { retryDueRefunds } from './refunds';

export interface PaymentsTickReport {
  autoConfirmed: number;
  payoutsSent: number;
  refundsSent: number;
  paymentPagesClosed: number;
}

export async function runPaymentsTick(db: Knex, options: { now?: Date; context?: PaymentsContext } = {}): Promise<PaymentsTickReport> {
  const ctx = options.context ?? contextFor(db);
  const now = options.now ?? new Date();
  // One pass failing (a database hiccup) must not stop the others or the rest of the worker's tick.
  const pass = async (name: string, fn: () => Promise<number>): Promise<number> => {
    try {
      return await fn();
    } catch (err) {
      console.error(`payments worker: ${name} failed; next tick tries again`, err);
      return 0;
    }
  };
  return {
    autoConfirmed: await pass('auto-confirm', () => autoConfirmDueJobs(ctx, now)),
    payoutsSent: await pass('payouts', () => retryDuePayouts(ctx, now)),
    refundsSent: await pass('refunds', () => retryDueRefunds(ctx, now)),
    paymentPagesClosed: await pass('payment pages', () => closeAbandonedIntents(ctx)),
  };
}
