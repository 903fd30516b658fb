/**
 * Local stand-in for the payments provider's HTTP API, spoken to by the unmodified
 * `stripe` SDK: `new Stripe(key, { host: '127.0.0.1', port, protocol: 'http', maxNetworkRetries: 0 })`.
 *
 * API (`/v1`, Bearer secret key, form-encoded with bracket notation, GET parameters in the query):
 *   customers (create, retrieve, update, list); payment_intents (create, retrieve, update, list,
 *   cancel, confirm with test tokens such as `pm_card_visa`); charges and payment_methods (retrieve,
 *   list); refunds (create by payment_intent or charge, full or partial); accounts (create, retrieve,
 *   update, list); account_links; transfers (create, retrieve, update, list) and their reversals;
 *   balance; balance_transactions; events (retrieve, list). `expand[]` works on id fields.
 *
 * Where the app finds the payment page: every payment intent that can still be paid carries
 *   `next_action = { type: 'redirect_to_url', redirect_to_url: { url, return_url } }`, and `url`
 *   is this server's page `GET /pay/<payment intent id>` (with `?return_url=` when one was given as
 *   `return_url` at creation or confirmation). The app may also add `?return_url=` itself.
 *   The page takes a test card; afterwards it redirects to return_url with `payment_intent`,
 *   `payment_intent_client_secret` and `redirect_status` (`succeeded` or `failed`). Card
 *   4000 0025 0000 3155 leads to an extra confirm-or-refuse page before the outcome.
 *   The webhook, not the redirect, is the signal that money arrived.
 *
 * Money: charges carry no fee. A charge's funds reach the platform's available balance after
 *   `fundsAvailableAfterSeconds` (default 0: at once; pending until then). A transfer without
 *   `source_transaction` needs that much available; with it, it needs only what is left of that
 *   charge (amount - refunded - already transferred from it) and draws on its funds, pending or not.
 *   Refunds are taken from the balance at once and may take it below zero.
 *
 * Events: every change records an `evt_` event, retrievable and listable, and POSTs it to
 *   `webhookUrl` signed with `Stripe-Signature: t=…,v1=HMAC-SHA256(webhookSecret, "t.body")`.
 *   Sending never delays the API answer. First attempts go out one at a time in creation order;
 *   a failed or unreachable endpoint is retried after each of `webhookRetryDelaysMs` (about ten
 *   minutes in all by default), then the delivery is marked failed. Unfinished deliveries resume
 *   after a restart, so a receiver may see an event twice (as with the real service).
 *
 * Idempotency-Key (POST): the first answer (status and body, 500s and card errors included) is
 *   kept 24 h and replayed with `Idempotent-Replayed: true`; the same key with other parameters
 *   or another endpoint gives 400 `idempotency_error`; parameter errors (missing, malformed,
 *   unknown referenced id) are not kept, so a corrected retry with the same key works.
 *
 * State lives in `dataFile`: a JSON snapshot (replaced through a temporary file and a rename) plus
 *   `<dataFile>.log`, one appended line per request that changed something, written before the
 *   answer goes out; the log is folded into the snapshot on start, on close and when it grows.
 *
 * Test controls (no key needed, JSON or form bodies, JSON answers):
 *   POST /_test/payment_intents/:id/pay            { card, exp_month?, exp_year?, cvc?, name? } → payment intent
 *   POST /_test/payment_intents/:id/authenticate   { outcome: 'approve' | 'fail' } → payment intent
 *   POST /_test/accounts/:id/onboard               onboarding done without the page → account
 *   POST /_test/account_links/expire               every open onboarding link expires now
 *   POST /_test/balance/settle                     every pending fund becomes available now
 *   POST /_test/events/:id/resend                  deliver once more now (a duplicate) → { status }
 *   GET  /_test/events/:id/delivery                that event's delivery record
 *   POST /_test/webhooks/pause | /resume           hold new deliveries; resume sends held ones in order
 *   POST /_test/webhooks/flush?order=reverse       send held ones now (or { ids: [...] } in that order)
 *   GET  /_test/webhooks                           paused?, held, pending and failed event ids
 *   POST /_test/webhooks/config                    { url?, secret? } change the endpoint at run time
 *   POST /_test/fail-next                          { count = 1, status = 500, mode = 'error' | 'disconnect' }
 *                                                  the next API calls fail; 'disconnect' drops the socket
 *                                                  (the SDK retries a dropped socket once by itself)
 *   POST /_test/reset                              forget everything
 *   GET  /health                                   { ok: true }
 *
 * Left out: manual capture, disputes, payouts, application fees, connected-account balances,
 * webhook endpoint objects, the v2 API.
 */
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { createHash } from 'node:crypto';
import { ApiError, type ErrorBody } from './errors';
import { nowSeconds, randomToken } from './ids';
import { normalizeJson, parseFormBody, Params, type ParamObject } from './params';
import { StateStore } from './store';
import { FAKE_API_VERSION, PaymentsCore, type RequestContext, NO_REQUEST, formatMoney } from './core';
import { DEFAULT_RETRY_DELAYS_MS, WebhookDispatcher } from './webhooks';
import { expiryInPast, findTestCard, luhnValid, normalizeCardNumber, parseExpiry } from './cards';
import { authenticatePage, indexPage, messagePage, onboardingPage, paymentPage } from './pages';

export interface PaymentsFakeOptions {
  /** 0 picks a free port. */
  port: number;
  host?: string;
  /** Where state is kept between runs; omit for memory only. */
  dataFile?: string;
  webhookUrl?: string;
  webhookSecret?: string;
  /** Base of the links handed to browsers (payment pages, onboarding links). Defaults to http://host:port. */
  publicBaseUrl?: string;
  /** When set, only this key is accepted; otherwise any `sk_…` or `rk_…` key. */
  secretKey?: string;
  fundsAvailableAfterSeconds?: number;
  accountLinkTtlSeconds?: number;
  webhookRetryDelaysMs?: number[];
  webhookTimeoutMs?: number;
  /** One line per request, for the command-line runner. */
  log?: (line: string) => void;
}

export interface PaymentsFake {
  url: string;
  port: number;
  close(): Promise<void>;
}

/** The payment page of a payment intent on a fake at `baseUrl` (the same URL as `next_action.redirect_to_url.url`). */
export function hostedPaymentUrl(baseUrl: string, paymentIntentId: string, returnUrl?: string): string {
  const query = returnUrl ? `?return_url=${encodeURIComponent(returnUrl)}` : '';
  return `${baseUrl.replace(/\/$/, '')}/pay/${encodeURIComponent(paymentIntentId)}${query}`;
}

const IDEMPOTENCY_TTL_SECONDS = 24 * 60 * 60;
const MAX_BODY_BYTES = 1_000_000;

type Json = Record<string, unknown>;
type ApiHandler = (path: string[], p: Params, ctx: RequestContext) => Json;

class HttpProblem extends Error {
  constructor(
    readonly status: number,
    message: string,
  ) {
    super(message);
  }
}

function readBody(req: http.IncomingMessage): Promise<string> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    req.on('data', (chunk: Buffer) => {
      size += chunk.length;
      if (size > MAX_BODY_BYTES) {
        reject(new HttpProblem(413, 'Request body too large.'));
        req.destroy();
        return;
      }
      chunks.push(chunk);
    });
    req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')));
    req.on('error', reject);
  });
}

function canonical(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonical).join(',')}]`;
  if (value && typeof value === 'object') {
    const keys = Object.keys(value as Json).sort();
    return `{${keys.map((k) => `${JSON.stringify(k)}:${canonical((value as Json)[k])}`).join(',')}}`;
  }
  return JSON.stringify(value);
}

function isHttpUrl(value: string | undefined): value is string {
  if (!value) return false;
  try {
    const u = new URL(value);
    return u.protocol === 'http:' || u.protocol === 'https:';
  } catch {
    return false;
  }
}

export async function startPaymentsFake(options: PaymentsFakeOptions): Promise<PaymentsFake> {
  const host = options.host ?? '127.0.0.1';
  const dataFile = options.dataFile;
  if (options.webhookUrl && !options.webhookSecret) {
    throw new Error('payments fake: webhookSecret is required when webhookUrl is set');
  }
  const store = new StateStore(dataFile);
  const core = new PaymentsCore(store, {
    fundsAvailableAfterSeconds: options.fundsAvailableAfterSeconds ?? 0,
    accountLinkTtlSeconds: options.accountLinkTtlSeconds ?? 300,
  });
  let laterTimer: NodeJS.Timeout | undefined;
  const persist = () => {
    if (laterTimer) clearTimeout(laterTimer);
    laterTimer = undefined;
    store.save();
  };
  // Delivery bookkeeping is saved a moment later, folded into one write: losing it in a crash
  // only means an event is sent again, which receivers must handle anyway.
  let stopped = false;
  const deliveryChanged = (eventId: string) => {
    if (stopped) return;
    store.mark('deliveries', eventId);
    laterTimer ??= setTimeout(persist, 200);
    laterTimer.unref();
  };
  const dispatcher = new WebhookDispatcher({
    url: options.webhookUrl,
    secret: options.webhookSecret,
    retryDelaysMs: options.webhookRetryDelaysMs ?? DEFAULT_RETRY_DELAYS_MS,
    timeoutMs: options.webhookTimeoutMs ?? 10_000,
    getState: () => store.state,
    changed: deliveryChanged,
  });
  const failNext = { remaining: 0, status: 500, mode: 'error' as 'error' | 'disconnect' };
  const log = options.log;

  /** Save what changed, then hand new events to the dispatcher (sending starts after this returns). */
  const commit = () => {
    for (const id of core.takeFreshEvents()) dispatcher.enqueue(id);
    if (store.dirty) persist();
  };

  // ------------------------------------------------------------------ API routes
  const routes: [string, RegExp, ApiHandler][] = [
    ['POST', /^\/v1\/customers$/, (_, p, ctx) => core.createCustomer(p, ctx)],
    ['GET', /^\/v1\/customers$/, (_, p) => core.listCustomers(p)],
    ['GET', /^\/v1\/customers\/([^/]+)$/, ([id]) => core.retrieveCustomer(id)],
    ['POST', /^\/v1\/customers\/([^/]+)$/, ([id], p, ctx) => core.updateCustomer(id, p, ctx)],

    ['POST', /^\/v1\/payment_intents$/, (_, p, ctx) => core.createPaymentIntent(p, ctx)],
    ['GET', /^\/v1\/payment_intents$/, (_, p) => core.listPaymentIntents(p)],
    ['GET', /^\/v1\/payment_intents\/([^/]+)$/, ([id]) => core.retrievePaymentIntent(id)],
    ['POST', /^\/v1\/payment_intents\/([^/]+)$/, ([id], p) => core.updatePaymentIntent(id, p)],
    ['POST', /^\/v1\/payment_intents\/([^/]+)\/cancel$/, ([id], p, ctx) => core.cancelPaymentIntent(id, p, ctx)],
    ['POST', /^\/v1\/payment_intents\/([^/]+)\/confirm$/, ([id], p, ctx) => core.confirmPaymentIntent(id, p, ctx)],

    ['GET', /^\/v1\/charges$/, (_, p) => core.listCharges(p)],
    ['GET', /^\/v1\/charges\/([^/]+)$/, ([id]) => core.retrieveCharge(id)],
    ['GET', /^\/v1\/payment_methods\/([^/]+)$/, ([id]) => core.retrievePaymentMethod(id)],

    ['POST', /^\/v1\/refunds$/, (_, p, ctx) => core.createRefund(p, ctx)],
    ['GET', /^\/v1\/refunds$/, (_, p) => core.listRefunds(p)],
    ['GET', /^\/v1\/refunds\/([^/]+)$/, ([id]) => core.retrieveRefund(id)],

    ['POST', /^\/v1\/accounts$/, (_, p) => core.createAccount(p)],
    ['GET', /^\/v1\/accounts$/, (_, p) => core.listAccounts(p)],
    ['GET', /^\/v1\/accounts\/([^/]+)$/, ([id]) => core.retrieveAccount(id)],
    ['POST', /^\/v1\/accounts\/([^/]+)$/, ([id], p, ctx) => core.updateAccount(id, p, ctx)],
    ['POST', /^\/v1\/account_links$/, (_, p) => core.createAccountLink(p)],

    ['POST', /^\/v1\/transfers$/, (_, p, ctx) => core.createTransfer(p, ctx)],
    ['GET', /^\/v1\/transfers$/, (_, p) => core.listTransfers(p)],
    ['GET', /^\/v1\/transfers\/([^/]+)$/, ([id]) => core.retrieveTransfer(id)],
    ['POST', /^\/v1\/transfers\/([^/]+)$/, ([id], p, ctx) => core.updateTransfer(id, p, ctx)],
    ['POST', /^\/v1\/transfers\/([^/]+)\/reversals$/, ([id], p, ctx) => core.createReversal(id, p, ctx)],
    ['GET', /^\/v1\/transfers\/([^/]+)\/reversals$/, ([id], p) => core.listReversals(id, p)],
    ['GET', /^\/v1\/transfers\/([^/]+)\/reversals\/([^/]+)$/, ([id, rid]) => core.retrieveReversal(id, rid)],

    ['GET', /^\/v1\/balance$/, () => core.retrieveBalance()],
    ['GET', /^\/v1\/balance_transactions$/, (_, p) => core.listBalanceTransactions(p)],
    ['GET', /^\/v1\/balance_transactions\/([^/]+)$/, ([id]) => core.retrieveBalanceTransaction(id)],

    ['GET', /^\/v1\/events$/, (_, p) => core.listEvents(p)],
    ['GET', /^\/v1\/events\/([^/]+)$/, ([id]) => core.retrieveEvent(id)],
  ];

  function sendJson(res: http.ServerResponse, status: number, body: string, headers: Record<string, string> = {}) {
    res.writeHead(status, {
      'content-type': 'application/json',
      'cache-control': 'no-store',
      'content-length': Buffer.byteLength(body),
      ...headers,
    });
    res.end(body);
  }

  function errorJson(body: ErrorBody): string {
    return JSON.stringify({ error: body }, null, 2);
  }

  function authorized(req: http.IncomingMessage): boolean {
    const header = req.headers.authorization ?? '';
    let key = '';
    if (header.startsWith('Bearer ')) key = header.slice(7).trim();
    else if (header.startsWith('Basic ')) key = Buffer.from(header.slice(6), 'base64').toString('utf8').split(':')[0];
    if (!key) return false;
    if (options.secretKey) return key === options.secretKey;
    return /^(sk|rk)_[A-Za-z0-9_]+$/.test(key);
  }

  function apiParams(req: http.IncomingMessage, url: URL, body: string): ParamObject {
    if (req.method === 'GET' || req.method === 'DELETE') return parseFormBody(url.search.slice(1));
    const type = req.headers['content-type'] ?? '';
    if (type.includes('application/json') && body.trim()) {
      try {
        return normalizeJson(JSON.parse(body)) as ParamObject;
      } catch {
        throw new HttpProblem(400, 'Invalid JSON body.');
      }
    }
    return parseFormBody(body);
  }

  function handleApi(req: http.IncomingMessage, res: http.ServerResponse, url: URL, body: string): void {
    const method = req.method ?? 'GET';
    const requestId = `req_${randomToken(14)}`;
    const headers: Record<string, string> = {
      'request-id': requestId,
      'stripe-version': String(req.headers['stripe-version'] ?? FAKE_API_VERSION),
    };
    const fail = (status: number, err: ErrorBody) => sendJson(res, status, errorJson(err), headers);

    if (!authorized(req)) {
      fail(401, {
        type: 'invalid_request_error',
        message: 'No valid API key provided. Send your secret key as a Bearer token in the Authorization header.',
      });
      return;
    }

    let raw: ParamObject;
    try {
      raw = apiParams(req, url, body);
    } catch (err) {
      fail(400, { type: 'invalid_request_error', message: (err as Error).message });
      return;
    }

    const keyHeader = req.headers['idempotency-key'];
    const key = method === 'POST' && typeof keyHeader === 'string' && keyHeader !== '' ? keyHeader : null;
    if (key) headers['idempotency-key'] = key;
    if (key && key.length > 255) {
      fail(400, { type: 'invalid_request_error', message: 'Idempotency-Key must be at most 255 characters long.' });
      return;
    }
    const fingerprint = createHash('sha256').update(`${method} ${url.pathname} ${canonical(raw)}`).digest('hex');
    if (key) {
      const cutoff = nowSeconds() - IDEMPOTENCY_TTL_SECONDS;
      for (const [k, rec] of Object.entries(core.state.idempotency)) {
        if (rec.created < cutoff) {
          delete core.state.idempotency[k];
          store.mark('idempotency', k);
        }
      }
      const saved = core.state.idempotency[key];
      if (saved) {
        if (saved.fingerprint !== fingerprint) {
          fail(400, {
            type: 'idempotency_error',
            message:
              `The idempotency key '${key}' was first used with different parameters or another endpoint ` +
              `(${saved.method} ${saved.path}). Use a new key for a different request.`,
          });
          commit();
          return;
        }
        sendJson(res, saved.status, saved.body, { ...headers, 'idempotent-replayed': 'true' });
        commit();
        return;
      }
    }
    const remember = (status: number, text: string) => {
      if (!key) return;
      core.state.idempotency[key] = { method, path: url.pathname, fingerprint, status, body: text, created: nowSeconds() };
      store.mark('idempotency', key);
    };

    if (failNext.remaining > 0) {
      failNext.remaining -= 1;
      if (failNext.mode === 'disconnect') {
        req.socket.destroy();
        return;
      }
      const text = errorJson({ type: 'api_error', message: 'The test server was told to fail this request.' });
      // A 500 means the request may have started; it is kept like any other answer.
      if (failNext.status === 500) remember(failNext.status, text);
      commit();
      sendJson(res, failNext.status, text, headers);
      return;
    }

    const route = routes.find(([m, re]) => m === method && re.test(url.pathname));
    if (!route) {
      fail(404, {
        type: 'invalid_request_error',
        message: `Unrecognized request URL (${method}: ${url.pathname}).`,
      });
      return;
    }
    const match = route[1].exec(url.pathname)!;
    const pathParams = match.slice(1).map((s) => decodeURIComponent(s));
    const p = new Params(raw);
    const ctx: RequestContext = { requestId, idempotencyKey: key };
    let status = 200;
    let text: string;
    let saveIt = true;
    try {
      const result = route[2](pathParams, p, ctx);
      text = JSON.stringify(core.expand(result, p.stringList('expand')), null, 2);
    } catch (err) {
      if (err instanceof ApiError) {
        status = err.status;
        text = errorJson(err.body);
        saveIt = err.savedUnderIdempotencyKey;
      } else {
        status = 500;
        text = errorJson({ type: 'api_error', message: 'The test server hit an unexpected error.' });
        log?.(`error: ${(err as Error).stack ?? String(err)}`);
      }
    }
    if (saveIt) remember(status, text);
    commit();
    sendJson(res, status, text, headers);
  }

  // ------------------------------------------------------------------ test controls
  async function handleTest(req: http.IncomingMessage, res: http.ServerResponse, url: URL, body: string): Promise<void> {
    const method = req.method ?? 'GET';
    const reply = (status: number, value: unknown) => sendJson(res, status, JSON.stringify(value, null, 2));
    let p: Params;
    try {
      p = new Params(apiParams(req, url, body));
    } catch (err) {
      reply(400, { error: { type: 'invalid_request_error', message: (err as Error).message } });
      return;
    }
    const path = url.pathname;
    let m: RegExpExecArray | null;
    try {
      if (method === 'POST' && (m = /^\/_test\/payment_intents\/([^/]+)\/pay$/.exec(path))) {
        const number = normalizeCardNumber(p.string('card') ?? p.string('number') ?? '');
        if (!number) throw new ApiError(400, { type: 'invalid_request_error', message: 'Missing card.', param: 'card' }, false);
        if (!findTestCard(number)) {
          throw new ApiError(
            400,
            { type: 'invalid_request_error', code: 'incorrect_number', message: `${number} is not one of the test card numbers.`, param: 'card' },
            false,
          );
        }
        const year = new Date().getUTCFullYear() + 3;
        const result = core.payWithCard(m[1], {
          number,
          expMonth: p.integer('exp_month') ?? 12,
          expYear: p.integer('exp_year') ?? year,
          cvc: p.string('cvc') ?? '123',
          name: p.string('name'),
        });
        commit();
        return reply(200, result);
      }
      if (method === 'POST' && (m = /^\/_test\/payment_intents\/([^/]+)\/authenticate$/.exec(path))) {
        const outcome = p.oneOf('outcome', ['approve', 'fail'] as const) ?? 'approve';
        const result = core.authenticate(m[1], outcome === 'approve');
        commit();
        return reply(200, result);
      }
      if (method === 'POST' && (m = /^\/_test\/accounts\/([^/]+)\/onboard$/.exec(path))) {
        const result = core.completeOnboarding(m[1]);
        commit();
        return reply(200, result);
      }
      if (method === 'POST' && path === '/_test/account_links/expire') {
        core.expireAccountLinks();
        commit();
        return reply(200, { ok: true });
      }
      if (method === 'POST' && path === '/_test/balance/settle') {
        core.settleBalance();
        commit();
        return reply(200, core.retrieveBalance());
      }
      if (method === 'POST' && (m = /^\/_test\/events\/([^/]+)\/resend$/.exec(path))) {
        core.retrieveEvent(m[1]);
        return reply(200, await dispatcher.resend(m[1]));
      }
      if (method === 'GET' && (m = /^\/_test\/events\/([^/]+)\/delivery$/.exec(path))) {
        core.retrieveEvent(m[1]);
        return reply(200, core.state.deliveries[m[1]] ?? null);
      }
      if (method === 'GET' && path === '/_test/webhooks') return reply(200, dispatcher.summary());
      if (method === 'POST' && path === '/_test/webhooks/pause') {
        dispatcher.pause();
        return reply(200, dispatcher.summary());
      }
      if (method === 'POST' && path === '/_test/webhooks/resume') {
        return reply(200, { delivered: await dispatcher.resume() });
      }
      if (method === 'POST' && path === '/_test/webhooks/flush') {
        const order = p.oneOf('order', ['forward', 'reverse'] as const) ?? (url.searchParams.get('order') === 'reverse' ? 'reverse' : 'forward');
        const ids = p.stringList('ids');
        return reply(200, { delivered: await dispatcher.flush(order, ids.length ? ids : undefined) });
      }
      if (method === 'POST' && path === '/_test/webhooks/config') {
        const newUrl = p.string('url');
        const secret = p.string('secret');
        if (p.has('url')) dispatcher.url = newUrl;
        if (p.has('secret')) dispatcher.secret = secret;
        return reply(200, dispatcher.summary());
      }
      if (method === 'POST' && path === '/_test/fail-next') {
        failNext.remaining = p.integer('count', { min: 0 }) ?? 1;
        failNext.status = p.integer('status', { min: 400 }) ?? 500;
        failNext.mode = p.oneOf('mode', ['error', 'disconnect'] as const) ?? 'error';
        return reply(200, { ...failNext });
      }
      if (method === 'POST' && path === '/_test/reset') {
        if (laterTimer) clearTimeout(laterTimer);
        laterTimer = undefined;
        store.reset();
        core.takeFreshEvents();
        return reply(200, { ok: true });
      }
      return reply(404, { error: { type: 'invalid_request_error', message: `No test control at ${method} ${path}.` } });
    } catch (err) {
      commit();
      if (err instanceof ApiError) return reply(err.status, { error: err.body });
      throw err;
    }
  }

  // ------------------------------------------------------------------ pages
  function redirect(res: http.ServerResponse, location: string) {
    res.writeHead(303, { location, 'cache-control': 'no-store' });
    res.end();
  }

  function html(res: http.ServerResponse, status: number, page: string) {
    res.writeHead(status, {
      'content-type': 'text/html; charset=utf-8',
      'cache-control': 'no-store',
      'content-length': Buffer.byteLength(page),
    });
    res.end(page);
  }

  function returnTo(returnUrl: string, piId: string, outcome: 'succeeded' | 'failed'): string {
    const target = new URL(returnUrl);
    target.searchParams.set('payment_intent', piId);
    target.searchParams.set('payment_intent_client_secret', core.state.paymentIntents[piId]?.client_secret ?? '');
    target.searchParams.set('redirect_status', outcome);
    return target.toString();
  }

  function handlePayPage(req: http.IncomingMessage, res: http.ServerResponse, url: URL, body: string): void {
    const m = /^\/pay\/([^/]+)(\/authenticate)?$/.exec(url.pathname)!;
    const piId = decodeURIComponent(m[1]);
    const authenticateStep = Boolean(m[2]);
    const pi = core.state.paymentIntents[piId];
    if (!pi) return html(res, 404, messagePage('Payment not found', `There is no payment with reference ${piId}.`));
    const form = req.method === 'POST' ? new URLSearchParams(body) : new URLSearchParams();
    const givenReturn = form.get('return_url') || url.searchParams.get('return_url') || undefined;
    const returnUrl = isHttpUrl(givenReturn) ? givenReturn : core.state.paymentIntentReturnUrls[piId];
    const query = returnUrl ? `?return_url=${encodeURIComponent(returnUrl)}` : '';
    const amountText = formatMoney(pi.amount, pi.currency);
    const pageUrl = `/pay/${encodeURIComponent(piId)}`;
    const finish = (outcome: 'succeeded' | 'failed', title: string, message: string, ok: boolean) => {
      if (returnUrl) return redirect(res, returnTo(returnUrl, piId, outcome));
      return html(res, 200, messagePage(title, message, undefined, ok));
    };

    if (pi.status === 'succeeded') {
      return html(
        res,
        200,
        messagePage('Payment complete', `${amountText} has been paid.`, returnUrl ? { href: returnTo(returnUrl, piId, 'succeeded'), text: 'Continue' } : undefined, true),
      );
    }
    if (pi.status === 'canceled') {
      return html(res, 200, messagePage('Payment canceled', 'This payment was canceled and can no longer be paid.', returnUrl ? { href: returnUrl, text: 'Back' } : undefined));
    }

    if (authenticateStep) {
      if (pi.status !== 'requires_action') return redirect(res, pageUrl + query);
      if (req.method !== 'POST') {
        return html(res, 200, authenticatePage({ action: `${pageUrl}/authenticate`, amountText, reference: piId, returnUrl: returnUrl ?? null }));
      }
      const approve = form.get('outcome') !== 'fail';
      const after = core.authenticate(piId, approve);
      commit();
      return after.status === 'succeeded'
        ? finish('succeeded', 'Payment complete', `${amountText} has been paid.`, true)
        : finish('failed', 'Payment not confirmed', 'The payment was not confirmed. Try again with another card.', false);
    }

    if (pi.status === 'requires_action') return redirect(res, `${pageUrl}/authenticate${query}`);

    const pageInput = { action: pageUrl, amountText, description: pi.description, reference: piId, returnUrl: returnUrl ?? null };
    if (req.method !== 'POST') return html(res, 200, paymentPage(pageInput));

    const number = normalizeCardNumber(form.get('card_number') ?? '');
    const expiryText = form.get('expiry') ?? '';
    const cvc = (form.get('cvc') ?? '').trim();
    const name = (form.get('name') ?? '').trim() || undefined;
    const values = { number: form.get('card_number') ?? '', expiry: expiryText, name };
    const again = (error: string) => html(res, 200, paymentPage({ ...pageInput, error, values }));
    if (!luhnValid(number)) return again('That card number is not valid. Check the digits and try again.');
    if (!findTestCard(number)) return again('This test server takes only the test card numbers listed below.');
    const expiry = parseExpiry(expiryText);
    if (!expiry) return again('Enter the expiry date as MM/YY.');
    if (expiryInPast(expiry)) return again('That expiry date has passed.');
    if (!/^\d{3,4}$/.test(cvc)) return again('Enter the 3- or 4-digit security code.');

    const after = core.payWithCard(piId, { number, expMonth: expiry.month, expYear: expiry.year, cvc, name }, NO_REQUEST);
    commit();
    if (after.status === 'succeeded') return finish('succeeded', 'Payment complete', `${amountText} has been paid.`, true);
    if (after.status === 'requires_action') return redirect(res, `${pageUrl}/authenticate${query}`);
    const declined = (after.last_payment_error as { message?: string } | null)?.message ?? 'The card was declined.';
    if (returnUrl) return redirect(res, returnTo(returnUrl, piId, 'failed'));
    return again(`${declined} Try another card.`);
  }

  function handleOnboarding(req: http.IncomingMessage, res: http.ServerResponse, url: URL, body: string): void {
    const token = decodeURIComponent(url.pathname.slice('/onboarding/'.length));
    const link = core.state.accountLinks[token];
    if (!link) return html(res, 404, messagePage('Link not found', 'This onboarding link does not exist.'));
    const acct = core.state.accounts[link.account];
    if (req.method !== 'POST') {
      // Links are single use and short lived: a second visit or a late one goes back to the app for a fresh link.
      if (link.completed || link.opened_session || link.expires_at < nowSeconds() || !acct) {
        return redirect(res, link.refresh_url);
      }
      link.opened_session = randomToken(24);
      store.mark('accountLinks', token);
      commit();
      return html(
        res,
        200,
        onboardingPage({
          action: url.pathname,
          accountId: acct.id,
          email: acct.email,
          session: link.opened_session,
          update: link.type === 'account_update',
        }),
      );
    }
    const form = new URLSearchParams(body);
    if (link.completed || !link.opened_session || form.get('session') !== link.opened_session) {
      return redirect(res, link.refresh_url);
    }
    link.completed = true;
    store.mark('accountLinks', token);
    if (form.get('choice') === 'complete') core.completeOnboarding(link.account);
    commit();
    return redirect(res, link.return_url);
  }

  // ------------------------------------------------------------------ server
  const server = http.createServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://fake.local');
    const started = Date.now();
    res.on('finish', () => log?.(`${req.method} ${url.pathname} ${res.statusCode} ${Date.now() - started}ms`));
    readBody(req)
      .then(async (body) => {
        const path = url.pathname;
        if (path.startsWith('/v1/')) return handleApi(req, res, url, body);
        if (path.startsWith('/_test/')) return handleTest(req, res, url, body);
        if (/^\/pay\/[^/]+(\/authenticate)?$/.test(path)) return handlePayPage(req, res, url, body);
        if (path.startsWith('/onboarding/')) return handleOnboarding(req, res, url, body);
        if (path === '/health') return sendJson(res, 200, JSON.stringify({ ok: true }));
        if (path === '/') return html(res, 200, indexPage());
        return html(res, 404, messagePage('Not found', 'Nothing here.'));
      })
      .catch((err: unknown) => {
        const status = err instanceof HttpProblem ? err.status : 500;
        if (!(err instanceof HttpProblem)) log?.(`error: ${(err as Error)?.stack ?? String(err)}`);
        if (!res.headersSent) {
          sendJson(res, status, errorJson({ type: status === 500 ? 'api_error' : 'invalid_request_error', message: (err as Error).message }));
        } else {
          res.destroy();
        }
      });
  });

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port, host, () => {
      server.off('error', reject);
      resolve();
    });
  });
  const port = (server.address() as AddressInfo).port;
  const urlHost = host === '0.0.0.0' || host === '::' ? '127.0.0.1' : host.includes(':') ? `[${host}]` : host;
  const url = `http://${urlHost}:${port}`;
  core.baseUrl = (options.publicBaseUrl ?? url).replace(/\/$/, '');
  dispatcher.resumeUnfinished();
  commit();

  let closing: Promise<void> | undefined;
  return {
    url,
    port,
    close() {
      closing ??= new Promise<void>((resolve) => {
        dispatcher.close();
        stopped = true;
        persist();
        store.compact();
        server.close(() => resolve());
        server.closeAllConnections();
      });
      return closing;
    },
  };
}
