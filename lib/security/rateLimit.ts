// Request counters kept in Postgres, so a limit holds across every app server. Fixed windows: a key may
// be hit `limit` times per window; a burst at a window's edge can reach twice that, which is fine for
// throttling guesses and scripted sign-ups. Keys are hashed, so no e-mail or address is stored.
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';

export interface RateLimitRule {
  /** Names the counter family, e.g. "sign-up:address". */
  name: string;
  limit: number;
  windowSeconds: number;
}

export interface RateLimitVerdict {
  allowed: boolean;
  /** Hits counted in the current window, this one included. */
  hits: number;
  limit: number;
  /** Seconds until the window ends (0 while allowed). */
  retryAfterSeconds: number;
}

/** Rows older than this past their window's end are swept now and then. */
const SWEEP_AFTER_SECONDS = 60;
const SWEEP_CHANCE = 0.02;

export function counterKey(rule: RateLimitRule, subject: string): string {
  return `${rule.name}:${createHash('sha256').update(subject).digest('hex').slice(0, 40)}`;
}

// The window is computed from the database clock, so app servers with skewed clocks share windows.
const WINDOW_START = 'to_timestamp(floor(extract(epoch from now()) / ?) * ?)';

function verdict(rule: RateLimitRule, hits: number, secondsLeft: number): RateLimitVerdict {
  const allowed = hits <= rule.limit;
  return { allowed, hits, limit: rule.limit, retryAfterSeconds: allowed ? 0 : Math.max(1, Math.ceil(secondsLeft)) };
}

/** Counts `cost` hits against the subject and says whether it is still within the rule. */
export async function consumeRateLimit(db: Knex, rule: RateLimitRule, subject: string, cost = 1): Promise<RateLimitVerdict> {
  const w = rule.windowSeconds;
  const { rows } = await db.raw<{ rows: { hits: number; seconds_left: string }[] }>(
    `insert into rate_limit_counters (key, window_start, hits, expires_at)
     values (?, ${WINDOW_START}, ?, ${WINDOW_START} + make_interval(secs => ?))
     on conflict (key, window_start) do update set hits = rate_limit_counters.hits + excluded.hits
     returning hits, extract(epoch from expires_at - now()) as seconds_left`,
    [counterKey(rule, subject), w, w, cost, w, w, w],
  );
  const row = rows[0];
  if (row.hits === cost && Math.random() < SWEEP_CHANCE) await sweepExpiredCounters(db);
  return verdict(rule, row.hits, Number(row.seconds_left));
}

/** The subject's standing without counting a hit: blocked once the window already holds `limit` hits. */
export async function peekRateLimit(db: Knex, rule: RateLimitRule, subject: string): Promise<RateLimitVerdict> {
  const w = rule.windowSeconds;
  const row = await db('rate_limit_counters')
    .where({ key: counterKey(rule, subject) })
    .andWhere('window_start', db.raw(WINDOW_START, [w, w]))
    .first('hits', db.raw('extract(epoch from expires_at - now()) as seconds_left'));
  if (!row) return { allowed: true, hits: 0, limit: rule.limit, retryAfterSeconds: 0 };
  // One more hit would go over: that is what a caller asking before acting needs to know.
  return verdict(rule, row.hits + 1, Number(row.seconds_left));
}

/** Forgets a subject's hits, e.g. after the right password ends a run of wrong ones. */
export async function resetRateLimit(db: Knex, rule: RateLimitRule, subject: string): Promise<void> {
  await db('rate_limit_counters').where({ key: counterKey(rule, subject) }).del();
}

export async function sweepExpiredCounters(db: Knex): Promise<number> {
  return db('rate_limit_counters').where('expires_at', '<', db.raw(`now() - make_interval(secs => ?)`, [SWEEP_AFTER_SECONDS])).del();
}

/** The most restrictive of several verdicts: blocked if any is, waiting for the longest. */
export function strictest(verdicts: RateLimitVerdict[]): RateLimitVerdict {
  const blocked = verdicts.filter((v) => !v.allowed);
  if (blocked.length === 0) return verdicts[0] ?? { allowed: true, hits: 0, limit: 0, retryAfterSeconds: 0 };
  return blocked.reduce((a, b) => (b.retryAfterSeconds > a.retryAfterSeconds ? b : a));
}
