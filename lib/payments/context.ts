// What every payments function works with: the database, a processor client and the money settings.
// Route handlers and the worker use the app's own (defaultContext.ts); tests pass theirs.
import type { Knex } from 'knex';
import Stripe from 'stripe';

export interface PaymentsSettings {
  /** The platform's referral fee, in basis points of what the builder is paid. */
  feeBps: number;
  /** Days after shipping when the worker confirms receipt unless a dispute is open. */
  autoConfirmDays: number;
  currency: 'usd';
  /** Base of the links sent to the processor (payment return, onboarding return) and in e-mail. */
  appUrl: string;
}

export interface PaymentsContext {
  db: Knex;
  stripe: Stripe;
  settings: PaymentsSettings;
}

export interface ProcessorAddress {
  host: string;
  port: number;
  protocol: 'http' | 'https';
  secretKey: string;
}

/** The official SDK pointed at the processor (or its local stand-in); retries are ours, keyed per step. */
export function createProcessorClient(a: ProcessorAddress): Stripe {
  return new Stripe(a.secretKey, { host: a.host, port: a.port, protocol: a.protocol, maxNetworkRetries: 0, telemetry: false, timeout: 15_000 });
}
