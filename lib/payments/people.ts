// Who hears about a job's money: looked up inside the transaction that causes the notice.
import type { Knex } from 'knex';
import { enqueueMail } from '@/lib/mail/outbox';
import type { MailContent } from '@/lib/mail/transport';

export async function riderAddress(db: Knex, riderId: string): Promise<string | null> {
  return ((await db('users').where({ id: riderId }).first('email')) as { email: string } | undefined)?.email ?? null;
}

export async function shopAddresses(db: Knex, shopId: string): Promise<string[]> {
  return db('shop_members as m').join('users as u', 'u.id', 'm.user_id').where('m.shop_id', shopId).orderBy('u.email').pluck('u.email');
}

export async function adminAddresses(db: Knex): Promise<string[]> {
  return db('users').where({ role: 'admin' }).orderBy('email').pluck('email');
}

export async function jobTitle(db: Knex, requestId: string): Promise<string> {
  return ((await db('wheel_requests').where({ id: requestId }).first('title')) as { title: string } | undefined)?.title ?? 'your wheel';
}

export async function shopDisplayName(db: Knex, shopId: string): Promise<string> {
  return ((await db('shops').where({ id: shopId }).first('name')) as { name: string } | undefined)?.name ?? 'The shop';
}

/** Queues one notice per address in the caller's transaction; it goes out only if that commits. */
export async function mailEach(
  trx: Knex,
  kind: string,
  recipients: (string | null)[],
  compose: (to: string) => MailContent,
  dedupeKey?: (to: string) => string,
): Promise<void> {
  const addresses = [...new Set(recipients.filter((r): r is string => !!r))];
  await enqueueMail(
    trx,
    addresses.map((to) => ({ kind, ...compose(to), ...(dedupeKey ? { dedupeKey: dedupeKey(to) } : {}) })),
  );
}
