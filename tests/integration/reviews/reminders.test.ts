// Reminders to write a review: once per side per job, a few days after completion, only to a side that has
// not written, and only while writing is still open. A database of this file's own, since the pass sweeps all jobs.
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runWorkerTick } from '@/lib/jobs/worker';
import { sendReviewReminders } from '@/lib/reviews/reminders';
import { REVIEW_SETTINGS } from '@/lib/reviews/settings';
import { createReview } from '@/lib/reviews/writeReview';
import { addMember, daysAfter, makeJob, makeRider, makeShop, ownDatabase, shopReviewInput } from './support';

let db: Knex;
beforeAll(async () => {
  db = await ownDatabase('reminders');
});
afterAll(() => db?.destroy());

const reminders = (email: string) => db('outbox').where({ kind: 'review.reminder', to_email: email });

describe('review reminders', () => {
  it('reminds each side once, a few days after completion, and never again', async () => {
    const completedAt = new Date('2027-03-01T12:00:00Z');
    const rider = await makeRider(db);
    const builder = await makeShop(db);
    const colleague = await addMember(db, builder.shopId);
    const { jobId } = await makeJob(db, rider, builder.shopId, { completedAt });

    expect(await sendReviewReminders(db, daysAfter(completedAt, REVIEW_SETTINGS.reminderAfterDays - 0.1))).toBe(0);
    const due = daysAfter(completedAt, REVIEW_SETTINGS.reminderAfterDays);
    expect(await sendReviewReminders(db, due)).toBe(2);
    expect(await reminders(rider.email)).toHaveLength(1);
    expect(await reminders(builder.email)).toHaveLength(1);
    expect(await reminders(colleague.email)).toHaveLength(1);
    const [mail] = await reminders(rider.email);
    expect(mail.text_body).toContain(`/jobs/${jobId}`);
    expect(mail.subject).toContain('26-inch rear on a 3-inch rim');

    expect(await sendReviewReminders(db, daysAfter(due, 1))).toBe(0);
    expect(await reminders(rider.email)).toHaveLength(1);
    expect(await db('review_reminders').where({ job_id: jobId })).toHaveLength(2);
  });

  it('skips a side that has already written, and jobs whose review period is over', async () => {
    const now = new Date('2027-04-10T12:00:00Z');
    const rider = await makeRider(db);
    const builder = await makeShop(db);
    const fresh = await makeJob(db, rider, builder.shopId, { completedAt: daysAfter(now, -5) });
    await createReview(db, rider, shopReviewInput(fresh.jobId), daysAfter(now, -4));
    const stale = await makeJob(db, rider, builder.shopId, { completedAt: daysAfter(now, -(REVIEW_SETTINGS.reviewPeriodDays + 1)) });

    expect(await sendReviewReminders(db, now)).toBe(1);
    expect(await db('review_reminders').where({ job_id: fresh.jobId }).pluck('side')).toEqual(['shop']);
    expect(await db('review_reminders').where({ job_id: stale.jobId })).toHaveLength(0);
    expect(await reminders(rider.email)).toHaveLength(0);
  });

  it('runs as part of the worker’s tick, and the reminder is then sent', async () => {
    const now = new Date('2027-05-20T12:00:00Z');
    const rider = await makeRider(db);
    const builder = await makeShop(db);
    await makeJob(db, rider, builder.shopId, { completedAt: daysAfter(now, -4) });
    const sent: string[] = [];
    const report = await runWorkerTick(db, { now, send: async (m) => void sent.push(m.to) });
    expect(report.reviewReminders).toBeGreaterThanOrEqual(2);
    expect(sent).toEqual(expect.arrayContaining([rider.email, builder.email]));
  });
});
