import 'server-only';
import { env } from '@/lib/env';
import type { CaughtMessage } from './caught-message';

export type { CaughtMessage };


/** Mail the local SMTP catcher received (demo mode only). */
export async function listCaughtMail(to?: string): Promise<CaughtMessage[]> {
  const url = new URL('/messages', env.MAIL_CATCHER_URL);
  if (to) url.searchParams.set('to', to);
  const res = await fetch(url, { cache: 'no-store', signal: AbortSignal.timeout(3_000) });
  if (!res.ok) throw new Error(`mail catcher answered ${res.status}`);
  return (await res.json()) as CaughtMessage[];
}
