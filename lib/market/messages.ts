// Messages: one thread per request and shop, open to that rider, that shop's members and admins only.
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { Forbidden, NotFound } from '@/lib/errors';
import { marketLinks, newMessageMail } from '@/lib/mail/notices';
import { isOwner, isUuid, loadVisibleRequest, shopIsInvolved } from './access';
import { notify, riderEmail, shopMemberEmails } from './notify';
import type { RequestRow } from './rows';

export interface MessageView {
  id: string;
  authorId: string | null;
  authorName: string;
  /** Which side wrote it: the rider, the shop, or an admin. */
  authorSide: 'rider' | 'shop' | 'admin';
  body: string;
  createdAt: string;
  /** Written by someone else after the viewer last read the thread. */
  isNew: boolean;
}

export interface ThreadView {
  requestId: string;
  shopId: string;
  shopName: string;
  messages: MessageView[];
  canPost: boolean;
}

interface ThreadAccess {
  request: RequestRow;
  shop: { id: string; name: string };
  canPost: boolean;
}

/** Who may read and write the thread between a request's rider and one shop. */
export async function threadAccess(db: Knex, actor: SessionUser, requestId: string, shopId: string): Promise<ThreadAccess> {
  if (!isUuid(shopId)) throw new NotFound('Conversation not found.');
  if (actor.role === 'builder' && actor.shopId !== shopId) throw new NotFound('Conversation not found.');
  const request = await loadVisibleRequest(db, actor, requestId);
  const shop = await db('shops').where({ id: shopId }).first('id', 'name');
  if (!shop) throw new NotFound('Conversation not found.');
  if (actor.role === 'admin') return { request, shop, canPost: false };
  if (isOwner(actor, request)) {
    // A rider writes to shops that bid or wrote first, never cold to any shop.
    if (!(await shopIsInvolved(db, shopId, request.id))) throw new NotFound('Conversation not found.');
    return { request, shop, canPost: true };
  }
  // A builder reaches here only for an open request or one their shop already took part in.
  return { request, shop, canPost: true };
}

/** Everything up to now (and up to the newest message, whatever the clocks say) counts as read. */
export async function markThreadRead(db: Knex, actor: SessionUser, requestId: string, shopId: string): Promise<void> {
  await db.raw(
    `insert into thread_reads (user_id, request_id, shop_id, last_read_at)
     select ?, ?, ?, greatest(now(), (select max(created_at) from messages where request_id = ? and shop_id = ?))
     on conflict (user_id, request_id, shop_id) do update set last_read_at = greatest(thread_reads.last_read_at, excluded.last_read_at)`,
    [actor.id, requestId, shopId, requestId, shopId],
  );
}

/** The thread's messages, oldest first, with new ones flagged; reading marks them read. */
export async function listThreadMessages(db: Knex, actor: SessionUser, requestId: string, shopId: string, opts: { markRead?: boolean } = {}): Promise<ThreadView> {
  const access = await threadAccess(db, actor, requestId, shopId);
  const rows = await db('messages as m')
    .leftJoin('users as u', 'u.id', 'm.author_id')
    .where({ 'm.request_id': access.request.id, 'm.shop_id': shopId })
    .orderBy('m.created_at')
    .orderBy('m.id')
    .select(
      'm.id',
      'm.author_id',
      'm.body',
      'm.created_at',
      'u.name as author_name',
      'u.role as author_role',
      db.raw(
        `(m.author_id is distinct from ? and m.created_at > coalesce(
            (select tr.last_read_at from thread_reads tr where tr.user_id = ? and tr.request_id = m.request_id and tr.shop_id = m.shop_id),
            '-infinity'::timestamptz)) as is_new`,
        [actor.id, actor.id],
      ),
    );
  if (opts.markRead !== false) await markThreadRead(db, actor, access.request.id, shopId);
  return {
    requestId: access.request.id,
    shopId,
    shopName: access.shop.name,
    canPost: access.canPost,
    messages: rows.map((m) => ({
      id: m.id,
      authorId: m.author_id,
      authorName: m.author_name ?? 'Former member',
      authorSide: m.author_role === 'admin' ? 'admin' : m.author_id === access.request.rider_id ? 'rider' : 'shop',
      body: m.body,
      createdAt: new Date(m.created_at).toISOString(),
      isNew: m.is_new,
    })),
  };
}

/** Writes a message and queues a notice to the other side, in one transaction. */
export async function postMessage(db: Knex, actor: SessionUser, requestId: string, shopId: string, body: string): Promise<MessageView> {
  const access = await threadAccess(db, actor, requestId, shopId);
  if (!access.canPost) throw new Forbidden('Admins read conversations but do not write in them.');
  const { request } = access;
  const fromRider = isOwner(actor, request);
  return db.transaction(async (trx) => {
    const [row] = await trx('messages').insert({ request_id: request.id, shop_id: shopId, author_id: actor.id, body }).returning(['id', 'created_at']);
    // The author has read their own thread up to here.
    await markThreadRead(trx, actor, request.id, shopId);
    const recipients = fromRider ? await shopMemberEmails(trx, shopId) : [await riderEmail(trx, request.rider_id)];
    const fromName = fromRider ? actor.name : access.shop.name;
    const url = fromRider ? marketLinks.builderRequest(request.id) : marketLinks.riderRequest(request.id);
    await notify(trx, 'message.new', recipients, (to) => newMessageMail(to, { requestTitle: request.title, fromName, excerpt: body, url }));
    return {
      id: row.id,
      authorId: actor.id,
      authorName: actor.name,
      authorSide: fromRider ? 'rider' : 'shop',
      body,
      createdAt: new Date(row.created_at).toISOString(),
      isNew: false,
    };
  });
}
