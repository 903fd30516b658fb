// The fake's whole state, kept as plain JSON and written atomically after each change
// so the fake keeps its objects across its own restarts.
import { mkdirSync, readFileSync, renameSync, writeFileSync, existsSync, rmSync } from 'node:fs';
import path from 'node:path';
import { randomToken } from './ids';

/** Stored API objects are kept in the API's JSON shape; a few fields are computed when rendered. */
export type ApiObject = { id: string; object: string; created: number; [field: string]: unknown };

export type Metadata = Record<string, string>;

export interface Customer extends ApiObject {
  object: 'customer';
  email: string | null;
  name: string | null;
  description: string | null;
  phone: string | null;
  metadata: Metadata;
}

export type PaymentIntentStatus =
  | 'requires_payment_method'
  | 'requires_confirmation'
  | 'requires_action'
  | 'processing'
  | 'succeeded'
  | 'canceled';

export interface LastPaymentError {
  type: 'card_error' | 'invalid_request_error';
  code: string;
  decline_code?: string;
  message: string;
  charge?: string;
  payment_method?: ApiObject;
  doc_url?: string;
}

export interface PaymentIntent extends ApiObject {
  object: 'payment_intent';
  amount: number;
  amount_received: number;
  currency: string;
  customer: string | null;
  description: string | null;
  metadata: Metadata;
  transfer_group: string | null;
  status: PaymentIntentStatus;
  client_secret: string;
  latest_charge: string | null;
  payment_method: string | null;
  last_payment_error: LastPaymentError | null;
  canceled_at: number | null;
  cancellation_reason: string | null;
  receipt_email: string | null;
}

export interface PaymentMethod extends ApiObject {
  object: 'payment_method';
  type: 'card';
  card: {
    brand: string;
    last4: string;
    exp_month: number;
    exp_year: number;
    funding: string;
    country: string;
    fingerprint: string;
    [field: string]: unknown;
  };
  billing_details: { name: string | null; [field: string]: unknown };
}

export interface Charge extends ApiObject {
  object: 'charge';
  amount: number;
  amount_captured: number;
  amount_refunded: number;
  currency: string;
  customer: string | null;
  payment_intent: string;
  status: 'succeeded' | 'failed';
  paid: boolean;
  refunded: boolean;
  balance_transaction: string | null;
  transfer_group: string | null;
  metadata: Metadata;
  failure_code: string | null;
  failure_message: string | null;
}

export interface Refund extends ApiObject {
  object: 'refund';
  amount: number;
  charge: string;
  payment_intent: string;
  currency: string;
  status: 'succeeded';
  balance_transaction: string;
  metadata: Metadata;
  reason: string | null;
}

export interface Account extends ApiObject {
  object: 'account';
  type: 'express' | 'custom' | 'standard';
  country: string;
  email: string | null;
  default_currency: string;
  charges_enabled: boolean;
  payouts_enabled: boolean;
  details_submitted: boolean;
  capabilities: Record<string, 'active' | 'inactive' | 'pending'>;
  metadata: Metadata;
  business_type: string | null;
  business_profile: Record<string, unknown>;
  tos_acceptance: { date: number | null; ip: string | null; user_agent: string | null };
}

export interface AccountLinkRecord {
  token: string;
  account: string;
  type: 'account_onboarding' | 'account_update';
  refresh_url: string;
  return_url: string;
  created: number;
  expires_at: number;
  /** Set on the first visit; a second visit counts as a used link. */
  opened_session: string | null;
  completed: boolean;
}

export interface Transfer extends ApiObject {
  object: 'transfer';
  amount: number;
  amount_reversed: number;
  currency: string;
  destination: string;
  destination_payment: string;
  source_transaction: string | null;
  transfer_group: string | null;
  description: string | null;
  reversed: boolean;
  balance_transaction: string;
  metadata: Metadata;
}

export interface TransferReversal extends ApiObject {
  object: 'transfer_reversal';
  amount: number;
  currency: string;
  transfer: string;
  balance_transaction: string;
  destination_payment_refund: string;
  metadata: Metadata;
}

export interface BalanceTransaction extends ApiObject {
  object: 'balance_transaction';
  amount: number;
  currency: string;
  available_on: number;
  type: 'charge' | 'refund' | 'transfer' | 'transfer_refund';
  source: string;
  net: number;
  fee: number;
  description: string | null;
}

export interface EventObject extends ApiObject {
  object: 'event';
  type: string;
  api_version: string;
  data: { object: Record<string, unknown>; previous_attributes?: Record<string, unknown> };
  livemode: false;
  pending_webhooks: number;
  request: { id: string | null; idempotency_key: string | null };
  account?: string;
}

export type DeliveryStatus = 'pending' | 'held' | 'delivered' | 'failed' | 'no_endpoint';

export interface DeliveryAttempt {
  at: number;
  status: number | null;
  error: string | null;
  kind: 'automatic' | 'retry' | 'flush' | 'resend';
}

export interface DeliveryRecord {
  event: string;
  status: DeliveryStatus;
  attempts: DeliveryAttempt[];
}

export interface IdempotencyRecord {
  method: string;
  path: string;
  fingerprint: string;
  status: number;
  body: string;
  created: number;
}

export interface State {
  version: 1;
  customers: Record<string, Customer>;
  paymentIntents: Record<string, PaymentIntent>;
  paymentIntentReturnUrls: Record<string, string>;
  paymentMethods: Record<string, PaymentMethod>;
  /** The test card number behind each payment method (the API never shows it). */
  paymentMethodCardNumbers: Record<string, string>;
  charges: Record<string, Charge>;
  refunds: Record<string, Refund>;
  accounts: Record<string, Account>;
  accountLinks: Record<string, AccountLinkRecord>;
  transfers: Record<string, Transfer>;
  reversals: Record<string, TransferReversal>;
  balanceTransactions: Record<string, BalanceTransaction>;
  events: Record<string, EventObject>;
  deliveries: Record<string, DeliveryRecord>;
  idempotency: Record<string, IdempotencyRecord>;
}

export function emptyState(): State {
  return {
    version: 1,
    customers: {},
    paymentIntents: {},
    paymentIntentReturnUrls: {},
    paymentMethods: {},
    paymentMethodCardNumbers: {},
    charges: {},
    refunds: {},
    accounts: {},
    accountLinks: {},
    transfers: {},
    reversals: {},
    balanceTransactions: {},
    events: {},
    deliveries: {},
    idempotency: {},
  };
}

export function loadState(dataFile: string | undefined): State {
  if (!dataFile || !existsSync(dataFile)) return emptyState();
  const text = readFileSync(dataFile, 'utf8');
  let parsed: Partial<State>;
  try {
    parsed = JSON.parse(text) as Partial<State>;
  } catch (err) {
    throw new Error(`payments fake: cannot parse its data file ${dataFile}: ${(err as Error).message}`);
  }
  if (parsed.version !== 1) throw new Error(`payments fake: unknown data file version in ${dataFile}`);
  // Collections added later start empty when an older file is loaded.
  return { ...emptyState(), ...parsed };
}

/** Write to a temporary file beside the target, then rename over it: a crash never leaves half a file. */
export function saveState(dataFile: string | undefined, state: State): void {
  if (!dataFile) return;
  mkdirSync(path.dirname(dataFile), { recursive: true });
  const tmp = `${dataFile}.${process.pid}.${randomToken(8)}.tmp`;
  try {
    writeFileSync(tmp, JSON.stringify(state));
    renameSync(tmp, dataFile);
  } catch (err) {
    rmSync(tmp, { force: true });
    throw err;
  }
}
