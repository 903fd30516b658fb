import 'server-only';
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { Conflict, Forbidden, NotFound } from '@/lib/errors';
import { canSeeRequest } from '@/lib/market/access';
import type { RequestRow } from '@/lib/market/rows';
import type { UploadPurpose } from './schema';

// Who may add photos to a subject and who may see them, in one place.

async function isShopMember(db: Knex, userId: string, shopId: string): Promise<boolean> {
  return Boolean(await db('shop_members').where({ shop_id: shopId, user_id: userId }).first('user_id'));
}

/**
 * Riders add frame and dropout photos to their own live requests; builders add portfolio photos to
 * their shop and shipment photos to their shop's jobs. Missing subjects answer 404, others' 403.
 */
export async function assertCanAttach(db: Knex, user: SessionUser, purpose: UploadPurpose, subjectId: string): Promise<void> {
  if (purpose === 'request_photo') {
    const request = await db('wheel_requests').where({ id: subjectId }).first('rider_id', 'status');
    if (!request) throw new NotFound('Request not found.');
    if (user.role !== 'rider' || request.rider_id !== user.id) throw new Forbidden('Only the rider who posted this request can add photos to it.');
    if (request.status === 'cancelled' || request.status === 'expired') throw new Conflict(`This request is ${request.status}, so photos can no longer be added.`);
    return;
  }
  if (purpose === 'portfolio') {
    const shop = await db('shops').where({ id: subjectId }).first('id');
    if (!shop) throw new NotFound('Shop not found.');
    if (user.role !== 'builder' || !(await isShopMember(db, user.id, subjectId))) throw new Forbidden('Only members of this shop can add portfolio photos.');
    return;
  }
  const job = await db('jobs').where({ id: subjectId }).first('shop_id');
  if (!job) throw new NotFound('Job not found.');
  if (user.role !== 'builder' || !(await isShopMember(db, user.id, job.shop_id))) throw new Forbidden('Only the shop building this job can add shipment photos.');
}

export async function canAttach(db: Knex, user: SessionUser | null, purpose: UploadPurpose, subjectId: string): Promise<boolean> {
  if (!user) return false;
  try {
    await assertCanAttach(db, user, purpose, subjectId);
    return true;
  } catch (err) {
    if (err instanceof Forbidden || err instanceof NotFound || err instanceof Conflict) return false;
    throw err;
  }
}

/**
 * Portfolio photos are public. Request photos follow the request: its rider, admins, and builders
 * who may see the request (so they can bid on what they see). Shipment photos: the job's rider,
 * its shop's members and admins.
 */
export async function canViewSubject(db: Knex, viewer: SessionUser | null, purpose: UploadPurpose, subjectId: string): Promise<boolean> {
  if (purpose === 'portfolio') return Boolean(await db('shops').where({ id: subjectId }).first('id'));
  if (!viewer) return false;
  if (purpose === 'request_photo') {
    const request = (await db('wheel_requests').where({ id: subjectId }).first('id', 'rider_id', 'status')) as RequestRow | undefined;
    return Boolean(request && (await canSeeRequest(db, viewer, request)));
  }
  const job = await db('jobs').where({ id: subjectId }).first('rider_id', 'shop_id');
  if (!job) return false;
  if (viewer.role === 'admin' || viewer.id === job.rider_id) return true;
  return isShopMember(db, viewer.id, job.shop_id);
}
