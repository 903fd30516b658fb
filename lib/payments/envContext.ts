// The payments context from the app's settings, for any process that has a Knex instance (app, worker).
import type { Knex } from 'knex';
import type Stripe from 'stripe';
import { env } from '@/lib/env';
import { createProcessorClient, type PaymentsContext, type PaymentsSettings } from './context';

export const appPaymentsSettings: PaymentsSettings = {
  feeBps: env.PAYMENTS_REFERRAL_FEE_BPS,
  autoConfirmDays: env.PAYMENTS_AUTO_CONFIRM_DAYS,
  currency: 'usd',
  appUrl: env.APP_URL,
};

const cache = globalThis as unknown as { lacewrightProcessor?: Stripe };

export function processorFromEnv(): Stripe {
  cache.lacewrightProcessor ??= createProcessorClient({
    host: env.PAYMENTS_API_HOST,
    port: env.PAYMENTS_API_PORT,
    protocol: env.PAYMENTS_API_PROTOCOL,
    secretKey: env.PAYMENTS_SECRET_KEY,
  });
  return cache.lacewrightProcessor;
}

export function contextFor(db: Knex): PaymentsContext {
  return { db, stripe: processorFromEnv(), settings: appPaymentsSettings };
}

export const webhookSecret = (): string => env.PAYMENTS_WEBHOOK_SECRET;
