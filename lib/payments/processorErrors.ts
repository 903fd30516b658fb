// How a failed call to the payments processor is told apart, and the plain words a person sees.
import Stripe from 'stripe';
import { DomainError } from '@/lib/errors';

/** 503: the processor could not be reached or failed; nothing changed on our side and trying later works. */
export class PaymentsUnavailable extends DomainError {
  readonly status = 503;
  constructor(message = 'The payment service is not answering right now. Nothing was charged and your job is unchanged; please try again in a few minutes.') {
    super(message);
  }
}

/** 502: the processor refused the request; retrying the same thing will not help. */
export class PaymentsRefused extends DomainError {
  readonly status = 502;
}

export type FailureKind =
  /** No answer at all (connection refused, dropped, timed out): the same idempotency key must be reused. */
  | 'unreachable'
  /** An answer the processor stores under the key (5xx, a refusal): a retry needs a fresh key suffix. */
  | 'answered';

export function failureKind(err: unknown): FailureKind {
  if (err instanceof Stripe.errors.StripeConnectionError) return 'unreachable';
  if (err instanceof Stripe.errors.StripeError && err.statusCode === undefined) return 'unreachable';
  return 'answered';
}

export function isProcessorError(err: unknown): err is Stripe.errors.StripeError {
  return err instanceof Stripe.errors.StripeError;
}

/** Text for the logs and the admin pages: the processor's code and message, short. */
export function describeFailure(err: unknown): string {
  if (err instanceof Stripe.errors.StripeError) {
    const code = err.code ? ` ${err.code}` : '';
    return `${err.statusCode ?? 'no answer'}${code}: ${err.message}`.slice(0, 500);
  }
  return String((err as Error)?.message ?? err).slice(0, 500);
}

/** The wait before the nth retry of a payout or refund: 1 min, 2, 4 … up to 6 hours. */
export function retryDelayMs(attempts: number): number {
  return Math.min(6 * 3_600_000, 60_000 * 2 ** Math.max(0, attempts - 1));
}
