// A job as one viewer sees it: the rider, a member of its shop, or an admin. Status timeline, money,
// what happens next in plain words, and exactly the actions this viewer may take now.
import type { Knex } from 'knex';
import type { SessionUser } from '@/lib/auth/roles';
import { NotFound } from '@/lib/errors';
import type { PaymentsContext } from './context';
import { disputeView, type DisputeRow, type DisputeView } from './disputes';
import { sideOf, type JobSide } from './jobAccess';
import { canMoveJob, FINAL_STATUSES, isJobId, JOB_STATUS_LABELS, type JobRow, type JobStatus } from './jobStates';
import { jobMoney, type JobMoney } from './ledger';
import type { PaymentRow } from './pay';
import { cancellationTerms, REFUND_POLICY, splitFor, type MoneySplit } from './policy';

const iso = (d: Date | null | undefined): string | null => (d ? new Date(d).toISOString() : null);

export interface TimelineStep {
  key: string;
  label: string;
  at: string | null;
  state: 'done' | 'current' | 'upcoming';
}

export interface JobView {
  id: string;
  requestId: string;
  title: string;
  status: JobStatus;
  statusLabel: string;
  viewer: JobSide;
  riderName: string;
  shop: { id: string; name: string; slug: string };
  delivery: 'ship' | 'pickup';
  priceCents: number;
  feeBps: number;
  /** The fee and the builder's payout: if the whole price is released, or as decided once money has moved. */
  feeCents: number;
  builderReceivesCents: number;
  moneyDecided: boolean;
  handover: { method: 'carrier' | 'pickup'; carrier: string | null; trackingNumber: string | null } | null;
  autoConfirmAt: string | null;
  timeline: TimelineStep[];
  nextStep: string;
  payment: { status: string; lastError: string | null; updatedAt: string } | null;
  payoutsReady: boolean;
  payout: { status: 'pending' | 'paid'; amountCents: number; feeCents: number; paidAt: string | null; lastError: string | null } | null;
  refunds: { amountCents: number; status: 'pending' | 'succeeded'; reason: string; at: string | null }[];
  money: JobMoney;
  dispute: DisputeView | null;
  actions: {
    pay: boolean;
    setUpPayouts: boolean;
    startBuild: boolean;
    ship: boolean;
    confirm: boolean;
    cancel: { summary: string; split: MoneySplit | null } | null;
    dispute: boolean;
  };
  refundPolicy: typeof REFUND_POLICY;
  createdAt: string;
}

interface JoinedJob extends JobRow {
  title: string;
  delivery: 'ship' | 'pickup';
  rider_name: string;
  shop_name: string;
  shop_slug: string;
}

function jobQuery(db: Knex) {
  return db('jobs as j')
    .join('wheel_requests as r', 'r.id', 'j.request_id')
    .join('users as u', 'u.id', 'j.rider_id')
    .join('shops as s', 's.id', 'j.shop_id')
    .select('j.*', 'r.title', 'r.delivery', 'u.name as rider_name', 's.name as shop_name', 's.slug as shop_slug');
}

function timeline(job: JoinedJob): TimelineStep[] {
  const shippedLabel = job.handover === 'pickup' ? 'Ready for pickup' : job.delivery === 'pickup' ? 'Ready for pickup' : 'Shipped';
  const steps: { key: string; label: string; at: Date | null }[] = [
    { key: 'accepted', label: 'Bid accepted', at: job.created_at },
    { key: 'funded', label: 'Paid into escrow', at: job.funded_at },
    { key: 'building', label: 'Build started', at: job.build_started_at },
    { key: 'shipped', label: shippedLabel, at: job.shipped_at },
    { key: 'completed', label: 'Received, money released', at: job.completed_at },
  ];
  const ended = job.status === 'cancelled' || job.status === 'refunded' || job.status === 'disputed' || job.status === 'resolved';
  const out: TimelineStep[] = [];
  let currentGiven = false;
  for (const s of steps) {
    if (s.at) out.push({ key: s.key, label: s.label, at: iso(s.at), state: 'done' });
    else if (ended) continue;
    else {
      out.push({ key: s.key, label: s.label, at: null, state: currentGiven ? 'upcoming' : 'current' });
      currentGiven = true;
    }
  }
  if (job.status === 'cancelled' || job.status === 'refunded') {
    out.push({ key: 'cancelled', label: job.status === 'refunded' ? 'Cancelled and refunded' : 'Cancelled', at: iso(job.cancelled_at), state: 'done' });
  }
  if (job.disputed_at) out.push({ key: 'disputed', label: 'Dispute opened, money frozen', at: iso(job.disputed_at), state: 'done' });
  if (job.status === 'disputed') out.push({ key: 'resolved', label: 'An admin decides', at: null, state: 'current' });
  if (job.resolved_at) out.push({ key: 'resolved', label: 'Dispute settled', at: iso(job.resolved_at), state: 'done' });
  return out;
}

function nextStep(job: JoinedJob, side: JobSide, payoutsReady: boolean, payment: PaymentRow | undefined): string {
  const day = (d: Date | null) => (d ? new Date(d).toISOString().slice(0, 10) : '');
  switch (job.status) {
    case 'awaiting_payment':
      if (!payoutsReady) {
        return side === 'builder'
          ? 'Set up payouts so the rider can pay. The money is held in escrow and reaches your payout account when the rider confirms receipt.'
          : 'The builder is finishing their payout setup. You can pay as soon as they are done; we have told them you are waiting.';
      }
      if (payment?.status === 'succeeded') return 'We have the payment and are confirming it with the payment service.';
      return side === 'rider'
        ? 'Pay into escrow. We hold the money; the builder is paid only when you confirm you have the wheel.'
        : 'Waiting for the rider to pay into escrow. Do not buy parts until the job shows as paid.';
    case 'funded':
      return side === 'builder' ? 'The money is in escrow. Mark the build started when you begin.' : 'Your money is held in escrow. The builder starts next.';
    case 'building':
      return side === 'builder' ? 'When the wheel is ready, mark it shipped with the carrier and tracking number, or ready for pickup.' : 'The builder is building your wheel.';
    case 'shipped':
      return side === 'rider'
        ? `Check the wheel when it arrives, then confirm receipt so the builder is paid. If you do nothing and open no dispute, we confirm for you on ${day(job.auto_confirm_at)} (UTC).`
        : `Waiting for the rider to confirm receipt; if they do nothing and open no dispute, the money is released on ${day(job.auto_confirm_at)} (UTC).`;
    case 'completed':
      return 'Done. The money has been released to the builder.';
    case 'cancelled':
      return 'This job was cancelled before payment. Nothing was charged.';
    case 'refunded':
      return 'This job was cancelled after payment. The refund and any share for the builder are shown below.';
    case 'disputed':
      return 'A dispute is open, so the money is frozen in escrow. An admin will release it, refund it or split it, and explain why. Add anything that helps to the dispute.';
    case 'resolved':
      return 'An admin settled the dispute. The decision and the money are shown below.';
  }
}

async function assemble(ctx: PaymentsContext, job: JoinedJob, side: JobSide): Promise<JobView> {
  const { db, settings } = ctx;
  const feeBps = job.fee_bps ?? settings.feeBps;
  const full = splitFor(job.price_cents, 0, feeBps);
  const payoutsReady = Boolean(await db('payout_accounts').where({ shop_id: job.shop_id, status: 'active' }).first('shop_id'));
  const payment = (await db('payments').where({ job_id: job.id }).orderBy('attempt', 'desc').first()) as PaymentRow | undefined;
  const payout = await db('payouts').where({ job_id: job.id }).first();
  const refunds = (await db('refunds').where({ job_id: job.id }).orderBy('seq')) as {
    amount_cents: number;
    status: 'pending' | 'succeeded';
    reason: string;
    refunded_at: Date | null;
  }[];
  const disputeRow = (await db('disputes').where({ job_id: job.id }).first()) as DisputeRow | undefined;
  const cancelSide = side === 'rider' || side === 'builder' ? side : null;
  const terms = cancelSide ? cancellationTerms(job.status, cancelSide, job.price_cents, feeBps) : null;
  const paymentInFlight = payment?.status === 'succeeded' || payment?.status === 'processing';
  const decided = job.fee_cents !== null || FINAL_STATUSES.includes(job.status);
  return {
    id: job.id,
    requestId: job.request_id,
    title: job.title,
    status: job.status,
    statusLabel: JOB_STATUS_LABELS[job.status],
    viewer: side,
    riderName: job.rider_name,
    shop: { id: job.shop_id, name: job.shop_name, slug: job.shop_slug },
    delivery: job.delivery,
    priceCents: job.price_cents,
    feeBps,
    feeCents: decided ? (job.fee_cents ?? 0) : full.feeCents,
    builderReceivesCents: decided ? (payout?.amount_cents ?? 0) : full.payoutCents,
    moneyDecided: decided,
    handover: job.handover ? { method: job.handover, carrier: job.carrier, trackingNumber: job.tracking_number } : null,
    autoConfirmAt: job.status === 'shipped' ? iso(job.auto_confirm_at) : null,
    timeline: timeline(job),
    nextStep: nextStep(job, side, payoutsReady, payment),
    payment: payment ? { status: payment.status, lastError: payment.last_error, updatedAt: new Date(payment.updated_at).toISOString() } : null,
    payoutsReady,
    payout: payout
      ? { status: payout.status, amountCents: payout.amount_cents, feeCents: payout.fee_cents, paidAt: iso(payout.paid_at), lastError: side === 'admin' ? payout.last_error : null }
      : null,
    refunds: refunds.map((r) => ({ amountCents: r.amount_cents, status: r.status, reason: r.reason, at: iso(r.refunded_at) })),
    money: await jobMoney(db, job.id),
    dispute: disputeRow ? await disputeView(db, disputeRow) : null,
    actions: {
      pay: side === 'rider' && job.status === 'awaiting_payment' && payoutsReady && !paymentInFlight,
      setUpPayouts: side === 'builder' && !payoutsReady && !['cancelled', 'refunded', 'completed', 'resolved'].includes(job.status),
      startBuild: side === 'builder' && canMoveJob(job.status, 'startBuild'),
      ship: side === 'builder' && canMoveJob(job.status, 'ship'),
      confirm: side === 'rider' && canMoveJob(job.status, 'confirm'),
      cancel: terms?.allowed && !(job.status === 'awaiting_payment' && paymentInFlight) ? { summary: terms.summary, split: terms.split } : null,
      dispute: (side === 'rider' || side === 'builder') && canMoveJob(job.status, 'dispute'),
    },
    refundPolicy: REFUND_POLICY,
    createdAt: new Date(job.created_at).toISOString(),
  };
}

export async function getJobForViewer(ctx: PaymentsContext, actor: SessionUser, jobId: string): Promise<JobView> {
  const job = isJobId(jobId) ? ((await jobQuery(ctx.db).where('j.id', jobId).first()) as JoinedJob | undefined) : undefined;
  const side = job ? sideOf(actor, job) : null;
  if (!job || !side) throw new NotFound('Job not found.');
  return assemble(ctx, job, side);
}

export interface JobListItem {
  id: string;
  title: string;
  status: JobStatus;
  statusLabel: string;
  priceCents: number;
  otherParty: string;
  needsYou: boolean;
  updatedAt: string;
}

/** The viewer's jobs, newest first: a rider's own, a builder's shop's, or every job for an admin. */
export async function listJobsForViewer(ctx: PaymentsContext, actor: SessionUser): Promise<JobListItem[]> {
  const q = jobQuery(ctx.db).orderBy('j.updated_at', 'desc').limit(200);
  if (actor.role === 'rider') q.where('j.rider_id', actor.id);
  else if (actor.role === 'builder') {
    if (!actor.shopId) return [];
    q.where('j.shop_id', actor.shopId);
  }
  const rows = (await q) as JoinedJob[];
  return rows.map((j) => {
    const side = sideOf(actor, j)!;
    const needsYou =
      (side === 'rider' && (j.status === 'awaiting_payment' || j.status === 'shipped')) ||
      (side === 'builder' && (j.status === 'funded' || j.status === 'building')) ||
      (side === 'admin' && j.status === 'disputed');
    return {
      id: j.id,
      title: j.title,
      status: j.status,
      statusLabel: JOB_STATUS_LABELS[j.status],
      priceCents: j.price_cents,
      otherParty: side === 'rider' ? j.shop_name : side === 'builder' ? j.rider_name : `${j.rider_name} · ${j.shop_name}`,
      needsYou,
      updatedAt: new Date(j.updated_at).toISOString(),
    };
  });
}
