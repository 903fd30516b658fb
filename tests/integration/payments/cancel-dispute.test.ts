// Cancelling by the stated policy, and disputes: the money frozen until an admin releases, refunds or
// splits it with a written reason, each decision in the audit log and the books balanced.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Conflict, Forbidden, Invalid, NotFound } from '@/lib/errors';
import { cancelJob } from '@/lib/payments/cancel';
import { addDisputeNote, getDisputeForAdmin, listDisputes, openDispute, resolveDispute } from '@/lib/payments/disputes';
import { autoConfirmDueJobs, confirmReceipt, markShipped, startBuild } from '@/lib/payments/fulfilment';
import { getJobForViewer } from '@/lib/payments/jobView';
import { jobMoney, ledgerProblems } from '@/lib/payments/ledger';
import { BUILD_STARTED_KEEP_BPS, referralFeeCents } from '@/lib/payments/policy';
import { resolveInputSchema } from '@/lib/payments/schema';
import { acceptedJob, activatePayouts, fundedJob, intentIdFrom, jobRow, makeAdmin, makeRider, startHarness, type Harness } from './harness';
import { startPayment } from '@/lib/payments/pay';

let h: Harness;
beforeAll(async () => {
  h = await startHarness('cancel_dispute');
});
afterAll(() => h?.close());

const balanced = async (jobId: string) => expect(await ledgerProblems(h.db, await jobRow(h.db, jobId))).toEqual([]);
const refundsAtFake = async (jobId: string) => {
  const job = await jobRow(h.db, jobId);
  return (await h.ctx.stripe.refunds.list({ charge: job.charge_id })).data;
};

describe('cancelling', () => {
  it('before payment: either side cancels, nothing moves, and the open payment page is closed', async () => {
    const { rider, builder, jobId } = await acceptedJob(h.db);
    await activatePayouts(h, builder);
    const pi = intentIdFrom((await startPayment(h.ctx, rider, jobId)).redirectUrl);
    const view = await cancelJob(h.ctx, rider, jobId, { reason: 'Changed my mind' });
    expect(view).toMatchObject({ status: 'cancelled', refunds: [], payout: null });
    expect((await h.ctx.stripe.paymentIntents.retrieve(pi)).status).toBe('canceled');
    expect((await h.db('payments').where({ job_id: jobId }).first()).status).toBe('canceled');
    await expect(cancelJob(h.ctx, builder, jobId, { reason: '' })).rejects.toThrow(Conflict);
    await balanced(jobId);
  });

  it('after payment, before the build: a full refund at the processor', async () => {
    const { builder, jobId, priceCents } = await fundedJob(h);
    const view = await cancelJob(h.ctx, builder, jobId, { reason: 'Hub out of stock' });
    expect(view.status).toBe('refunded');
    expect(view.refunds).toEqual([expect.objectContaining({ amountCents: priceCents, status: 'succeeded', reason: 'cancelled' })]);
    expect((await refundsAtFake(jobId)).map((r) => r.amount)).toEqual([priceCents]);
    expect(await jobMoney(h.db, jobId)).toMatchObject({ chargedCents: priceCents, refundedCents: priceCents, feesCents: 0, stillHeldCents: 0 });
    await balanced(jobId);
  });

  it('after the build started, by the rider: the stated share stays with the builder (less the fee), the rest is refunded', async () => {
    const { rider, builder, jobId, priceCents } = await fundedJob(h);
    await startBuild(h.ctx, builder, jobId);
    const terms = (await getJobForViewer(h.ctx, rider, jobId)).actions.cancel!;
    const kept = Math.floor((priceCents * BUILD_STARTED_KEEP_BPS) / 10_000);
    expect(terms.split).toMatchObject({ refundCents: priceCents - kept, shareCents: kept });
    const view = await cancelJob(h.ctx, rider, jobId, { reason: '' });
    const fee = referralFeeCents(kept, 1000);
    expect(view.status).toBe('refunded');
    expect(view.payout).toMatchObject({ status: 'paid', amountCents: kept - fee });
    expect((await refundsAtFake(jobId)).map((r) => r.amount)).toEqual([priceCents - kept]);
    expect((await h.ctx.stripe.transfers.list({ transfer_group: jobId })).data.map((t) => t.amount)).toEqual([kept - fee]);
    expect(await jobMoney(h.db, jobId)).toMatchObject({ refundedCents: priceCents - kept, transferredCents: kept - fee, feesCents: fee, stillHeldCents: 0 });
    await balanced(jobId);
  });

  it('after the build started, by the builder: the rider gets everything back', async () => {
    const { builder, jobId, priceCents } = await fundedJob(h);
    await startBuild(h.ctx, builder, jobId);
    const view = await cancelJob(h.ctx, builder, jobId, { reason: '' });
    expect(view.refunds.map((r) => r.amountCents)).toEqual([priceCents]);
    expect(view.payout).toBeNull();
    await balanced(jobId);
  });

  it('nobody cancels once shipped, and outsiders never', async () => {
    const { rider, builder, jobId } = await fundedJob(h);
    await expect(cancelJob(h.ctx, await makeRider(h.db), jobId, { reason: '' })).rejects.toThrow(NotFound);
    await expect(cancelJob(h.ctx, await makeAdmin(h.db), jobId, { reason: '' })).rejects.toThrow(Forbidden);
    await startBuild(h.ctx, builder, jobId);
    await markShipped(h.ctx, builder, jobId, { handover: 'pickup' });
    const err = await cancelJob(h.ctx, rider, jobId, { reason: '' }).catch((e) => e);
    expect(err).toBeInstanceOf(Conflict);
    expect(err.message).toMatch(/open a dispute/);
  });
});

describe('disputes', () => {
  async function disputed() {
    const world = await fundedJob(h);
    await startBuild(h.ctx, world.builder, world.jobId);
    await markShipped(h.ctx, world.builder, world.jobId, { handover: 'carrier', carrier: 'Parcel Co', trackingNumber: 'ABC12345' });
    const view = await openDispute(h.ctx, world.rider, world.jobId, { reason: 'damaged', details: 'The rim arrived with a flat spot and two loose spokes.' });
    return { ...world, disputeId: view.dispute!.id, admin: await makeAdmin(h.db) };
  }

  it('freezes the money: no confirmation, no cancellation, no automatic release', async () => {
    const { rider, builder, jobId, priceCents, disputeId, admin } = await disputed();
    expect((await jobRow(h.db, jobId)).status).toBe('disputed');
    await expect(confirmReceipt(h.ctx, rider, jobId)).rejects.toThrow(Conflict);
    await expect(cancelJob(h.ctx, builder, jobId, { reason: '' })).rejects.toThrow(Conflict);
    await expect(openDispute(h.ctx, builder, jobId, { reason: 'other', details: 'A second dispute on the same job.' })).rejects.toThrow(Conflict);
    await autoConfirmDueJobs(h.ctx, new Date(Date.now() + 60 * 86_400_000)); // other shipped jobs here may go; this one must not
    expect((await jobRow(h.db, jobId)).status).toBe('disputed');
    expect(await jobMoney(h.db, jobId)).toMatchObject({ heldInEscrowCents: priceCents, transferredCents: 0, refundedCents: 0 });
    const kinds = (await h.db('outbox').where({ kind: 'dispute.opened' }).whereIn('to_email', [rider.email, builder.email, admin.email]).pluck('to_email')) as string[];
    expect(kinds).toEqual(expect.arrayContaining([rider.email, builder.email]));
    expect((await listDisputes(h.db, { status: 'open' })).map((d) => d.id)).toContain(disputeId);
  });

  it('both sides and admins add to the thread; outsiders cannot', async () => {
    const { rider, builder, jobId, disputeId, admin } = await disputed();
    await addDisputeNote(h.ctx, builder, jobId, 'It left the shop true; photos of the box to follow.');
    await addDisputeNote(h.ctx, admin, jobId, 'Please both send photos of the packaging.');
    const view = await addDisputeNote(h.ctx, rider, jobId, 'The box was crushed at one corner.');
    expect(view.notes.map((n) => n.authorRole)).toEqual(['builder', 'admin', 'rider']);
    await expect(addDisputeNote(h.ctx, await makeRider(h.db), jobId, 'hello')).rejects.toThrow(NotFound);
    expect(await h.db('admin_audit_log').where({ action: 'dispute.note', target_id: disputeId })).toHaveLength(1);
  });

  it('an admin splits it: part refunded, part paid to the builder less the fee, with the reason and an audit entry', async () => {
    const { rider, builder, jobId, priceCents, disputeId, admin } = await disputed();
    await expect(resolveDispute(h.ctx, rider, disputeId, { resolution: 'refund', reason: 'I would like my money back please.' })).rejects.toThrow(Forbidden);
    await expect(resolveDispute(h.ctx, admin, disputeId, { resolution: 'split', refundCents: priceCents, reason: 'Too much for a split of this job.' })).rejects.toThrow(Invalid);
    expect(resolveInputSchema.safeParse({ resolution: 'split', reason: 'No amount was given for this split.' }).success).toBe(false);
    expect(resolveInputSchema.safeParse({ resolution: 'refund', reason: 'short' }).success).toBe(false);

    const refund = 20_000;
    const reason = 'Damage in transit; the builder re-trues it, the rider keeps part of the price for the rim.';
    const view = await resolveDispute(h.ctx, admin, disputeId, { resolution: 'split', refundCents: refund, reason });
    const share = priceCents - refund;
    const fee = referralFeeCents(share, 1000);
    expect(view).toMatchObject({ status: 'resolved', resolution: 'split', refundCents: refund, releaseCents: share, resolutionReason: reason, job: { status: 'resolved' } });
    expect(view.money).toMatchObject({ refundedCents: refund, transferredCents: share - fee, feesCents: fee, stillHeldCents: 0 });
    expect((await refundsAtFake(jobId)).map((r) => r.amount)).toEqual([refund]);
    expect((await h.ctx.stripe.transfers.list({ transfer_group: jobId })).data.map((t) => t.amount)).toEqual([share - fee]);
    const audit = await h.db('admin_audit_log').where({ action: 'dispute.resolved', target_id: disputeId });
    expect(audit).toHaveLength(1);
    expect(audit[0]).toMatchObject({ admin_id: admin.id, reason, details: expect.objectContaining({ resolution: 'split', refundCents: refund }) });
    expect((await h.db('outbox').where({ kind: 'dispute.decided' }).whereIn('to_email', [rider.email, builder.email])).length).toBe(2);
    await expect(resolveDispute(h.ctx, admin, disputeId, { resolution: 'release', reason: 'Changing my mind on this one now.' })).rejects.toThrow(Conflict);
    await balanced(jobId);
  });

  it('an admin releases it all to the builder, or refunds it all to the rider', async () => {
    const a = await disputed();
    const released = await resolveDispute(h.ctx, a.admin, a.disputeId, { resolution: 'release', reason: 'Photos show the wheel arrived true and undamaged.' });
    expect(released.money).toMatchObject({ refundedCents: 0, transferredCents: a.priceCents - referralFeeCents(a.priceCents, 1000) });
    await balanced(a.jobId);

    const b = await disputed();
    const refunded = await resolveDispute(h.ctx, b.admin, b.disputeId, { resolution: 'refund', reason: 'The builder shipped the wrong rim width entirely.' });
    expect(refunded.money).toMatchObject({ refundedCents: b.priceCents, transferredCents: 0, feesCents: 0 });
    expect((await h.ctx.stripe.transfers.list({ transfer_group: b.jobId })).data).toHaveLength(0);
    await balanced(b.jobId);
    const review = await getDisputeForAdmin(h.ctx, b.admin, b.disputeId);
    expect(review.job.riderEmail).toBe(b.rider.email);
    await expect(getDisputeForAdmin(h.ctx, b.rider, b.disputeId)).rejects.toThrow(Forbidden);
  });

  it('the builder may open one too, while building; an unpaid job cannot be disputed', async () => {
    const { builder, jobId } = await fundedJob(h);
    await startBuild(h.ctx, builder, jobId);
    const view = await openDispute(h.ctx, builder, jobId, { reason: 'no_response', details: 'The rider has not answered about the finish for three weeks.' });
    expect(view.dispute).toMatchObject({ openedByRole: 'builder', jobStatusBefore: 'building' });
    const unpaid = await acceptedJob(h.db);
    await expect(openDispute(h.ctx, unpaid.rider, unpaid.jobId, { reason: 'other', details: 'Nothing was paid but I want to dispute.' })).rejects.toThrow(Conflict);
  });
});
