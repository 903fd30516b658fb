// Who stands where on a job: its rider, a member of its shop, or an admin. Everyone else gets 404,
// so a job's existence does not leak; someone on the job but on the wrong side gets 403.
import type { SessionUser } from '@/lib/auth/roles';
import { Forbidden, NotFound } from '@/lib/errors';
import type { JobRow } from './jobStates';

export type JobSide = 'rider' | 'builder' | 'admin';

export function sideOf(actor: SessionUser, job: Pick<JobRow, 'rider_id' | 'shop_id'>): JobSide | null {
  if (actor.role === 'admin') return 'admin';
  if (actor.role === 'rider' && actor.id === job.rider_id) return 'rider';
  if (actor.role === 'builder' && actor.shopId === job.shop_id) return 'builder';
  return null;
}

const SIDE_WORDS: Record<JobSide, string> = { rider: 'the rider', builder: 'the builder', admin: 'an admin' };

export function requireSide<S extends JobSide>(actor: SessionUser, job: Pick<JobRow, 'rider_id' | 'shop_id'>, allowed: readonly S[]): S {
  const side = sideOf(actor, job);
  if (!side) throw new NotFound('Job not found.');
  if (!(allowed as readonly JobSide[]).includes(side)) throw new Forbidden(`Only ${allowed.map((s) => SIDE_WORDS[s]).join(' or ')} can do that.`);
  return side as S;
}
