// Signs events in the API's webhook scheme and delivers them to one endpoint, with
// bounded retries and test controls (hold, release in any order, re-send).
import { createHmac } from 'node:crypto';
import http from 'node:http';
import https from 'node:https';
import type { DeliveryAttempt, DeliveryRecord, State } from './store';
import { nowSeconds } from './ids';

/** `t=<unix seconds>,v1=<hex HMAC-SHA256 of "t.payload" keyed with the endpoint secret>` */
export function signatureHeader(payload: string, secret: string, timestamp = nowSeconds()): string {
  const v1 = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex');
  return `t=${timestamp},v1=${v1}`;
}

/** About 10 minutes in all: long enough for the app to restart, short enough to be bounded. */
export const DEFAULT_RETRY_DELAYS_MS = [1_000, 2_000, 5_000, 15_000, 30_000, 60_000, 120_000, 300_000];

export interface DeliveryResult {
  event: string;
  type: string;
  status: number | null;
  error: string | null;
}

interface DispatcherOptions {
  url?: string;
  secret?: string;
  retryDelaysMs: number[];
  timeoutMs: number;
  getState: () => State;
  /** A delivery record changed and should be saved. */
  changed: (eventId: string) => void;
}

const MAX_ATTEMPTS_KEPT = 25;

export class WebhookDispatcher {
  url: string | undefined;
  secret: string | undefined;
  paused = false;
  private closed = false;
  // First attempts run one after another so that, left alone, events arrive in the order they happened.
  private chain: Promise<unknown> = Promise.resolve();
  private readonly timers = new Set<NodeJS.Timeout>();
  private readonly inflight = new Set<http.ClientRequest>();

  constructor(private readonly opts: DispatcherOptions) {
    this.url = opts.url;
    this.secret = opts.secret;
  }

  private record(eventId: string): DeliveryRecord {
    const state = this.opts.getState();
    let rec = state.deliveries[eventId];
    if (!rec) {
      rec = { event: eventId, status: 'pending', attempts: [] };
      state.deliveries[eventId] = rec;
    }
    return rec;
  }

  /** Called once for each new event, after the state holding it has been saved. */
  enqueue(eventId: string): void {
    const rec = this.record(eventId);
    this.opts.changed(eventId);
    if (!this.url) {
      rec.status = 'no_endpoint';
      return;
    }
    if (this.paused) {
      rec.status = 'held';
      return;
    }
    rec.status = 'pending';
    this.chain = this.chain.then(() => this.attempt(eventId, 'automatic', 0));
  }

  /** On start: deliveries left unfinished by the previous run go out again. */
  resumeUnfinished(): void {
    const state = this.opts.getState();
    for (const rec of Object.values(state.deliveries)) {
      if (rec.status === 'pending' || rec.status === 'held') this.enqueue(rec.event);
    }
  }

  private async attempt(eventId: string, kind: DeliveryAttempt['kind'], retryIndex: number): Promise<DeliveryResult> {
    const rec = this.record(eventId);
    if (this.closed) return this.result(eventId, null, 'closed');
    if (this.paused && kind !== 'flush') {
      rec.status = 'held';
      this.opts.changed(eventId);
      return this.result(eventId, null, 'held');
    }
    const outcome = await this.send(eventId, kind);
    if (this.closed) return outcome;
    if (outcome.status !== null && outcome.status >= 200 && outcome.status < 300) {
      rec.status = 'delivered';
    } else if (retryIndex < this.opts.retryDelaysMs.length) {
      rec.status = 'pending';
      this.schedule(eventId, this.opts.retryDelaysMs[retryIndex], retryIndex + 1);
    } else {
      rec.status = 'failed';
    }
    this.opts.changed(eventId);
    return outcome;
  }

  private schedule(eventId: string, delayMs: number, retryIndex: number): void {
    const timer = setTimeout(() => {
      this.timers.delete(timer);
      const rec = this.opts.getState().deliveries[eventId];
      // A re-send or a flush may have delivered it meanwhile.
      if (!rec || rec.status !== 'pending') return;
      void this.attempt(eventId, 'retry', retryIndex);
    }, delayMs);
    timer.unref();
    this.timers.add(timer);
  }

  private result(eventId: string, status: number | null, error: string | null): DeliveryResult {
    const event = this.opts.getState().events[eventId];
    return { event: eventId, type: event?.type ?? 'unknown', status, error };
  }

  /** One signed POST; never throws. */
  private send(eventId: string, kind: DeliveryAttempt['kind']): Promise<DeliveryResult> {
    const state = this.opts.getState();
    const event = state.events[eventId];
    const url = this.url;
    const secret = this.secret;
    if (!event) return Promise.resolve(this.result(eventId, null, 'unknown event'));
    if (!url || !secret) return Promise.resolve(this.result(eventId, null, 'no endpoint configured'));
    const payload = JSON.stringify(event, null, 2);
    const header = signatureHeader(payload, secret);
    return new Promise<DeliveryResult>((resolve) => {
      let settled = false;
      const finish = (status: number | null, error: string | null) => {
        if (settled) return;
        settled = true;
        const rec = this.record(eventId);
        rec.attempts.push({ at: Date.now(), status, error, kind });
        if (rec.attempts.length > MAX_ATTEMPTS_KEPT) rec.attempts.splice(0, rec.attempts.length - MAX_ATTEMPTS_KEPT);
        resolve(this.result(eventId, status, error));
      };
      let target: URL;
      try {
        target = new URL(url);
      } catch {
        finish(null, `invalid webhook URL ${url}`);
        return;
      }
      const client = target.protocol === 'https:' ? https : http;
      const req = client.request(
        target,
        {
          method: 'POST',
          agent: false,
          headers: {
            'content-type': 'application/json; charset=utf-8',
            'content-length': Buffer.byteLength(payload),
            'stripe-signature': header,
            'user-agent': 'LacewrightPaymentsFake/1.0',
            connection: 'close',
          },
        },
        (res) => {
          res.resume();
          res.on('end', () => {
            this.inflight.delete(req);
            finish(res.statusCode ?? null, null);
          });
          res.on('error', (err) => finish(res.statusCode ?? null, err.message));
        },
      );
      this.inflight.add(req);
      req.setTimeout(this.opts.timeoutMs, () => req.destroy(new Error(`timed out after ${this.opts.timeoutMs} ms`)));
      req.on('error', (err) => {
        this.inflight.delete(req);
        finish(null, err.message);
      });
      req.end(payload);
    });
  }

  pause(): void {
    this.paused = true;
  }

  /** Delivers held events one at a time, waiting for each answer, in the order asked. */
  async flush(order: 'forward' | 'reverse' = 'forward', only?: string[]): Promise<DeliveryResult[]> {
    const state = this.opts.getState();
    let ids = only ?? Object.values(state.deliveries).filter((d) => d.status === 'held').map((d) => d.event);
    if (!only && order === 'reverse') ids = ids.reverse();
    const results: DeliveryResult[] = [];
    for (const id of ids) {
      const rec = state.deliveries[id];
      if (!rec || rec.status !== 'held') continue;
      results.push(await this.attempt(id, 'flush', 0));
    }
    return results;
  }

  async resume(): Promise<DeliveryResult[]> {
    this.paused = false;
    return this.flush('forward');
  }

  /** Sends an event once more, whatever happened before (a deliberate duplicate). */
  async resend(eventId: string): Promise<DeliveryResult> {
    const outcome = await this.send(eventId, 'resend');
    const rec = this.record(eventId);
    if (outcome.status !== null && outcome.status >= 200 && outcome.status < 300) rec.status = 'delivered';
    this.opts.changed(eventId);
    return outcome;
  }

  summary(): Record<string, unknown> {
    const deliveries = Object.values(this.opts.getState().deliveries);
    const ids = (status: string) => deliveries.filter((d) => d.status === status).map((d) => d.event);
    return {
      url: this.url ?? null,
      paused: this.paused,
      held: ids('held'),
      pending: ids('pending'),
      failed: ids('failed'),
      delivered: ids('delivered').length,
    };
  }

  close(): void {
    this.closed = true;
    for (const t of this.timers) clearTimeout(t);
    this.timers.clear();
    for (const req of this.inflight) req.destroy();
    this.inflight.clear();
  }
}
