// The fake's whole state, kept as plain JSON on disk so the fake keeps its objects across
// its own restarts.
import { appendFileSync, existsSync, mkdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
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

export type CollectionName = Exclude<keyof State, 'version'>;

type Change = [CollectionName, string, unknown];

/**
 * Keeps the state on disk as a snapshot (`dataFile`, replaced through a temporary file and a
 * rename) plus a journal (`dataFile.log`) with one line per saved change set, so each save
 * costs the size of what changed rather than of everything. The journal is folded into a new
 * snapshot on start, on close and whenever it grows large. A line cut short by a crash is
 * ignored, so each change set is all or nothing.
 */
export class StateStore {
  state: State;
  private readonly marked = new Map<CollectionName, Set<string>>();
  private journalBytes = 0;
  private snapshotBytes = 0;

  constructor(
    readonly dataFile: string | undefined,
    private readonly compactAfterBytes = 4_000_000,
  ) {
    this.state = this.load();
    this.compact();
  }

  private get journalFile(): string | undefined {
    return this.dataFile ? `${this.dataFile}.log` : undefined;
  }

  get dirty(): boolean {
    return this.marked.size > 0;
  }

  mark(collection: CollectionName, key: string): void {
    let keys = this.marked.get(collection);
    if (!keys) {
      keys = new Set();
      this.marked.set(collection, keys);
    }
    keys.add(key);
  }

  /** Appends everything marked since the last save as one journal line. */
  save(): void {
    if (!this.dirty) return;
    const changes: Change[] = [];
    for (const [collection, keys] of this.marked) {
      const table = this.state[collection] as Record<string, unknown>;
      for (const key of keys) changes.push([collection, key, table[key] ?? null]);
    }
    this.marked.clear();
    if (!this.dataFile) return;
    const line = `${JSON.stringify({ c: changes })}\n`;
    mkdirSync(path.dirname(this.dataFile), { recursive: true });
    appendFileSync(this.journalFile!, line);
    this.journalBytes += Buffer.byteLength(line);
    // Folding in when the journal outgrows the snapshot keeps the cost per save constant on average.
    if (this.journalBytes > Math.max(this.compactAfterBytes, this.snapshotBytes)) this.compact();
  }

  /** Writes the whole state as the new snapshot, then drops the journal it now contains. */
  compact(): void {
    this.marked.clear();
    if (!this.dataFile) return;
    mkdirSync(path.dirname(this.dataFile), { recursive: true });
    const tmp = `${this.dataFile}.${process.pid}.${randomToken(8)}.tmp`;
    try {
      const text = JSON.stringify(this.state);
      writeFileSync(tmp, text);
      renameSync(tmp, this.dataFile);
      this.snapshotBytes = text.length;
    } catch (err) {
      rmSync(tmp, { force: true });
      throw err;
    }
    // Replaying a journal over a snapshot that already holds it is harmless, so a crash here loses nothing.
    rmSync(this.journalFile!, { force: true });
    this.journalBytes = 0;
  }

  /** Starts over with an empty state (the reset control). */
  reset(): void {
    this.state = emptyState();
    this.compact();
  }

  private load(): State {
    const file = this.dataFile;
    if (!file) return emptyState();
    let state = emptyState();
    if (existsSync(file)) {
      let parsed: Partial<State>;
      try {
        parsed = JSON.parse(readFileSync(file, 'utf8')) as Partial<State>;
      } catch (err) {
        throw new Error(`payments fake: cannot parse its data file ${file}: ${(err as Error).message}`);
      }
      if (parsed.version !== 1) throw new Error(`payments fake: unknown data file version in ${file}`);
      // Collections added later start empty when an older file is loaded.
      state = { ...emptyState(), ...parsed };
    }
    const journal = this.journalFile!;
    if (existsSync(journal)) {
      for (const line of readFileSync(journal, 'utf8').split('\n')) {
        if (!line.trim()) continue;
        let entry: { c: Change[] };
        try {
          entry = JSON.parse(line) as { c: Change[] };
        } catch {
          break; // the last save was cut short
        }
        for (const [collection, key, value] of entry.c) {
          const table = state[collection] as Record<string, unknown> | undefined;
          if (!table) continue;
          if (value === null) delete table[key];
          else table[key] = value;
        }
      }
    }
    return state;
  }
}
