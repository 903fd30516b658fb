// What one viewer may see of a job's reviews. A review is shown to the other side only once it is open
// to view (both written, or the review period over); its author's side always sees it; admins see all.
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { NotFound } from '@/lib/errors';
import { isJobId, type JobRow } from '@/lib/payments/jobStates';
import { authorLabels, reviewPeriodEnd, viewerSide, type ReviewViewerSide } from './access';
import { isEditable, isOpenToView, toReviewView, type ReviewRow, type ReviewView } from './rows';
import type { ReviewSide } from './schema';

export interface JobReviews {
  jobId: string;
  viewerSide: ReviewViewerSide;
  jobCompleted: boolean;
  completedAt: string | null;
  /** The last moment either side may write; hidden reviews open to view then at the latest. */
  writeUntil: string | null;
  /** The viewer's side has not written yet and still may. */
  canWrite: boolean;
  byRider: ReviewView | null;
  byShop: ReviewView | null;
  /** Whether each side has written, even when the viewer may not read it yet. */
  written: Record<ReviewSide, boolean>;
}

export async function getJobReviews(db: Knex, actor: SessionUser, jobId: string, now = new Date()): Promise<JobReviews> {
  if (!isJobId(jobId)) throw new NotFound('Job not found.');
  const job = (await db('jobs').where({ id: jobId }).first()) as JobRow | undefined;
  if (!job) throw new NotFound('Job not found.');
  const side = viewerSide(actor, job);
  const rows = (await db('reviews').where({ job_id: job.id })) as ReviewRow[];
  const labels = await authorLabels(db, job);
  const periodEnd = reviewPeriodEnd(job);
  const find = (s: ReviewSide) => rows.find((r) => r.author_side === s) ?? null;

  const shown = (s: ReviewSide): ReviewView | null => {
    const row = find(s);
    if (!row) return null;
    const own = side === s;
    if (!own && side !== 'admin' && !isOpenToView(row, now)) return null;
    return toReviewView(row, labels[s], own && isEditable(row, now));
  };

  const completed = job.status === 'completed' && periodEnd !== null;
  return {
    jobId: job.id,
    viewerSide: side,
    jobCompleted: completed,
    completedAt: job.completed_at ? new Date(job.completed_at).toISOString() : null,
    writeUntil: periodEnd ? periodEnd.toISOString() : null,
    canWrite: side !== 'admin' && completed && !find(side) && now.getTime() < periodEnd!.getTime(),
    byRider: shown('rider'),
    byShop: shown('shop'),
    written: { rider: Boolean(find('rider')), shop: Boolean(find('shop')) },
  };
}
