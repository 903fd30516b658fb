// The worker's review reminders: a few days after a job completes, each side that has not reviewed it
// hears once. The reminder row and its e-mail are written in one transaction under the job's lock.
import type { Knex } from 'knex';
import { enqueueMail } from '@/lib/mail/outbox';
import { reviewReminderMail } from '@/lib/mail/notices';
import type { JobRow } from '@/lib/payments/jobStates';
import { reviewPeriodEnd } from './access';
import type { ReviewSide } from './schema';
import { DAY_MS, REVIEW_SETTINGS } from './settings';

async function recipients(trx: Knex, job: JobRow, side: ReviewSide): Promise<string[]> {
  if (side === 'rider') return trx('users').where({ id: job.rider_id }).pluck('email');
  return trx('shop_members as m').join('users as u', 'u.id', 'm.user_id').where('m.shop_id', job.shop_id).orderBy('u.email').pluck('u.email');
}

/** Sends the reminders that are due; returns how many (job, side) reminders went out. */
export async function sendReviewReminders(db: Knex, now = new Date(), limit = 100): Promise<number> {
  const dueBefore = new Date(now.getTime() - REVIEW_SETTINGS.reminderAfterDays * DAY_MS);
  const periodStart = new Date(now.getTime() - REVIEW_SETTINGS.reviewPeriodDays * DAY_MS);
  const due = (await db('jobs as j')
    .crossJoin(db.raw(`(values ('rider'), ('shop')) as s(side)`))
    .where('j.status', 'completed')
    .andWhere('j.completed_at', '<=', dueBefore)
    .andWhere('j.completed_at', '>', periodStart)
    .whereNotExists(db('reviews as r').whereRaw('r.job_id = j.id and r.author_side = s.side'))
    .whereNotExists(db('review_reminders as rr').whereRaw('rr.job_id = j.id and rr.side = s.side'))
    .orderBy('j.completed_at')
    .limit(limit)
    .select('j.id as job_id', 's.side')) as { job_id: string; side: ReviewSide }[];

  let sent = 0;
  for (const { job_id, side } of due) {
    const done = await db.transaction(async (trx) => {
      const job = (await trx('jobs').where({ id: job_id }).first().forUpdate().skipLocked()) as JobRow | undefined;
      if (!job || job.status !== 'completed') return false;
      if (await trx('reviews').where({ job_id, author_side: side }).first('id')) return false;
      const inserted = await trx('review_reminders').insert({ job_id, side, sent_at: now }).onConflict(['job_id', 'side']).ignore().returning('job_id');
      if (inserted.length === 0) return false;
      const title = ((await trx('wheel_requests').where({ id: job.request_id }).first('title')) as { title: string } | undefined)?.title ?? 'your wheel';
      const counterpart =
        side === 'rider'
          ? (((await trx('shops').where({ id: job.shop_id }).first('name')) as { name: string } | undefined)?.name ?? 'the shop')
          : 'the rider';
      const writeUntil = reviewPeriodEnd(job)!;
      await enqueueMail(
        trx,
        (await recipients(trx, job, side)).map((to) => ({
          kind: 'review.reminder',
          ...reviewReminderMail(to, { jobId: job.id, title, counterpart, writeUntil }),
          dedupeKey: `review.reminder:${job.id}:${side}:${to}`,
        })),
      );
      return true;
    });
    if (done) sent += 1;
  }
  return sent;
}
