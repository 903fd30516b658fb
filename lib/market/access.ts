// Who may see and act on a request, in one place. Hidden things answer 404 so their existence does not leak.
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { Forbidden, NotFound } from '@/lib/errors';
import type { RequestRow } from './rows';

export function isOwner(actor: SessionUser, request: Pick<RequestRow, 'rider_id'>): boolean {
  return actor.role === 'rider' && actor.id === request.rider_id;
}

/** The builder's shop, or 403 for anyone who is not a shop member. */
export function requireShopId(actor: SessionUser): string {
  if (actor.role !== 'builder' || !actor.shopId) throw new Forbidden('Only builders with a shop can do this.');
  return actor.shopId;
}

export function requireRider(actor: SessionUser): void {
  if (actor.role !== 'rider') throw new Forbidden('Only riders can do this.');
}

/** The request's own rider, or 404 (hidden) / 403 (visible but not theirs to change). */
export async function requireOwner(db: Knex, actor: SessionUser, request: RequestRow): Promise<void> {
  if (isOwner(actor, request)) return;
  if (await canSeeRequest(db, actor, request)) throw new Forbidden('Only the rider who posted this request can do that.');
  throw new NotFound('Request not found.');
}

/** Has this shop taken part in the request (a bid or a message)? */
export async function shopIsInvolved(db: Knex, shopId: string, requestId: string): Promise<boolean> {
  const row = await db
    .select(
      db.raw(
        'exists (select 1 from bids where request_id = ? and shop_id = ?) or exists (select 1 from messages where request_id = ? and shop_id = ?) as involved',
        [requestId, shopId, requestId, shopId],
      ),
    )
    .first();
  return Boolean(row?.involved);
}

/**
 * Riders see their own requests (drafts too) and nobody else's; admins see all; builders see open
 * requests, and closed ones their shop bid on or wrote about. No one but the rider sees a draft.
 */
export async function canSeeRequest(db: Knex, actor: SessionUser, request: RequestRow): Promise<boolean> {
  if (actor.role === 'admin') return true;
  if (actor.role === 'rider') return actor.id === request.rider_id;
  if (!actor.shopId || request.status === 'draft') return false;
  if (request.status === 'open') return true;
  return shopIsInvolved(db, actor.shopId, request.id);
}

export async function loadVisibleRequest(db: Knex, actor: SessionUser, requestId: string): Promise<RequestRow> {
  const row = isUuid(requestId) ? ((await db<RequestRow>('wheel_requests').where({ id: requestId }).first()) as RequestRow | undefined) : undefined;
  if (!row || !(await canSeeRequest(db, actor, row))) throw new NotFound('Request not found.');
  return row;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
/** Ids come from URLs; anything that is not a uuid is simply not found (and never reaches Postgres). */
export const isUuid = (value: string): boolean => UUID.test(value);

export function requireUuid(value: string, what: string): string {
  if (!isUuid(value)) throw new NotFound(`${what} not found.`);
  return value;
}
