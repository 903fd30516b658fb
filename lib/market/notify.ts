// Who hears about a market change: looked up and queued inside the transaction that makes the change.
import type { Knex } from 'knex';
import type { MailContent } from '@/lib/mail/transport';
import { enqueueMail } from '@/lib/mail/outbox';

export async function riderEmail(trx: Knex, riderId: string): Promise<string | null> {
  const row = await trx('users').where({ id: riderId }).first('email');
  return row?.email ?? null;
}

export async function shopMemberEmails(trx: Knex, shopId: string): Promise<string[]> {
  return trx('shop_members as m').join('users as u', 'u.id', 'm.user_id').where('m.shop_id', shopId).orderBy('u.email').pluck('u.email');
}

export async function shopName(trx: Knex, shopId: string): Promise<string> {
  const row = await trx('shops').where({ id: shopId }).first('name');
  return row?.name ?? 'A shop';
}

/** Queues one notice per address, worded for each by `compose`. */
export async function notify(
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
