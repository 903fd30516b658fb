import 'server-only';
import type { Knex } from 'knex';
import { db as appDb } from '@/lib/db';
import { consumeRateLimit, peekRateLimit, resetRateLimit, strictest, type RateLimitRule, type RateLimitVerdict } from './rateLimit';
import { clientAddress } from './clientAddress';

// What each door allows, in one place. Sign-in counts only failures, so people who know their password
// are never slowed down; per account it stops guessing at one person, per address guessing across many.
export const RATE_LIMITS = {
  signInFailuresPerAccount: { name: 'sign-in-failures:account', limit: 10, windowSeconds: 15 * 60 },
  signInFailuresPerAddress: { name: 'sign-in-failures:address', limit: 50, windowSeconds: 15 * 60 },
  signInLinksPerAccount: { name: 'sign-in-links:account', limit: 5, windowSeconds: 60 * 60 },
  signInLinksPerAddress: { name: 'sign-in-links:address', limit: 30, windowSeconds: 60 * 60 },
  signUpsPerAddress: { name: 'sign-ups:address', limit: 20, windowSeconds: 60 * 60 },
  publicApiPerAddress: { name: 'public-api:address', limit: 120, windowSeconds: 60 },
} as const satisfies Record<string, RateLimitRule>;

const ALLOWED: RateLimitVerdict = { allowed: true, hits: 0, limit: 0, retryAfterSeconds: 0 };

/**
 * Runs a limiter, letting the request through when the counter store cannot be reached: an outage of
 * the store should not also take down the doors it guards (those that need the database fail anyway).
 */
async function orAllow(check: () => Promise<RateLimitVerdict>): Promise<RateLimitVerdict> {
  try {
    return await check();
  } catch (err) {
    console.warn('rate limit store unavailable; letting the request through:', (err as Error).message);
    return ALLOWED;
  }
}

const normalizeEmail = (email: string) => email.trim().toLowerCase();

function waitWords(seconds: number): string {
  if (seconds < 90) return `${seconds} seconds`;
  return `${Math.ceil(seconds / 60)} minutes`;
}

/** 429 with a plain sentence and Retry-After; `extra` joins the JSON body (next-auth's client reads `url`). */
export function tooManyRequests(verdict: RateLimitVerdict, what: string, extra: Record<string, unknown> = {}): Response {
  const seconds = Math.max(1, verdict.retryAfterSeconds);
  return Response.json(
    { error: `Too many ${what}. Please try again in ${waitWords(seconds)}.`, retryAfterSeconds: seconds, ...extra },
    { status: 429, headers: { 'Retry-After': String(seconds), 'Cache-Control': 'no-store' } },
  );
}

/** The public API (the fit check): a 429 response when this address has used its minute, otherwise null. */
export async function limitPublicApi(req: Request, db: Knex = appDb): Promise<Response | null> {
  const verdict = await orAllow(() => consumeRateLimit(db, RATE_LIMITS.publicApiPerAddress, clientAddress(req.headers)));
  return verdict.allowed ? null : tooManyRequests(verdict, 'requests from your network');
}

/** Sign-up: a 429 response when this address has made too many accounts lately, otherwise null. */
export async function limitSignUp(req: Request, db: Knex = appDb): Promise<Response | null> {
  const verdict = await orAllow(() => consumeRateLimit(db, RATE_LIMITS.signUpsPerAddress, clientAddress(req.headers)));
  return verdict.allowed ? null : tooManyRequests(verdict, 'new accounts from your network');
}

/** Before checking a password: is this account or address out of tries? Counts nothing. */
export function signInStanding(email: string, address: string, db: Knex = appDb): Promise<RateLimitVerdict> {
  return orAllow(async () =>
    strictest([
      await peekRateLimit(db, RATE_LIMITS.signInFailuresPerAccount, normalizeEmail(email)),
      await peekRateLimit(db, RATE_LIMITS.signInFailuresPerAddress, address),
    ]),
  );
}

export async function recordSignInFailure(email: string, address: string, db: Knex = appDb): Promise<void> {
  await orAllow(async () =>
    strictest([
      await consumeRateLimit(db, RATE_LIMITS.signInFailuresPerAccount, normalizeEmail(email)),
      await consumeRateLimit(db, RATE_LIMITS.signInFailuresPerAddress, address),
    ]),
  );
}

/** The right password ends the account's run of failures (the address keeps its count). */
export async function recordSignInSuccess(email: string, db: Knex = appDb): Promise<void> {
  await orAllow(async () => {
    await resetRateLimit(db, RATE_LIMITS.signInFailuresPerAccount, normalizeEmail(email));
    return ALLOWED;
  });
}

/** Counts one request for a sign-in link, per mailbox and per address. */
export function consumeSignInLink(email: string, address: string, db: Knex = appDb): Promise<RateLimitVerdict> {
  return orAllow(async () =>
    strictest([
      await consumeRateLimit(db, RATE_LIMITS.signInLinksPerAccount, normalizeEmail(email)),
      await consumeRateLimit(db, RATE_LIMITS.signInLinksPerAddress, address),
    ]),
  );
}
