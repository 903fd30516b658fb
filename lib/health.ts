import 'server-only';
import { db } from '@/lib/db';

export type Health = { status: 'ok'; db: 'ok' } | { status: 'error'; db: 'down'; reason: string };

const DB_CHECK_TIMEOUT_MS = 2_000;

/** A real round trip to the database, bounded in time so a hung server reports instead of hanging. */
export async function checkHealth(): Promise<Health> {
  try {
    await Promise.race([
      db.raw('select 1'),
      new Promise((_, reject) => setTimeout(() => reject(new Error('database did not answer in time')), DB_CHECK_TIMEOUT_MS)),
    ]);
    return { status: 'ok', db: 'ok' };
  } catch (err) {
    const code = (err as { code?: string }).code;
    const reason = code === 'ECONNREFUSED' ? 'database refused the connection' : (err as Error).message.split('\n')[0];
    return { status: 'error', db: 'down', reason };
  }
}
