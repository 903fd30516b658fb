// Disputes: either side of a paid job can open one; it freezes the escrow (no confirmation, no automatic
// release, no cancellation) until an admin releases the money, refunds it or splits it, with a written reason.
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { Conflict, Forbidden, Invalid, NotFound } from '@/lib/errors';
import { disputeDecidedMail, disputeOpenedMail } from '@/lib/mail/notices';
import { writeAudit } from './audit';
import type { PaymentsContext } from './context';
import { settleEscrow } from './escrow';
import { requireSide, sideOf } from './jobAccess';
import { isJobId, JOB_STATUS_LABELS, lockJob, moveJob, type JobStatus } from './jobStates';
import { getJobForViewer, type JobView } from './jobView';
import { assertJobBalances, jobMoney, type JobMoney } from './ledger';
import { adminAddresses, jobTitle, mailEach, riderAddress, shopAddresses } from './people';
import { sendPayout } from './payouts';
import { splitFor, type MoneySplit } from './policy';
import { sendRefund } from './refunds';
import { DISPUTE_REASONS, type DisputeInput, type DisputeReason, type Resolution, type ResolveInput } from './schema';

export interface DisputeRow {
  id: string;
  job_id: string;
  opened_by: string | null;
  opened_by_role: 'rider' | 'builder';
  reason: DisputeReason;
  details: string;
  job_status_before: JobStatus;
  status: 'open' | 'resolved';
  resolution: Resolution | null;
  refund_cents: number | null;
  release_cents: number | null;
  resolution_reason: string | null;
  resolved_by: string | null;
  resolved_at: Date | null;
  created_at: Date;
}

export interface DisputeNoteView {
  id: string;
  authorRole: string;
  authorName: string | null;
  body: string;
  at: string;
}

export interface DisputeView {
  id: string;
  jobId: string;
  status: 'open' | 'resolved';
  openedByRole: 'rider' | 'builder';
  reason: DisputeReason;
  reasonLabel: string;
  details: string;
  jobStatusBefore: JobStatus;
  openedAt: string;
  resolution: Resolution | null;
  refundCents: number | null;
  releaseCents: number | null;
  resolutionReason: string | null;
  resolvedAt: string | null;
  notes: DisputeNoteView[];
}

async function notesOf(db: Knex, disputeId: string): Promise<DisputeNoteView[]> {
  const rows = (await db('dispute_notes as n')
    .leftJoin('users as u', 'u.id', 'n.author_id')
    .where('n.dispute_id', disputeId)
    .orderBy('n.created_at')
    .select('n.id', 'n.author_role', 'u.name', 'n.body', 'n.created_at')) as { id: string; author_role: string; name: string | null; body: string; created_at: Date }[];
  return rows.map((r) => ({ id: r.id, authorRole: r.author_role, authorName: r.name, body: r.body, at: new Date(r.created_at).toISOString() }));
}

export async function disputeView(db: Knex, row: DisputeRow): Promise<DisputeView> {
  return {
    id: row.id,
    jobId: row.job_id,
    status: row.status,
    openedByRole: row.opened_by_role,
    reason: row.reason,
    reasonLabel: DISPUTE_REASONS[row.reason],
    details: row.details,
    jobStatusBefore: row.job_status_before,
    openedAt: new Date(row.created_at).toISOString(),
    resolution: row.resolution,
    refundCents: row.refund_cents,
    releaseCents: row.release_cents,
    resolutionReason: row.resolution_reason,
    resolvedAt: row.resolved_at ? new Date(row.resolved_at).toISOString() : null,
    notes: await notesOf(db, row.id),
  };
}

export async function openDispute(ctx: PaymentsContext, actor: SessionUser, jobId: string, input: DisputeInput): Promise<JobView> {
  await ctx.db.transaction(async (trx) => {
    const job = await lockJob(trx, jobId);
    const side = requireSide(actor, job, ['rider', 'builder']);
    await moveJob(trx, job, 'dispute', { disputed_at: new Date(), disputed_from: job.status });
    const [dispute] = await trx('disputes')
      .insert({ job_id: job.id, opened_by: actor.id, opened_by_role: side, reason: input.reason, details: input.details, job_status_before: job.status })
      .returning('id');
    const title = await jobTitle(trx, job.request_id);
    const mail = { jobId: job.id, disputeId: dispute.id as string, title, openedBy: side, reason: DISPUTE_REASONS[input.reason].toLowerCase() };
    await mailEach(trx, 'dispute.opened', [await riderAddress(trx, job.rider_id)], (to) => disputeOpenedMail(to, { ...mail, audience: 'rider' }));
    await mailEach(trx, 'dispute.opened', await shopAddresses(trx, job.shop_id), (to) => disputeOpenedMail(to, { ...mail, audience: 'builder' }));
    await mailEach(trx, 'dispute.opened', await adminAddresses(trx), (to) => disputeOpenedMail(to, { ...mail, audience: 'admin' }));
    await assertJobBalances(trx, job.id);
  });
  return getJobForViewer(ctx, actor, jobId);
}

const UUID = isJobId;

async function loadDispute(db: Knex, disputeId: string): Promise<DisputeRow> {
  const row = UUID(disputeId) ? ((await db('disputes').where({ id: disputeId }).first()) as DisputeRow | undefined) : undefined;
  if (!row) throw new NotFound('Dispute not found.');
  return row;
}

/** Either side of the job, or an admin, adds to its open dispute's thread. */
export async function addDisputeNote(ctx: PaymentsContext, actor: SessionUser, jobId: string, body: string): Promise<DisputeView> {
  const disputeId = await ctx.db.transaction(async (trx) => {
    const job = await lockJob(trx, jobId);
    const side = sideOf(actor, job);
    if (!side) throw new NotFound('Job not found.');
    const current = (await trx('disputes').where({ job_id: job.id }).first().forUpdate()) as DisputeRow | undefined;
    if (!current) throw new Conflict('This job has no dispute.');
    if (current.status !== 'open') throw new Conflict('This dispute is settled; its thread is closed.');
    await trx('dispute_notes').insert({ dispute_id: current.id, author_id: actor.id, author_role: side, body });
    if (side === 'admin') await writeAudit(trx, actor, { action: 'dispute.note', targetType: 'dispute', targetId: current.id, details: { jobId: job.id } });
    return current.id;
  });
  return disputeView(ctx.db, await loadDispute(ctx.db, disputeId));
}

export interface DisputeListItem {
  id: string;
  jobId: string;
  title: string;
  riderName: string;
  shopName: string;
  priceCents: number;
  reasonLabel: string;
  openedByRole: string;
  status: 'open' | 'resolved';
  resolution: Resolution | null;
  openedAt: string;
}

export async function listDisputes(db: Knex, filter: { status?: 'open' | 'resolved' } = {}): Promise<DisputeListItem[]> {
  const q = db('disputes as d')
    .join('jobs as j', 'j.id', 'd.job_id')
    .join('wheel_requests as r', 'r.id', 'j.request_id')
    .join('users as u', 'u.id', 'j.rider_id')
    .join('shops as s', 's.id', 'j.shop_id')
    .orderByRaw(`case when d.status = 'open' then 0 else 1 end, d.created_at desc`)
    .limit(500)
    .select('d.id', 'd.job_id', 'r.title', 'u.name as rider_name', 's.name as shop_name', 'j.price_cents', 'd.reason', 'd.opened_by_role', 'd.status', 'd.resolution', 'd.created_at');
  if (filter.status) q.where('d.status', filter.status);
  const rows = (await q) as {
    id: string;
    job_id: string;
    title: string;
    rider_name: string;
    shop_name: string;
    price_cents: number;
    reason: DisputeReason;
    opened_by_role: string;
    status: 'open' | 'resolved';
    resolution: Resolution | null;
    created_at: Date;
  }[];
  return rows.map((r) => ({
    id: r.id,
    jobId: r.job_id,
    title: r.title,
    riderName: r.rider_name,
    shopName: r.shop_name,
    priceCents: r.price_cents,
    reasonLabel: DISPUTE_REASONS[r.reason],
    openedByRole: r.opened_by_role,
    status: r.status,
    resolution: r.resolution,
    openedAt: new Date(r.created_at).toISOString(),
  }));
}

export interface AdminDisputeView extends DisputeView {
  job: {
    id: string;
    title: string;
    status: JobStatus;
    statusLabel: string;
    priceCents: number;
    feeBps: number;
    riderName: string;
    riderEmail: string;
    shopName: string;
    handover: string | null;
    carrier: string | null;
    trackingNumber: string | null;
  };
  money: JobMoney;
  /** The rider and shop's own message thread on the request, oldest first. */
  messages: { id: string; authorName: string | null; fromShop: boolean; body: string; at: string }[];
}

export async function getDisputeForAdmin(ctx: PaymentsContext, actor: SessionUser, disputeId: string): Promise<AdminDisputeView> {
  if (actor.role !== 'admin') throw new Forbidden('Only admins review disputes.');
  const row = await loadDispute(ctx.db, disputeId);
  const job = await ctx.db('jobs as j')
    .join('wheel_requests as r', 'r.id', 'j.request_id')
    .join('users as u', 'u.id', 'j.rider_id')
    .join('shops as s', 's.id', 'j.shop_id')
    .where('j.id', row.job_id)
    .first('j.*', 'r.title', 'u.name as rider_name', 'u.email as rider_email', 's.name as shop_name');
  const messages = (await ctx.db('messages as m')
    .leftJoin('users as u', 'u.id', 'm.author_id')
    .leftJoin('shop_members as sm', function () {
      this.on('sm.user_id', '=', 'm.author_id').andOn('sm.shop_id', '=', 'm.shop_id');
    })
    .where({ 'm.request_id': job.request_id, 'm.shop_id': job.shop_id })
    .orderBy('m.created_at')
    .limit(200)
    .select('m.id', 'u.name', 'm.body', 'm.created_at', ctx.db.raw('sm.user_id is not null as from_shop'))) as {
    id: string;
    name: string | null;
    body: string;
    created_at: Date;
    from_shop: boolean;
  }[];
  return {
    ...(await disputeView(ctx.db, row)),
    job: {
      id: job.id,
      title: job.title,
      status: job.status,
      statusLabel: JOB_STATUS_LABELS[job.status as JobStatus],
      priceCents: job.price_cents,
      feeBps: job.fee_bps ?? ctx.settings.feeBps,
      riderName: job.rider_name,
      riderEmail: job.rider_email,
      shopName: job.shop_name,
      handover: job.handover,
      carrier: job.carrier,
      trackingNumber: job.tracking_number,
    },
    money: await jobMoney(ctx.db, job.id),
    messages: messages.map((m) => ({ id: m.id, authorName: m.name, fromShop: Boolean(m.from_shop), body: m.body, at: new Date(m.created_at).toISOString() })),
  };
}

/** What a decision means in money, before it is taken (for the form) and when it is (for the books). */
export function resolutionSplit(priceCents: number, feeBps: number, input: Pick<ResolveInput, 'resolution' | 'refundCents'>): MoneySplit {
  switch (input.resolution) {
    case 'release':
      return splitFor(priceCents, 0, feeBps);
    case 'refund':
      return splitFor(priceCents, priceCents, feeBps);
    case 'split': {
      const refund = input.refundCents ?? 0;
      if (refund <= 0 || refund >= priceCents) {
        throw new Invalid('A split gives each side part of the money.', { refundCents: [`Enter more than nothing and less than the full price (${priceCents} cents).`] });
      }
      return splitFor(priceCents, refund, feeBps);
    }
  }
}

/** An admin decides a dispute: release, refund or split, with a reason both sides read. Written to the audit log. */
export async function resolveDispute(ctx: PaymentsContext, actor: SessionUser, disputeId: string, input: ResolveInput): Promise<AdminDisputeView> {
  if (actor.role !== 'admin') throw new Forbidden('Only admins settle disputes.');
  const dispute = await loadDispute(ctx.db, disputeId);
  const decided = await ctx.db.transaction(async (trx) => {
    const job = await lockJob(trx, dispute.job_id);
    const current = (await trx('disputes').where({ id: dispute.id }).first().forUpdate()) as DisputeRow;
    if (current.status !== 'open') throw new Conflict('This dispute is already settled.');
    const feeBps = job.fee_bps ?? ctx.settings.feeBps;
    const split = resolutionSplit(job.price_cents, feeBps, input);
    const moved = await moveJob(trx, job, 'resolve', { resolved_at: new Date(), fee_bps: feeBps });
    const result = await settleEscrow(trx, moved, split, 'dispute', `Dispute settled by an admin (${input.resolution})`);
    await trx('disputes').where({ id: dispute.id }).update({
      status: 'resolved',
      resolution: input.resolution,
      refund_cents: split.refundCents,
      release_cents: split.shareCents,
      resolution_reason: input.reason,
      resolved_by: actor.id,
      resolved_at: trx.fn.now(),
      updated_at: trx.fn.now(),
    });
    await writeAudit(trx, actor, {
      action: 'dispute.resolved',
      targetType: 'dispute',
      targetId: dispute.id,
      reason: input.reason,
      details: { jobId: job.id, resolution: input.resolution, refundCents: split.refundCents, shareCents: split.shareCents, feeCents: split.feeCents, payoutCents: split.payoutCents },
    });
    const title = await jobTitle(trx, job.request_id);
    const mail = { jobId: job.id, title, refundCents: split.refundCents, payoutCents: split.payoutCents, feeCents: split.feeCents, reason: input.reason };
    await mailEach(trx, 'dispute.decided', [await riderAddress(trx, job.rider_id), ...(await shopAddresses(trx, job.shop_id))], (to) => disputeDecidedMail(to, mail));
    await assertJobBalances(trx, job.id);
    return result;
  });
  if (decided.refundId) await sendRefund(ctx, decided.refundId);
  if (decided.payoutId) await sendPayout(ctx, decided.payoutId);
  return getDisputeForAdmin(ctx, actor, disputeId);
}
