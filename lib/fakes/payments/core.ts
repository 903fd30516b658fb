// The fake's objects and the rules that change them. Everything here is synchronous over
// one in-memory state; the HTTP layer saves the state and hands new events to the dispatcher.
import { createHash } from 'node:crypto';
import { ApiError, invalidParam, noSuch, stateError } from './errors';
import { newId, nowSeconds, randomToken } from './ids';
import { mergeMetadata, Params } from './params';
import {
  findTestCard,
  TEST_PAYMENT_METHOD_TOKENS,
  type CardOutcome,
  type TestCard,
} from './cards';
import type {
  Account,
  AccountLinkRecord,
  ApiObject,
  BalanceTransaction,
  CollectionName,
  Charge,
  Customer,
  EventObject,
  LastPaymentError,
  PaymentIntent,
  PaymentMethod,
  Refund,
  State,
  StateStore,
  Transfer,
  TransferReversal,
} from './store';

/** The API version stamped on events; matches what stripe-node 23.1.0 pins. */
export const FAKE_API_VERSION = '2026-10-28.endive';

export interface RequestContext {
  requestId: string | null;
  idempotencyKey: string | null;
}

export const NO_REQUEST: RequestContext = { requestId: null, idempotencyKey: null };

export interface CoreOptions {
  /** Seconds before a charge's funds move from pending to available (0 = at once). */
  fundsAvailableAfterSeconds: number;
  /** Lifetime of an onboarding link. */
  accountLinkTtlSeconds: number;
}

export interface CardInput {
  number: string;
  expMonth: number;
  expYear: number;
  cvc?: string;
  name?: string;
}

type Json = Record<string, unknown>;

const PAYABLE_STATUSES = ['requires_payment_method', 'requires_confirmation', 'requires_action'] as const;
const CANCELABLE_STATUSES = [
  'requires_payment_method',
  'requires_capture',
  'requires_confirmation',
  'requires_action',
  'processing',
];

const ONBOARDING_FIELDS = [
  'business_profile.url',
  'external_account',
  'individual.dob.day',
  'individual.first_name',
  'individual.last_name',
  'tos_acceptance.date',
  'tos_acceptance.ip',
];

const COUNTRY_CURRENCY: Record<string, string> = { US: 'usd', CA: 'cad', GB: 'gbp', AU: 'aud', NZ: 'nzd', JP: 'jpy' };

function clone<T>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T;
}

function isHttpUrl(value: string): boolean {
  try {
    const u = new URL(value);
    return u.protocol === 'http:' || u.protocol === 'https:';
  } catch {
    return false;
  }
}

function minimumAmount(currency: string): number {
  // The API's minimum charge is about half a unit of a major currency; zero-decimal ones start at 1.
  return ['usd', 'eur', 'gbp', 'cad', 'aud', 'nzd', 'chf'].includes(currency) ? 50 : 1;
}

export function formatMoney(amount: number, currency: string): string {
  const zeroDecimal = ['jpy', 'krw', 'vnd', 'clp'].includes(currency);
  const value = zeroDecimal ? String(amount) : (amount / 100).toFixed(2);
  return `${value} ${currency.toUpperCase()}`;
}

const COLLECTION_OF: Record<string, CollectionName> = {
  customer: 'customers',
  payment_intent: 'paymentIntents',
  payment_method: 'paymentMethods',
  charge: 'charges',
  refund: 'refunds',
  account: 'accounts',
  transfer: 'transfers',
  transfer_reversal: 'reversals',
  balance_transaction: 'balanceTransactions',
  event: 'events',
};

export class PaymentsCore {
  baseUrl = '';
  /** Events created since the last commit, for the dispatcher. */
  private fresh: string[] = [];

  constructor(
    readonly store: StateStore,
    readonly options: CoreOptions,
  ) {}

  get state(): State {
    return this.store.state;
  }

  takeFreshEvents(): string[] {
    const out = this.fresh;
    this.fresh = [];
    return out;
  }

  /** Records that these stored objects changed, so the next save writes them. */
  private touch(...objects: ApiObject[]): void {
    for (const o of objects) this.store.mark(COLLECTION_OF[o.object], o.id);
  }

  private mark(collection: CollectionName, key: string): void {
    this.store.mark(collection, key);
  }

  // ---------------------------------------------------------------- rendering

  hostedPaymentUrl(piId: string): string {
    const returnUrl = this.state.paymentIntentReturnUrls[piId];
    const query = returnUrl ? `?return_url=${encodeURIComponent(returnUrl)}` : '';
    return `${this.baseUrl}/pay/${piId}${query}`;
  }

  renderPaymentIntent(pi: PaymentIntent): Json {
    const out: Json = clone(pi);
    const payable = (PAYABLE_STATUSES as readonly string[]).includes(pi.status);
    // The page where the rider pays; present while the intent can still be paid.
    out.next_action = payable
      ? {
          type: 'redirect_to_url',
          redirect_to_url: {
            url: this.hostedPaymentUrl(pi.id),
            return_url: this.state.paymentIntentReturnUrls[pi.id] ?? null,
          },
        }
      : null;
    return out;
  }

  renderAccount(acct: Account): Json {
    const out: Json = clone(acct);
    const due = acct.details_submitted ? [] : ONBOARDING_FIELDS;
    const requirements = {
      alternatives: [],
      current_deadline: null,
      currently_due: due,
      disabled_reason: acct.details_submitted ? null : 'requirements.past_due',
      errors: [],
      eventually_due: due,
      past_due: due,
      pending_verification: [],
    };
    out.requirements = requirements;
    out.future_requirements = {
      alternatives: [],
      current_deadline: null,
      currently_due: [],
      disabled_reason: null,
      errors: [],
      eventually_due: [],
      past_due: [],
      pending_verification: [],
    };
    const bank = acct.details_submitted
      ? [
          {
            id: `ba_${acct.id.slice(5)}`,
            object: 'bank_account',
            account: acct.id,
            account_holder_name: null,
            account_holder_type: null,
            bank_name: 'Test bank',
            country: acct.country,
            currency: acct.default_currency,
            default_for_currency: true,
            last4: '6789',
            status: 'new',
            metadata: {},
          },
        ]
      : [];
    out.external_accounts = {
      object: 'list',
      data: bank,
      has_more: false,
      total_count: bank.length,
      url: `/v1/accounts/${acct.id}/external_accounts`,
    };
    return out;
  }

  renderTransfer(tr: Transfer): Json {
    const out: Json = clone(tr);
    const reversals = this.reversalsOf(tr.id);
    out.reversals = {
      object: 'list',
      data: reversals.slice().reverse().slice(0, 10).map((r) => clone(r)),
      has_more: reversals.length > 10,
      total_count: reversals.length,
      url: `/v1/transfers/${tr.id}/reversals`,
    };
    return out;
  }

  renderBalanceTransaction(txn: BalanceTransaction): Json {
    const out: Json = clone(txn);
    out.status = txn.available_on <= nowSeconds() ? 'available' : 'pending';
    return out;
  }

  /** Any stored object by id, rendered; used by `expand`. */
  renderById(id: string): Json | undefined {
    const s = this.state;
    const table: [string, () => Json | undefined][] = [
      ['cus_', () => (s.customers[id] ? clone(s.customers[id]) : undefined)],
      ['pi_', () => (s.paymentIntents[id] ? this.renderPaymentIntent(s.paymentIntents[id]) : undefined)],
      ['pm_', () => (s.paymentMethods[id] ? clone(s.paymentMethods[id]) : undefined)],
      ['ch_', () => (s.charges[id] ? clone(s.charges[id]) : undefined)],
      ['re_', () => (s.refunds[id] ? clone(s.refunds[id]) : undefined)],
      ['acct_', () => (s.accounts[id] ? this.renderAccount(s.accounts[id]) : undefined)],
      ['trr_', () => (s.reversals[id] ? clone(s.reversals[id]) : undefined)],
      ['tr_', () => (s.transfers[id] ? this.renderTransfer(s.transfers[id]) : undefined)],
      ['txn_', () => (s.balanceTransactions[id] ? this.renderBalanceTransaction(s.balanceTransactions[id]) : undefined)],
      ['evt_', () => (s.events[id] ? clone(s.events[id]) : undefined)],
    ];
    for (const [prefix, get] of table) if (id.startsWith(prefix)) return get();
    return undefined;
  }

  /** `expand[]=latest_charge`, `expand[]=data.customer`, `expand[]=latest_charge.balance_transaction`. */
  expand(obj: Json, paths: string[]): Json {
    for (const p of paths) this.expandPath(obj, p.split('.'));
    return obj;
  }

  private expandPath(obj: Json, parts: string[]): void {
    if (parts.length === 0) return;
    const [head, ...rest] = parts;
    if (head === 'data' && Array.isArray(obj.data)) {
      for (const item of obj.data as Json[]) this.expandPath(item, rest);
      return;
    }
    let value = obj[head];
    if (typeof value === 'string') {
      const found = this.renderById(value);
      if (found) {
        obj[head] = found;
        value = found;
      }
    }
    if (value && typeof value === 'object' && !Array.isArray(value)) this.expandPath(value as Json, rest);
  }

  // ---------------------------------------------------------------- events

  private emit(
    type: string,
    object: Json,
    ctx: RequestContext,
    previous?: Record<string, unknown>,
    account?: string,
  ): EventObject {
    const event: EventObject = {
      id: newId('evt'),
      object: 'event',
      ...(account ? { account } : {}),
      api_version: FAKE_API_VERSION,
      created: nowSeconds(),
      data: { object, ...(previous ? { previous_attributes: previous } : {}) },
      livemode: false,
      pending_webhooks: 1,
      request: { id: ctx.requestId, idempotency_key: ctx.idempotencyKey },
      type,
    };
    this.state.events[event.id] = event;
    this.state.deliveries[event.id] = { event: event.id, status: 'pending', attempts: [] };
    this.fresh.push(event.id);
    this.mark('events', event.id);
    this.mark('deliveries', event.id);
    return event;
  }

  retrieveEvent(id: string): Json {
    const evt = this.state.events[id];
    if (!evt) throw noSuch('event', id, 'id', 404);
    return clone(evt);
  }

  listEvents(p: Params): Json {
    const types = [...p.stringList('types')];
    const type = p.string('type');
    const matchesType = (t: string) => {
      if (type) {
        if (type.endsWith('.*')) return t.startsWith(type.slice(0, -1));
        if (t !== type) return false;
      }
      return types.length === 0 || types.includes(t);
    };
    const created = createdFilter(p);
    const items = Object.values(this.state.events).filter((e) => matchesType(e.type) && created(e.created));
    return this.list(items, p, '/v1/events', (e) => clone(e));
  }

  // ---------------------------------------------------------------- lists

  list<T extends ApiObject>(items: T[], p: Params, url: string, render: (item: T) => Json): Json {
    const limit = p.integer('limit') ?? 10;
    if (limit < 1 || limit > 100) throw invalidParam('limit', 'Invalid limit: must be between 1 and 100.');
    const newestFirst = items.slice().reverse();
    const after = p.string('starting_after');
    const before = p.string('ending_before');
    let page: T[];
    let hasMore: boolean;
    if (after) {
      const i = newestFirst.findIndex((x) => x.id === after);
      if (i < 0) throw noSuch('object', after, 'starting_after');
      const rest = newestFirst.slice(i + 1);
      page = rest.slice(0, limit);
      hasMore = rest.length > limit;
    } else if (before) {
      const i = newestFirst.findIndex((x) => x.id === before);
      if (i < 0) throw noSuch('object', before, 'ending_before');
      const rest = newestFirst.slice(0, i);
      page = rest.slice(Math.max(0, rest.length - limit));
      hasMore = rest.length > limit;
    } else {
      page = newestFirst.slice(0, limit);
      hasMore = newestFirst.length > limit;
    }
    return { object: 'list', data: page.map(render), has_more: hasMore, url };
  }

  // ---------------------------------------------------------------- customers

  private customer(id: string, param = 'id', status: 400 | 404 = 404): Customer {
    const c = this.state.customers[id];
    if (!c) throw noSuch('customer', id, param, status);
    return c;
  }

  createCustomer(p: Params, ctx: RequestContext): Json {
    const metadata = mergeMetadata({}, p.metadata());
    const customer: Customer = {
      id: newId('cus'),
      object: 'customer',
      address: null,
      balance: 0,
      created: nowSeconds(),
      currency: null,
      default_source: null,
      delinquent: false,
      description: p.string('description') ?? null,
      discount: null,
      email: p.email('email') ?? null,
      invoice_prefix: randomToken(8).toUpperCase(),
      invoice_settings: { custom_fields: null, default_payment_method: null, footer: null, rendering_options: null },
      livemode: false,
      metadata,
      name: p.string('name', { maxLength: 256 }) ?? null,
      next_invoice_sequence: 1,
      phone: p.string('phone', { maxLength: 20 }) ?? null,
      preferred_locales: [],
      shipping: null,
      tax_exempt: 'none',
      test_clock: null,
    };
    this.state.customers[customer.id] = customer;
    this.touch(customer);
    this.emit('customer.created', clone(customer), ctx);
    return clone(customer);
  }

  retrieveCustomer(id: string): Json {
    return clone(this.customer(id));
  }

  updateCustomer(id: string, p: Params, ctx: RequestContext): Json {
    const c = this.customer(id);
    const email = p.email('email');
    const name = p.string('name', { maxLength: 256 });
    const description = p.string('description');
    const phone = p.string('phone', { maxLength: 20 });
    const metadata = p.metadata();
    const before = clone(c);
    if (p.has('email')) c.email = email ?? null;
    if (p.has('name')) c.name = name ?? null;
    if (p.has('description')) c.description = description ?? null;
    if (p.has('phone')) c.phone = phone ?? null;
    c.metadata = mergeMetadata(c.metadata, metadata);
    this.touch(c);
    const previous = changedFields(before, c);
    if (previous) this.emit('customer.updated', clone(c), ctx, previous);
    return clone(c);
  }

  listCustomers(p: Params): Json {
    const email = p.string('email');
    const items = Object.values(this.state.customers).filter((c) => !email || c.email === email);
    return this.list(items, p, '/v1/customers', (c) => clone(c));
  }

  // ---------------------------------------------------------------- payment intents

  paymentIntent(id: string, param = 'intent', status: 400 | 404 = 404): PaymentIntent {
    const pi = this.state.paymentIntents[id];
    if (!pi) throw noSuch('payment_intent', id, param, status);
    return pi;
  }

  createPaymentIntent(p: Params, ctx: RequestContext): Json {
    const currency = p.currency('currency')!;
    const amount = p.amount('amount', { required: true, min: minimumAmount(currency) })!;
    const customerId = p.string('customer');
    if (customerId) this.customer(customerId, 'customer', 400);
    const captureMethod = p.oneOf('capture_method', ['automatic', 'automatic_async', 'manual'] as const);
    if (captureMethod === 'manual') {
      // Holding funds is done on the platform balance; manual capture expires after days anyway.
      throw invalidParam('capture_method', 'This test server supports automatic capture only.');
    }
    const types = p.stringList('payment_method_types');
    const unsupported = types.find((t) => t !== 'card');
    if (unsupported) throw invalidParam('payment_method_types', `Only card payments are supported here, not ${unsupported}.`);
    const returnUrl = p.string('return_url');
    if (returnUrl && !isHttpUrl(returnUrl)) throw invalidParam('return_url', 'return_url must be an http or https URL.', 'url_invalid');
    const confirm = p.boolean('confirm') ?? false;
    const paymentMethod = p.string('payment_method');
    const testCard = paymentMethod ? this.resolvePaymentMethod(paymentMethod) : undefined;
    if (confirm && !paymentMethod) {
      throw invalidParam('payment_method', 'A payment_method is needed to confirm at creation.', 'parameter_missing');
    }
    const autoEnabled = p.boolean('automatic_payment_methods[enabled]');
    const metadata = mergeMetadata({}, p.metadata());
    const created = nowSeconds();
    const id = newId('pi');
    const pi: PaymentIntent = {
      id,
      object: 'payment_intent',
      amount,
      amount_capturable: 0,
      amount_details: { tip: {} },
      amount_received: 0,
      application: null,
      application_fee_amount: null,
      automatic_payment_methods: autoEnabled === undefined ? null : { allow_redirects: 'always', enabled: autoEnabled },
      canceled_at: null,
      cancellation_reason: null,
      capture_method: captureMethod ?? 'automatic',
      client_secret: `${id}_secret_${randomToken(25)}`,
      confirmation_method: 'automatic',
      created,
      currency,
      customer: customerId ?? null,
      description: p.string('description') ?? null,
      last_payment_error: null,
      latest_charge: null,
      livemode: false,
      metadata,
      next_action: null,
      on_behalf_of: null,
      payment_method: null,
      payment_method_configuration_details: null,
      payment_method_options: { card: { installments: null, mandate_options: null, network: null, request_three_d_secure: 'automatic' } },
      payment_method_types: ['card'],
      processing: null,
      receipt_email: p.email('receipt_email') ?? null,
      review: null,
      setup_future_usage: null,
      shipping: null,
      source: null,
      statement_descriptor: p.string('statement_descriptor', { maxLength: 22 }) ?? null,
      statement_descriptor_suffix: p.string('statement_descriptor_suffix', { maxLength: 22 }) ?? null,
      status: 'requires_payment_method',
      transfer_data: null,
      transfer_group: p.string('transfer_group') ?? null,
    };
    this.state.paymentIntents[id] = pi;
    if (returnUrl) this.state.paymentIntentReturnUrls[id] = returnUrl;
    if (testCard) {
      pi.payment_method = this.createPaymentMethod(testCard.card, testCard.pmId).id;
      pi.status = 'requires_confirmation';
    }
    this.touch(pi);
    if (returnUrl) this.mark('paymentIntentReturnUrls', id);
    this.emit('payment_intent.created', this.renderPaymentIntent(pi), ctx);
    if (confirm && testCard) return this.confirmWith(pi, ctx, 'api');
    return this.renderPaymentIntent(pi);
  }

  retrievePaymentIntent(id: string): Json {
    return this.renderPaymentIntent(this.paymentIntent(id));
  }

  listPaymentIntents(p: Params): Json {
    const customer = p.string('customer');
    const items = Object.values(this.state.paymentIntents).filter((pi) => !customer || pi.customer === customer);
    return this.list(items, p, '/v1/payment_intents', (pi) => this.renderPaymentIntent(pi));
  }

  updatePaymentIntent(id: string, p: Params): Json {
    const pi = this.paymentIntent(id);
    const amount = p.amount('amount', { min: minimumAmount(pi.currency) });
    const description = p.string('description');
    const metadata = p.metadata();
    const transferGroup = p.string('transfer_group');
    const receiptEmail = p.email('receipt_email');
    const customerId = p.string('customer');
    if (customerId) this.customer(customerId, 'customer', 400);
    if (amount !== undefined && !(PAYABLE_STATUSES as readonly string[]).includes(pi.status)) {
      throw stateError(
        'payment_intent_unexpected_state',
        `The amount of a PaymentIntent with status ${pi.status} cannot be changed.`,
        'amount',
      );
    }
    if (amount !== undefined) pi.amount = amount;
    if (p.has('description')) pi.description = description ?? null;
    if (p.has('transfer_group')) pi.transfer_group = transferGroup ?? null;
    if (p.has('receipt_email')) pi.receipt_email = receiptEmail ?? null;
    if (customerId) pi.customer = customerId;
    pi.metadata = mergeMetadata(pi.metadata, metadata);
    this.touch(pi);
    return this.renderPaymentIntent(pi);
  }

  cancelPaymentIntent(id: string, p: Params, ctx: RequestContext): Json {
    const pi = this.paymentIntent(id);
    const reason = p.oneOf('cancellation_reason', ['duplicate', 'fraudulent', 'requested_by_customer', 'abandoned'] as const);
    if (!CANCELABLE_STATUSES.includes(pi.status)) {
      throw stateError(
        'payment_intent_unexpected_state',
        `You cannot cancel this PaymentIntent because it has a status of ${pi.status}. ` +
          `Only a PaymentIntent with one of these statuses can be canceled: ${CANCELABLE_STATUSES.join(', ')}.`,
      );
    }
    pi.status = 'canceled';
    pi.canceled_at = nowSeconds();
    pi.cancellation_reason = reason ?? null;
    this.touch(pi);
    const rendered = this.renderPaymentIntent(pi);
    this.emit('payment_intent.canceled', rendered, ctx);
    return this.renderPaymentIntent(pi);
  }

  /** `POST /v1/payment_intents/:id/confirm` with a test payment method such as `pm_card_visa`. */
  confirmPaymentIntent(id: string, p: Params, ctx: RequestContext): Json {
    const pi = this.paymentIntent(id);
    const pmParam = p.string('payment_method');
    const returnUrl = p.string('return_url');
    if (returnUrl && !isHttpUrl(returnUrl)) throw invalidParam('return_url', 'return_url must be an http or https URL.', 'url_invalid');
    const resolved = pmParam ? this.resolvePaymentMethod(pmParam) : undefined;
    if (returnUrl) this.state.paymentIntentReturnUrls[id] = returnUrl;
    if (pi.status !== 'requires_payment_method' && pi.status !== 'requires_confirmation') {
      throw stateError(
        'payment_intent_unexpected_state',
        `You cannot confirm this PaymentIntent because it has a status of ${pi.status}.`,
      );
    }
    if (resolved) {
      pi.payment_method = this.createPaymentMethod(resolved.card, resolved.pmId).id;
    }
    if (!pi.payment_method) {
      throw stateError(
        'payment_intent_unexpected_state',
        'You cannot confirm this PaymentIntent because it has no payment method. Pass payment_method, or let the rider pay on the hosted page.',
        'payment_method',
      );
    }
    this.touch(pi);
    if (returnUrl) this.mark('paymentIntentReturnUrls', id);
    return this.confirmWith(pi, ctx, 'api');
  }

  /** A test token (`pm_card_visa`) or a payment method this fake created. */
  private resolvePaymentMethod(value: string): { card: CardInput; pmId?: string } {
    const tokenNumber = TEST_PAYMENT_METHOD_TOKENS[value];
    if (tokenNumber) return { card: { number: tokenNumber, expMonth: 12, expYear: new Date().getUTCFullYear() + 3 } };
    const stored = this.state.paymentMethods[value];
    const number = this.state.paymentMethodCardNumbers[value];
    if (!stored || !number) throw noSuch('PaymentMethod', value, 'payment_method');
    return { card: { number, expMonth: stored.card.exp_month, expYear: stored.card.exp_year }, pmId: value };
  }

  private createPaymentMethod(card: CardInput, existingId?: string): PaymentMethod {
    if (existingId && this.state.paymentMethods[existingId]) return this.state.paymentMethods[existingId];
    const test = findTestCard(card.number);
    const brand = test?.brand ?? 'visa';
    const pm: PaymentMethod = {
      id: newId('pm'),
      object: 'payment_method',
      allow_redisplay: 'unspecified',
      billing_details: {
        address: { city: null, country: null, line1: null, line2: null, postal_code: null, state: null },
        email: null,
        name: card.name ?? null,
        phone: null,
      },
      card: {
        brand,
        checks: { address_line1_check: null, address_postal_code_check: null, cvc_check: card.cvc ? 'pass' : null },
        country: 'US',
        display_brand: brand,
        exp_month: card.expMonth,
        exp_year: card.expYear,
        fingerprint: createHash('sha256').update(card.number).digest('base64url').slice(0, 16),
        funding: 'credit',
        last4: card.number.slice(-4),
        networks: { available: [brand], preferred: null },
        three_d_secure_usage: { supported: true },
        wallet: null,
      },
      created: nowSeconds(),
      customer: null,
      livemode: false,
      metadata: {},
      type: 'card',
    };
    this.state.paymentMethods[pm.id] = pm;
    this.state.paymentMethodCardNumbers[pm.id] = card.number;
    this.touch(pm);
    this.mark('paymentMethodCardNumbers', pm.id);
    return pm;
  }

  /**
   * The card step shared by the hosted page, the JSON test helper and `confirm`.
   * Throws a 402 card error for `confirm` calls only; the page and the helper read the outcome.
   */
  private confirmWith(pi: PaymentIntent, ctx: RequestContext, via: 'api' | 'page'): Json {
    const pm = this.state.paymentMethods[pi.payment_method!];
    const card = findTestCard(this.state.paymentMethodCardNumbers[pm.id] ?? '');
    const outcome: CardOutcome = card?.outcome ?? {
      kind: 'decline',
      code: 'card_declined',
      declineCode: 'generic_decline',
      message: 'Your card was declined.',
    };
    if (outcome.kind === 'succeed') {
      this.succeedPayment(pi, pm, ctx);
    } else if (outcome.kind === 'authenticate') {
      pi.status = 'requires_action';
      this.touch(pi);
      this.emit('payment_intent.requires_action', this.renderPaymentIntent(pi), ctx);
    } else {
      const charge = this.failPayment(pi, pm, outcome, ctx);
      if (via === 'api') {
        throw new ApiError(
          402,
          {
            type: 'card_error',
            code: outcome.code,
            decline_code: outcome.declineCode,
            message: outcome.message,
            charge: charge.id,
            payment_intent: this.renderPaymentIntent(pi),
            payment_method: clone(pm),
          },
          true,
        );
      }
    }
    return this.renderPaymentIntent(pi);
  }

  private succeedPayment(pi: PaymentIntent, pm: PaymentMethod, ctx: RequestContext): void {
    const created = nowSeconds();
    const chargeId = newId('ch');
    const txn = this.addBalanceTransaction({
      amount: pi.amount,
      currency: pi.currency,
      type: 'charge',
      source: chargeId,
      availableOn: created + this.options.fundsAvailableAfterSeconds,
      description: pi.description,
    });
    const charge = this.buildCharge(chargeId, pi, pm, created, {
      status: 'succeeded',
      paid: true,
      captured: true,
      amount_captured: pi.amount,
      balance_transaction: txn.id,
      failure_code: null,
      failure_message: null,
      outcome: {
        network_status: 'approved_by_network',
        reason: null,
        risk_level: 'normal',
        risk_score: 12,
        seller_message: 'Payment complete.',
        type: 'authorized',
      },
    });
    this.state.charges[charge.id] = charge;
    pi.status = 'succeeded';
    pi.amount_received = pi.amount;
    pi.latest_charge = charge.id;
    pi.payment_method = pm.id;
    pi.last_payment_error = null;
    this.touch(charge, pi);
    this.emit('charge.succeeded', clone(charge), ctx);
    this.emit('payment_intent.succeeded', this.renderPaymentIntent(pi), ctx);
  }

  private failPayment(
    pi: PaymentIntent,
    pm: PaymentMethod,
    outcome: Extract<CardOutcome, { kind: 'decline' }>,
    ctx: RequestContext,
  ): Charge {
    const created = nowSeconds();
    const charge = this.buildCharge(newId('ch'), pi, pm, created, {
      status: 'failed',
      paid: false,
      captured: false,
      amount_captured: 0,
      balance_transaction: null,
      failure_code: outcome.code,
      failure_message: outcome.message,
      outcome: {
        network_status: 'declined_by_network',
        reason: outcome.declineCode,
        risk_level: 'normal',
        risk_score: 20,
        seller_message: 'The bank did not return any further details with this decline.',
        type: 'issuer_declined',
      },
    });
    this.state.charges[charge.id] = charge;
    const error: LastPaymentError = {
      type: 'card_error',
      code: outcome.code,
      decline_code: outcome.declineCode,
      message: outcome.message,
      charge: charge.id,
      payment_method: clone(pm),
    };
    pi.status = 'requires_payment_method';
    pi.latest_charge = charge.id;
    pi.payment_method = null;
    pi.last_payment_error = error;
    this.touch(charge, pi);
    this.emit('charge.failed', clone(charge), ctx);
    this.emit('payment_intent.payment_failed', this.renderPaymentIntent(pi), ctx);
    return charge;
  }

  private buildCharge(
    id: string,
    pi: PaymentIntent,
    pm: PaymentMethod,
    created: number,
    fields: Pick<Charge, 'status' | 'paid' | 'balance_transaction' | 'failure_code' | 'failure_message'> & Json,
  ): Charge {
    return {
      id,
      object: 'charge',
      amount: pi.amount,
      amount_refunded: 0,
      application: null,
      application_fee: null,
      application_fee_amount: null,
      billing_details: clone(pm.billing_details),
      calculated_statement_descriptor: 'LACEWRIGHT TEST',
      created,
      currency: pi.currency,
      customer: pi.customer,
      description: pi.description,
      disputed: false,
      failure_balance_transaction: null,
      fraud_details: {},
      livemode: false,
      metadata: { ...pi.metadata },
      on_behalf_of: null,
      payment_intent: pi.id,
      payment_method: pm.id,
      payment_method_details: {
        type: 'card',
        card: {
          brand: pm.card.brand,
          checks: pm.card.checks,
          country: pm.card.country,
          exp_month: pm.card.exp_month,
          exp_year: pm.card.exp_year,
          fingerprint: pm.card.fingerprint,
          funding: pm.card.funding,
          last4: pm.card.last4,
          network: pm.card.brand,
          three_d_secure: null,
          wallet: null,
        },
      },
      receipt_email: pi.receipt_email,
      receipt_number: null,
      receipt_url: null,
      refunded: false,
      review: null,
      shipping: null,
      source_transfer: null,
      statement_descriptor: pi.statement_descriptor ?? null,
      statement_descriptor_suffix: pi.statement_descriptor_suffix ?? null,
      transfer_data: null,
      transfer_group: pi.transfer_group,
      amount_captured: 0,
      captured: false,
      ...fields,
    } as Charge;
  }

  /**
   * A rider's card typed on the hosted page or sent to the JSON test helper.
   * Returns the intent as it stands afterwards; declines are part of the intent, not errors.
   */
  payWithCard(piId: string, card: CardInput, ctx: RequestContext = NO_REQUEST): Json {
    const pi = this.paymentIntent(piId, 'payment_intent');
    if (pi.status !== 'requires_payment_method' && pi.status !== 'requires_confirmation') {
      throw stateError(
        'payment_intent_unexpected_state',
        `This PaymentIntent has a status of ${pi.status} and cannot take a card now.`,
      );
    }
    pi.payment_method = this.createPaymentMethod(card).id;
    this.touch(pi);
    return this.confirmWith(pi, ctx, 'page');
  }

  /** Ends the extra confirmation step some test cards ask for. */
  authenticate(piId: string, approve: boolean, ctx: RequestContext = NO_REQUEST): Json {
    const pi = this.paymentIntent(piId, 'payment_intent');
    if (pi.status !== 'requires_action' || !pi.payment_method) {
      throw stateError(
        'payment_intent_unexpected_state',
        `This PaymentIntent has a status of ${pi.status}; there is nothing to confirm.`,
      );
    }
    const pm = this.state.paymentMethods[pi.payment_method];
    if (approve) {
      this.succeedPayment(pi, pm, ctx);
    } else {
      pi.status = 'requires_payment_method';
      pi.payment_method = null;
      pi.last_payment_error = {
        type: 'invalid_request_error',
        code: 'payment_intent_authentication_failure',
        message:
          'The provided payment method has failed authentication. Provide a new payment method to attempt to fulfill this PaymentIntent again.',
        payment_method: clone(pm),
      };
      this.touch(pi);
      this.emit('payment_intent.payment_failed', this.renderPaymentIntent(pi), ctx);
    }
    return this.renderPaymentIntent(pi);
  }

  testCardFor(piId: string): TestCard | undefined {
    const pi = this.state.paymentIntents[piId];
    if (!pi?.payment_method) return undefined;
    return findTestCard(this.state.paymentMethodCardNumbers[pi.payment_method] ?? '');
  }

  // ---------------------------------------------------------------- charges, payment methods

  retrieveCharge(id: string): Json {
    const ch = this.state.charges[id];
    if (!ch) throw noSuch('charge', id, 'id', 404);
    return clone(ch);
  }

  listCharges(p: Params): Json {
    const pi = p.string('payment_intent');
    const customer = p.string('customer');
    const group = p.string('transfer_group');
    const items = Object.values(this.state.charges).filter(
      (c) => (!pi || c.payment_intent === pi) && (!customer || c.customer === customer) && (!group || c.transfer_group === group),
    );
    return this.list(items, p, '/v1/charges', (c) => clone(c));
  }

  retrievePaymentMethod(id: string): Json {
    const pm = this.state.paymentMethods[id];
    if (!pm) throw noSuch('payment_method', id, 'id', 404);
    return clone(pm);
  }

  // ---------------------------------------------------------------- balance

  private addBalanceTransaction(input: {
    amount: number;
    currency: string;
    type: BalanceTransaction['type'];
    source: string;
    availableOn: number;
    description: string | null;
  }): BalanceTransaction {
    const txn: BalanceTransaction = {
      id: newId('txn'),
      object: 'balance_transaction',
      amount: input.amount,
      available_on: input.availableOn,
      created: nowSeconds(),
      currency: input.currency,
      description: input.description,
      exchange_rate: null,
      // The fake charges no processing fee, so the platform's ledger sees whole amounts.
      fee: 0,
      fee_details: [],
      net: input.amount,
      reporting_category: input.type === 'transfer_refund' ? 'transfer_reversal' : input.type,
      source: input.source,
      type: input.type,
    };
    this.state.balanceTransactions[txn.id] = txn;
    this.touch(txn);
    return txn;
  }

  private balanceBy(currency: string): { available: number; pending: number } {
    const now = nowSeconds();
    let available = 0;
    let pending = 0;
    for (const t of Object.values(this.state.balanceTransactions)) {
      if (t.currency !== currency) continue;
      if (t.available_on <= now) available += t.net;
      else pending += t.net;
    }
    return { available, pending };
  }

  retrieveBalance(): Json {
    const currencies = new Set<string>(['usd']);
    for (const t of Object.values(this.state.balanceTransactions)) currencies.add(t.currency);
    const available: Json[] = [];
    const pending: Json[] = [];
    for (const currency of currencies) {
      const b = this.balanceBy(currency);
      available.push({ amount: b.available, currency, source_types: { card: b.available } });
      pending.push({ amount: b.pending, currency, source_types: { card: b.pending } });
    }
    return {
      object: 'balance',
      available,
      connect_reserved: [...currencies].map((currency) => ({ amount: 0, currency })),
      livemode: false,
      pending,
    };
  }

  /** Test control: every pending fund becomes available now. */
  settleBalance(): void {
    const now = nowSeconds();
    for (const t of Object.values(this.state.balanceTransactions)) {
      if (t.available_on > now) {
        t.available_on = now;
        this.touch(t);
      }
    }

  }

  retrieveBalanceTransaction(id: string): Json {
    const t = this.state.balanceTransactions[id];
    if (!t) throw noSuch('balance transaction', id, 'id', 404);
    return this.renderBalanceTransaction(t);
  }

  listBalanceTransactions(p: Params): Json {
    const type = p.string('type');
    const source = p.string('source');
    const items = Object.values(this.state.balanceTransactions).filter(
      (t) => (!type || t.type === type) && (!source || t.source === source),
    );
    return this.list(items, p, '/v1/balance_transactions', (t) => this.renderBalanceTransaction(t));
  }

  // ---------------------------------------------------------------- refunds

  createRefund(p: Params, ctx: RequestContext): Json {
    const piId = p.string('payment_intent');
    const chargeId = p.string('charge');
    const amount = p.amount('amount');
    const reason = p.oneOf('reason', ['duplicate', 'fraudulent', 'requested_by_customer'] as const);
    const metadata = mergeMetadata({}, p.metadata());
    if (!piId && !chargeId) {
      throw invalidParam('payment_intent', 'Provide either payment_intent or charge to refund.', 'parameter_missing');
    }
    let charge: Charge | undefined;
    if (chargeId) {
      charge = this.state.charges[chargeId];
      if (!charge) throw noSuch('charge', chargeId, 'charge');
    }
    if (piId) {
      const pi = this.paymentIntent(piId, 'payment_intent', 400);
      if (charge && charge.payment_intent !== pi.id) {
        throw invalidParam('charge', `Charge ${charge.id} does not belong to PaymentIntent ${pi.id}.`);
      }
      if (!charge) {
        if (pi.status !== 'succeeded' || !pi.latest_charge) {
          throw stateError(
            'payment_intent_unexpected_state',
            `PaymentIntent ${pi.id} has a status of ${pi.status} and no successful charge to refund.`,
            'payment_intent',
          );
        }
        charge = this.state.charges[pi.latest_charge];
      }
    }
    const ch = charge!;
    if (ch.status !== 'succeeded') {
      throw stateError('charge_not_refundable', `Charge ${ch.id} did not succeed, so there is nothing to refund.`, 'charge');
    }
    const remaining = ch.amount - ch.amount_refunded;
    if (remaining <= 0) throw stateError('charge_already_refunded', `Charge ${ch.id} has already been refunded.`);
    const refundAmount = amount ?? remaining;
    if (refundAmount > remaining) {
      throw stateError(
        'amount_too_large',
        `Refund amount (${formatMoney(refundAmount, ch.currency)}) is greater than the unrefunded amount on the charge (${formatMoney(remaining, ch.currency)}).`,
        'amount',
      );
    }
    const id = newId('re');
    const txn = this.addBalanceTransaction({
      amount: -refundAmount,
      currency: ch.currency,
      type: 'refund',
      source: id,
      availableOn: nowSeconds(),
      description: 'REFUND FOR CHARGE',
    });
    const refund: Refund = {
      id,
      object: 'refund',
      amount: refundAmount,
      balance_transaction: txn.id,
      charge: ch.id,
      created: nowSeconds(),
      currency: ch.currency,
      destination_details: { type: 'card', card: { reference_status: 'pending', reference_type: 'acquirer_reference_number', type: 'refund' } },
      metadata,
      payment_intent: ch.payment_intent,
      reason: reason ?? null,
      receipt_number: null,
      source_transfer_reversal: null,
      status: 'succeeded',
      transfer_reversal: null,
    };
    this.state.refunds[id] = refund;
    const previous = { amount_refunded: ch.amount_refunded, refunded: ch.refunded };
    ch.amount_refunded += refundAmount;
    ch.refunded = ch.amount_refunded === ch.amount;
    this.touch(refund, ch);
    this.emit('refund.created', clone(refund), ctx);
    this.emit('charge.refunded', clone(ch), ctx, previous);
    return clone(refund);
  }

  retrieveRefund(id: string): Json {
    const r = this.state.refunds[id];
    if (!r) throw noSuch('refund', id, 'id', 404);
    return clone(r);
  }

  listRefunds(p: Params): Json {
    const charge = p.string('charge');
    const pi = p.string('payment_intent');
    const items = Object.values(this.state.refunds).filter(
      (r) => (!charge || r.charge === charge) && (!pi || r.payment_intent === pi),
    );
    return this.list(items, p, '/v1/refunds', (r) => clone(r));
  }

  // ---------------------------------------------------------------- connected accounts

  account(id: string, param = 'account', status: 400 | 404 = 404): Account {
    const a = this.state.accounts[id];
    if (!a) throw noSuch('account', id, param, status);
    return a;
  }

  createAccount(p: Params): Json {
    const type = p.oneOf('type', ['express', 'custom', 'standard'] as const) ?? 'express';
    const countryParam = p.string('country');
    if (countryParam && !/^[A-Za-z]{2}$/.test(countryParam)) throw invalidParam('country', `Invalid country: ${countryParam}.`);
    const country = (countryParam ?? 'US').toUpperCase();
    const email = p.email('email') ?? null;
    const capabilitiesParam = p.object('capabilities') ?? {};
    const capabilities: Account['capabilities'] = {};
    for (const name of Object.keys(capabilitiesParam)) {
      const requested = p.boolean(`capabilities[${name}][requested]`);
      if (requested) capabilities[name] = 'inactive';
    }
    const businessType = p.oneOf('business_type', ['individual', 'company', 'non_profit', 'government_entity'] as const);
    const profile = p.object('business_profile') ?? {};
    const defaultCurrency = p.currency('default_currency', { required: false }) ?? COUNTRY_CURRENCY[country] ?? 'eur';
    const metadata = mergeMetadata({}, p.metadata());
    const acct: Account = {
      id: newId('acct'),
      object: 'account',
      business_profile: {
        mcc: null,
        name: null,
        product_description: null,
        support_email: null,
        support_phone: null,
        support_url: null,
        url: null,
        ...profile,
      },
      business_type: businessType ?? null,
      capabilities,
      charges_enabled: false,
      controller: { is_controller: true, type: 'application' },
      country,
      created: nowSeconds(),
      default_currency: defaultCurrency,
      details_submitted: false,
      email,
      metadata,
      payouts_enabled: false,
      settings: {
        payouts: { debit_negative_balances: true, schedule: { delay_days: 2, interval: 'daily' }, statement_descriptor: null },
      },
      tos_acceptance: { date: null, ip: null, user_agent: null },
      type,
    };
    this.state.accounts[acct.id] = acct;
    this.touch(acct);
    return this.renderAccount(acct);
  }

  retrieveAccount(id: string): Json {
    return this.renderAccount(this.account(id));
  }

  listAccounts(p: Params): Json {
    return this.list(Object.values(this.state.accounts), p, '/v1/accounts', (a) => this.renderAccount(a));
  }

  updateAccount(id: string, p: Params, ctx: RequestContext): Json {
    const acct = this.account(id);
    const email = p.email('email');
    const metadata = p.metadata();
    const profile = p.object('business_profile');
    const capabilitiesParam = p.object('capabilities') ?? {};
    const before = this.renderAccount(acct);
    if (p.has('email')) acct.email = email ?? null;
    acct.metadata = mergeMetadata(acct.metadata, metadata);
    if (profile) acct.business_profile = { ...acct.business_profile, ...profile };
    for (const name of Object.keys(capabilitiesParam)) {
      const requested = p.boolean(`capabilities[${name}][requested]`);
      if (requested && !acct.capabilities[name]) acct.capabilities[name] = acct.details_submitted ? 'active' : 'inactive';
      if (requested === false) delete acct.capabilities[name];
    }
    this.touch(acct);
    const after = this.renderAccount(acct);
    const previous = changedFields(before, after);
    if (previous) this.emit('account.updated', after, ctx, previous, acct.id);
    return after;
  }

  /** What the onboarding page's button does: the account can now receive transfers and payouts. */
  completeOnboarding(id: string, ctx: RequestContext = NO_REQUEST): Json {
    const acct = this.account(id, 'account');
    const before = this.renderAccount(acct);
    acct.details_submitted = true;
    acct.charges_enabled = true;
    acct.payouts_enabled = true;
    acct.capabilities = { ...acct.capabilities, transfers: 'active' };
    for (const name of Object.keys(acct.capabilities)) acct.capabilities[name] = 'active';
    if (acct.tos_acceptance.date === null) {
      acct.tos_acceptance = { date: nowSeconds(), ip: '127.0.0.1', user_agent: 'Lacewright test payments' };
    }
    this.touch(acct);
    const after = this.renderAccount(acct);
    const previous = changedFields(before, after);
    if (previous) this.emit('account.updated', after, ctx, previous, acct.id);
    return after;
  }

  createAccountLink(p: Params): Json {
    const accountId = p.string('account', { required: true })!;
    const type = p.oneOf('type', ['account_onboarding', 'account_update'] as const, { required: true })!;
    const refreshUrl = p.string('refresh_url', { required: true })!;
    const returnUrl = p.string('return_url', { required: true })!;
    if (!isHttpUrl(refreshUrl)) throw invalidParam('refresh_url', 'refresh_url must be an http or https URL.', 'url_invalid');
    if (!isHttpUrl(returnUrl)) throw invalidParam('return_url', 'return_url must be an http or https URL.', 'url_invalid');
    this.account(accountId, 'account', 400);
    const created = nowSeconds();
    const link: AccountLinkRecord = {
      token: randomToken(32),
      account: accountId,
      type,
      refresh_url: refreshUrl,
      return_url: returnUrl,
      created,
      expires_at: created + this.options.accountLinkTtlSeconds,
      opened_session: null,
      completed: false,
    };
    this.state.accountLinks[link.token] = link;
    this.mark('accountLinks', link.token);
    return { object: 'account_link', created, expires_at: link.expires_at, url: `${this.baseUrl}/onboarding/${link.token}` };
  }

  /** Test control: every open onboarding link expires now. */
  expireAccountLinks(): void {
    const now = nowSeconds();
    for (const link of Object.values(this.state.accountLinks)) {
      link.expires_at = Math.min(link.expires_at, now - 1);
      this.mark('accountLinks', link.token);
    }

  }

  // ---------------------------------------------------------------- transfers

  private reversalsOf(transferId: string): TransferReversal[] {
    return Object.values(this.state.reversals).filter((r) => r.transfer === transferId);
  }

  private transfer(id: string): Transfer {
    const t = this.state.transfers[id];
    if (!t) throw noSuch('transfer', id, 'id', 404);
    return t;
  }

  createTransfer(p: Params, ctx: RequestContext): Json {
    const amount = p.amount('amount', { required: true })!;
    const currency = p.currency('currency')!;
    const destinationId = p.string('destination', { required: true })!;
    const sourceId = p.string('source_transaction');
    const transferGroup = p.string('transfer_group') ?? null;
    const description = p.string('description') ?? null;
    const metadata = mergeMetadata({}, p.metadata());
    const destination = this.state.accounts[destinationId];
    if (!destination) throw noSuch('destination', destinationId, 'destination');
    let source: Charge | undefined;
    if (sourceId) {
      source = this.state.charges[sourceId];
      if (!source) throw noSuch('charge', sourceId, 'source_transaction');
    }
    if (destination.capabilities.transfers !== 'active') {
      throw stateError(
        'insufficient_capabilities_for_transfer',
        `The destination account ${destination.id} needs the transfers capability active (finish onboarding first).`,
        'destination',
      );
    }
    const now = nowSeconds();
    let availableOn = now;
    if (source) {
      if (source.status !== 'succeeded') {
        throw stateError('invalid_source_transaction', `Charge ${source.id} did not succeed and cannot fund a transfer.`, 'source_transaction');
      }
      if (source.currency !== currency) {
        throw stateError(
          'invalid_source_transaction',
          `The transfer currency (${currency}) must match the source charge's currency (${source.currency}).`,
          'currency',
        );
      }
      const used = Object.values(this.state.transfers)
        .filter((t) => t.source_transaction === source!.id)
        .reduce((sum, t) => sum + t.amount - t.amount_reversed, 0);
      const remaining = source.amount - source.amount_refunded - used;
      if (amount > remaining) {
        throw stateError(
          'balance_insufficient',
          `Only ${formatMoney(Math.max(remaining, 0), currency)} of charge ${source.id} is left to transfer.`,
          'amount',
        );
      }
      // The transfer draws on that charge's funds, available or not yet.
      const sourceTxn = source.balance_transaction ? this.state.balanceTransactions[source.balance_transaction] : undefined;
      availableOn = sourceTxn?.available_on ?? now;
    } else {
      const { available } = this.balanceBy(currency);
      if (amount > available) {
        throw stateError(
          'balance_insufficient',
          `Insufficient available funds in the platform balance: ${formatMoney(available, currency)} available, ` +
            `${formatMoney(amount, currency)} asked. Funds from recent charges may still be pending; ` +
            'pass source_transaction to transfer from a specific charge.',
        );
      }
    }
    const id = newId('tr');
    const txn = this.addBalanceTransaction({
      amount: -amount,
      currency,
      type: 'transfer',
      source: id,
      availableOn,
      description,
    });
    const transfer: Transfer = {
      id,
      object: 'transfer',
      amount,
      amount_reversed: 0,
      balance_transaction: txn.id,
      created: now,
      currency,
      description,
      destination: destination.id,
      destination_payment: newId('py'),
      livemode: false,
      metadata,
      reversed: false,
      source_transaction: source?.id ?? null,
      source_type: 'card',
      transfer_group: transferGroup,
    };
    this.state.transfers[id] = transfer;
    this.touch(transfer);
    this.emit('transfer.created', this.renderTransfer(transfer), ctx);
    return this.renderTransfer(transfer);
  }

  retrieveTransfer(id: string): Json {
    return this.renderTransfer(this.transfer(id));
  }

  updateTransfer(id: string, p: Params, ctx: RequestContext): Json {
    const t = this.transfer(id);
    const metadata = p.metadata();
    const description = p.string('description');
    const before = this.renderTransfer(t);
    t.metadata = mergeMetadata(t.metadata, metadata);
    if (p.has('description')) t.description = description ?? null;
    this.touch(t);
    const after = this.renderTransfer(t);
    const previous = changedFields(before, after);
    if (previous) this.emit('transfer.updated', after, ctx, previous);
    return after;
  }

  listTransfers(p: Params): Json {
    const group = p.string('transfer_group');
    const destination = p.string('destination');
    const items = Object.values(this.state.transfers).filter(
      (t) => (!group || t.transfer_group === group) && (!destination || t.destination === destination),
    );
    return this.list(items, p, '/v1/transfers', (t) => this.renderTransfer(t));
  }

  createReversal(transferId: string, p: Params, ctx: RequestContext): Json {
    const t = this.transfer(transferId);
    const amount = p.amount('amount');
    const description = p.string('description');
    const metadata = mergeMetadata({}, p.metadata());
    const remaining = t.amount - t.amount_reversed;
    if (remaining <= 0) throw stateError('amount_too_large', `Transfer ${t.id} has already been fully reversed.`, 'amount');
    const reverseAmount = amount ?? remaining;
    if (reverseAmount > remaining) {
      throw stateError(
        'amount_too_large',
        `Reversal amount (${formatMoney(reverseAmount, t.currency)}) is greater than what is left on the transfer (${formatMoney(remaining, t.currency)}).`,
        'amount',
      );
    }
    const id = newId('trr');
    const transferTxn = this.state.balanceTransactions[t.balance_transaction];
    // Money comes back to the platform; if the transfer drew on pending funds, so does its return.
    const txn = this.addBalanceTransaction({
      amount: reverseAmount,
      currency: t.currency,
      type: 'transfer_refund',
      source: id,
      availableOn: Math.max(nowSeconds(), transferTxn?.available_on ?? 0),
      description: description ?? null,
    });
    const reversal: TransferReversal = {
      id,
      object: 'transfer_reversal',
      amount: reverseAmount,
      balance_transaction: txn.id,
      created: nowSeconds(),
      currency: t.currency,
      destination_payment_refund: newId('pyr'),
      metadata,
      source_refund: null,
      transfer: t.id,
    };
    this.state.reversals[id] = reversal;
    const previous = { amount_reversed: t.amount_reversed, reversed: t.reversed };
    t.amount_reversed += reverseAmount;
    t.reversed = t.amount_reversed === t.amount;
    this.touch(reversal, t);
    this.emit('transfer.reversed', this.renderTransfer(t), ctx, previous);
    return clone(reversal);
  }

  listReversals(transferId: string, p: Params): Json {
    this.transfer(transferId);
    return this.list(this.reversalsOf(transferId), p, `/v1/transfers/${transferId}/reversals`, (r) => clone(r));
  }

  retrieveReversal(transferId: string, id: string): Json {
    this.transfer(transferId);
    const r = this.state.reversals[id];
    if (!r || r.transfer !== transferId) throw noSuch('transfer_reversal', id, 'id', 404);
    return clone(r);
  }
}

function createdFilter(p: Params): (created: number) => boolean {
  const exact = typeof p.raw.created === 'string' ? p.integer('created') : undefined;
  const gt = p.integer('created[gt]');
  const gte = p.integer('created[gte]');
  const lt = p.integer('created[lt]');
  const lte = p.integer('created[lte]');
  return (c) =>
    (exact === undefined || c === exact) &&
    (gt === undefined || c > gt) &&
    (gte === undefined || c >= gte) &&
    (lt === undefined || c < lt) &&
    (lte === undefined || c <= lte);
}

/** The top-level fields whose values differ, with their old values (an event's `previous_attributes`). */
function changedFields(before: Json, after: Json): Record<string, unknown> | undefined {
  const out: Record<string, unknown> = {};
  for (const key of Object.keys(after)) {
    if (JSON.stringify(before[key]) !== JSON.stringify(after[key])) out[key] = before[key] ?? null;
  }
  return Object.keys(out).length > 0 ? out : undefined;
}
