// Invitations to bid: the matcher's, written when a request is published, and a rider's, sent from a shop's
// page. Each shop hears about a request at most once (a unique row per request and shop), and the e-mail
// is written to the outbox in the transaction that records the invitation.
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { Conflict, NotFound } from '@/lib/errors';
import { bidInvitationMail } from '@/lib/mail/notices';
import { requireOwner, requireRider } from '@/lib/market/access';
import { notify, shopMemberEmails } from '@/lib/market/notify';
import { dateOnly, type RequestRow } from '@/lib/market/rows';
import { assertRequestTakesBids, lockRequest } from '@/lib/market/states';
import { rankShops, type RankedShop } from './rankShops';
import { MATCH_SETTINGS } from './settings';

type Source = 'match' | 'rider';

/** Records the invitation unless the shop already has one for this request; mails the shop only if new. */
async function recordInvitation(
  trx: Knex,
  request: Pick<RequestRow, 'id' | 'title' | 'city' | 'region' | 'needed_by'>,
  shopId: string,
  from: { source: Source; invitedBy?: string; score?: number; reasons?: string[] },
): Promise<boolean> {
  const inserted = await trx('shop_invitations')
    .insert({
      request_id: request.id,
      shop_id: shopId,
      source: from.source,
      invited_by: from.invitedBy ?? null,
      match_score: from.score ?? null,
      reasons: JSON.stringify(from.reasons ?? []),
    })
    .onConflict(['request_id', 'shop_id'])
    .ignore()
    .returning('id');
  if (inserted.length === 0) return false;
  await notify(
    trx,
    'request.invitation',
    await shopMemberEmails(trx, shopId),
    (to) =>
      bidInvitationMail(to, {
        requestId: request.id,
        requestTitle: request.title,
        place: `${request.city}, ${request.region}`,
        neededBy: dateOnly(request.needed_by),
        reasons: from.reasons ?? [],
        from: from.source,
      }),
    (to) => `request.invitation:${request.id}:${shopId}:${to}`,
  );
  return true;
}

/**
 * Inside the publishing transaction (the request row locked): invites the best-ranked shops that have not
 * bid or been invited yet. Returns the shops invited now.
 */
export async function inviteMatchingShops(trx: Knex.Transaction, request: RequestRow, now = new Date()): Promise<RankedShop[]> {
  const ranked = await rankShops(trx, request, now);
  const chosen = ranked.filter((s) => !s.invited && !s.hasBid).slice(0, MATCH_SETTINGS.inviteCount);
  const invited: RankedShop[] = [];
  for (const shop of chosen) {
    const score = Math.round(shop.score * 10_000) / 10_000;
    if (await recordInvitation(trx, request, shop.shopId, { source: 'match', score, reasons: shop.reasons })) invited.push(shop);
  }
  return invited;
}

export interface InvitationResult {
  requestId: string;
  shopSlug: string;
  /** False when the shop had already been invited to this request; no second e-mail goes out. */
  invitedNow: boolean;
}

/** A rider invites a shop to bid on one of their open requests. */
export async function inviteShopToBid(db: Knex, actor: SessionUser, shopSlug: string, requestId: string, now = new Date()): Promise<InvitationResult> {
  requireRider(actor);
  return db.transaction(async (trx) => {
    const request = await lockRequest(trx, requestId);
    await requireOwner(trx, actor, request);
    assertRequestTakesBids(request, now);
    const shop = (await trx('shops').where({ slug: shopSlug }).first('id', 'slug')) as { id: string; slug: string } | undefined;
    if (!shop) throw new NotFound('Shop not found.');
    if (await trx('bids').where({ request_id: request.id, shop_id: shop.id }).first('id')) throw new Conflict('This shop has already bid on this request.');
    const invitedNow = await recordInvitation(trx, request, shop.id, { source: 'rider', invitedBy: actor.id });
    return { requestId: request.id, shopSlug: shop.slug, invitedNow };
  });
}

export interface InvitableRequest {
  id: string;
  title: string;
  /** This shop has already been invited to it. */
  invited: boolean;
  /** This shop has already bid on it. */
  hasBid: boolean;
}

/** The rider's open requests, as choices for inviting one shop. */
export async function invitableRequests(db: Knex, actor: SessionUser, shopSlug: string, now = new Date()): Promise<InvitableRequest[]> {
  if (actor.role !== 'rider') return [];
  const shop = (await db('shops').where({ slug: shopSlug }).first('id')) as { id: string } | undefined;
  if (!shop) throw new NotFound('Shop not found.');
  const rows = await db('wheel_requests as r')
    .where({ 'r.rider_id': actor.id, 'r.status': 'open' })
    .andWhere('r.expires_at', '>', now)
    .orderBy('r.published_at', 'desc')
    .select(
      'r.id',
      'r.title',
      db.raw('exists (select 1 from shop_invitations i where i.request_id = r.id and i.shop_id = ?) as invited', [shop.id]),
      db.raw('exists (select 1 from bids b where b.request_id = r.id and b.shop_id = ?) as has_bid', [shop.id]),
    );
  return rows.map((r) => ({ id: r.id, title: r.title, invited: r.invited, hasBid: r.has_bid }));
}
