// The double-entry ledger: every money event on a job is a transaction of entries that sum to zero
// (debit positive, credit negative). Accounts, per job:
//   processor         our balance at the payments processor (asset): up on a charge, down on a refund or transfer
//   rider_funds_held  the rider's money in escrow (liability)
//   builder_payable   released to the builder, transfer not yet made (liability)
//   refunds_payable   owed back to the rider, refund not yet made (liability)
//   platform_fees     the referral fee earned (revenue)
// Invariant, per job, checked at the end of every transaction that touches its money:
//   charged = transferred + fees + refunded + still held (escrow + owed to builder + owed to rider).
import type { Knex } from 'knex';
import { DomainError } from '@/lib/errors';
import { HELD_STATUSES, type JobRow } from './jobStates';

export const LEDGER_ACCOUNTS = ['processor', 'rider_funds_held', 'builder_payable', 'refunds_payable', 'platform_fees'] as const;
export type LedgerAccount = (typeof LEDGER_ACCOUNTS)[number];
export const LEDGER_KINDS = ['charge', 'release', 'refund_due', 'refund', 'transfer', 'reversal'] as const;
export type LedgerKind = (typeof LEDGER_KINDS)[number];

/** The books would not balance: the change is refused whole. People see a plain message; the detail goes to the log. */
export class LedgerImbalance extends DomainError {
  readonly status = 500;
  constructor(readonly detail: string) {
    super('This change was stopped because the job’s books would not balance. Nothing was changed; please contact us.');
    console.error(`ledger: ${detail}`);
  }
}

export interface Posting {
  jobId: string;
  kind: LedgerKind;
  /** The processor's id for what happened (charge, refund, transfer) or our own step key; booked at most once. */
  externalRef: string;
  memo: string;
  entries: { account: LedgerAccount; amountCents: number }[];
}

/** Books one balanced transaction, unless one of this kind and reference exists; returns whether it booked. */
export async function post(trx: Knex.Transaction, p: Posting): Promise<boolean> {
  const entries = p.entries.filter((e) => e.amountCents !== 0);
  for (const e of entries) if (!Number.isSafeInteger(e.amountCents)) throw new LedgerImbalance(`Ledger amounts must be whole cents (${p.kind}).`);
  const total = entries.reduce((s, e) => s + e.amountCents, 0);
  if (total !== 0) throw new LedgerImbalance(`Ledger transaction ${p.kind} for job ${p.jobId} does not balance (off by ${total} cents).`);
  if (entries.length === 0) return false;
  const existing = await trx('ledger_transactions').where({ kind: p.kind, external_ref: p.externalRef }).first('id');
  if (existing) return false;
  const [txn] = await trx('ledger_transactions').insert({ job_id: p.jobId, kind: p.kind, external_ref: p.externalRef, memo: p.memo }).returning('id');
  await trx('ledger_entries').insert(entries.map((e) => ({ transaction_id: txn.id, job_id: p.jobId, account: e.account, amount_cents: e.amountCents })));
  return true;
}

// ------------------------------------------------------------------ the money events

export const bookCharge = (trx: Knex.Transaction, jobId: string, chargeId: string, amountCents: number) =>
  post(trx, {
    jobId,
    kind: 'charge',
    externalRef: chargeId,
    memo: 'Rider paid; held in escrow',
    entries: [
      { account: 'processor', amountCents },
      { account: 'rider_funds_held', amountCents: -amountCents },
    ],
  });

export const bookRelease = (trx: Knex.Transaction, jobId: string, a: { shareCents: number; feeCents: number; payoutCents: number }, memo: string) =>
  post(trx, {
    jobId,
    kind: 'release',
    externalRef: `job:${jobId}:release`,
    memo,
    entries: [
      { account: 'rider_funds_held', amountCents: a.shareCents },
      { account: 'builder_payable', amountCents: -a.payoutCents },
      { account: 'platform_fees', amountCents: -a.feeCents },
    ],
  });

export const bookRefundDue = (trx: Knex.Transaction, jobId: string, refundRowId: string, amountCents: number, memo: string) =>
  post(trx, {
    jobId,
    kind: 'refund_due',
    externalRef: refundRowId,
    memo,
    entries: [
      { account: 'rider_funds_held', amountCents },
      { account: 'refunds_payable', amountCents: -amountCents },
    ],
  });

export const bookRefund = (trx: Knex.Transaction, jobId: string, refundId: string, amountCents: number) =>
  post(trx, {
    jobId,
    kind: 'refund',
    externalRef: refundId,
    memo: 'Refund sent to the rider',
    entries: [
      { account: 'refunds_payable', amountCents },
      { account: 'processor', amountCents: -amountCents },
    ],
  });

export const bookTransfer = (trx: Knex.Transaction, jobId: string, transferId: string, amountCents: number) =>
  post(trx, {
    jobId,
    kind: 'transfer',
    externalRef: transferId,
    memo: 'Transferred to the builder',
    entries: [
      { account: 'builder_payable', amountCents },
      { account: 'processor', amountCents: -amountCents },
    ],
  });

/** Money a transfer reversal brought back to the platform; owed to the builder again until someone decides. */
export const bookReversal = (trx: Knex.Transaction, jobId: string, ref: string, amountCents: number) =>
  post(trx, {
    jobId,
    kind: 'reversal',
    externalRef: ref,
    memo: 'Transfer reversed at the processor',
    entries: [
      { account: 'processor', amountCents },
      { account: 'builder_payable', amountCents: -amountCents },
    ],
  });

// ------------------------------------------------------------------ balances and the invariant

export interface JobMoney {
  chargedCents: number;
  refundedCents: number;
  /** Transfers made, less reversals. */
  transferredCents: number;
  reversedCents: number;
  feesCents: number;
  heldInEscrowCents: number;
  owedToBuilderCents: number;
  owedToRiderCents: number;
  /** Everything still on the platform for this job: escrow plus what is owed either way. */
  stillHeldCents: number;
}

export async function jobMoney(db: Knex, jobId: string): Promise<JobMoney> {
  const rows = (await db('ledger_entries as e')
    .join('ledger_transactions as t', 't.id', 'e.transaction_id')
    .where('e.job_id', jobId)
    .groupBy('e.account', 't.kind')
    .select('e.account', 't.kind', db.raw('sum(e.amount_cents)::bigint as total'))) as { account: LedgerAccount; kind: LedgerKind; total: string }[];
  const sum = (pred: (r: { account: LedgerAccount; kind: LedgerKind }) => boolean) =>
    rows.filter(pred).reduce((s, r) => s + Number(r.total), 0);
  const neg = (n: number) => (n === 0 ? 0 : -n);
  const chargedCents = sum((r) => r.account === 'processor' && r.kind === 'charge');
  const refundedCents = neg(sum((r) => r.account === 'processor' && r.kind === 'refund'));
  const grossTransferred = neg(sum((r) => r.account === 'processor' && r.kind === 'transfer'));
  const reversedCents = sum((r) => r.account === 'processor' && r.kind === 'reversal');
  const heldInEscrowCents = neg(sum((r) => r.account === 'rider_funds_held'));
  const owedToBuilderCents = neg(sum((r) => r.account === 'builder_payable'));
  const owedToRiderCents = neg(sum((r) => r.account === 'refunds_payable'));
  return {
    chargedCents,
    refundedCents,
    transferredCents: grossTransferred - reversedCents,
    reversedCents,
    feesCents: neg(sum((r) => r.account === 'platform_fees')),
    heldInEscrowCents,
    owedToBuilderCents,
    owedToRiderCents,
    stillHeldCents: heldInEscrowCents + owedToBuilderCents + owedToRiderCents,
  };
}

/** Every way a job's books can be wrong; empty when they balance. */
export async function ledgerProblems(db: Knex, job: JobRow): Promise<string[]> {
  const problems: string[] = [];
  const unbalanced = await db('ledger_entries').where({ job_id: job.id }).groupBy('transaction_id').havingRaw('sum(amount_cents) <> 0').pluck('transaction_id');
  if (unbalanced.length) problems.push(`unbalanced transactions: ${unbalanced.join(', ')}`);
  const m = await jobMoney(db, job.id);
  const accounted = m.transferredCents + m.feesCents + m.refundedCents + m.stillHeldCents;
  if (m.chargedCents !== accounted) problems.push(`charged ${m.chargedCents} ≠ transferred ${m.transferredCents} + fees ${m.feesCents} + refunded ${m.refundedCents} + held ${m.stillHeldCents}`);
  for (const [name, value] of Object.entries(m)) if (value < 0) problems.push(`${name} is negative (${value})`);

  const expectedEscrow = HELD_STATUSES.includes(job.status) ? job.price_cents : 0;
  if (m.heldInEscrowCents !== expectedEscrow) problems.push(`escrow holds ${m.heldInEscrowCents} but a ${job.status} job should hold ${expectedEscrow}`);
  if (m.feesCents !== (job.fee_cents ?? 0)) problems.push(`fees booked ${m.feesCents} but the job records ${job.fee_cents ?? 0}`);

  const payouts = (await db('payouts').where({ job_id: job.id }).select('status', 'amount_cents')) as { status: string; amount_cents: number }[];
  const paid = payouts.filter((p) => p.status === 'paid').reduce((s, p) => s + p.amount_cents, 0);
  const pending = payouts.filter((p) => p.status === 'pending').reduce((s, p) => s + p.amount_cents, 0);
  if (m.transferredCents + m.reversedCents !== paid) problems.push(`transfers booked ${m.transferredCents + m.reversedCents} but payouts paid ${paid}`);
  if (m.owedToBuilderCents !== pending + m.reversedCents) problems.push(`owed to the builder ${m.owedToBuilderCents} but payouts pending ${pending} (+ reversed ${m.reversedCents})`);

  const refunds = (await db('refunds').where({ job_id: job.id }).select('status', 'amount_cents')) as { status: string; amount_cents: number }[];
  const refunded = refunds.filter((r) => r.status === 'succeeded').reduce((s, r) => s + r.amount_cents, 0);
  const refundPending = refunds.filter((r) => r.status === 'pending').reduce((s, r) => s + r.amount_cents, 0);
  if (m.refundedCents !== refunded) problems.push(`refunds booked ${m.refundedCents} but refunds sent ${refunded}`);
  if (m.owedToRiderCents !== refundPending) problems.push(`owed to the rider ${m.owedToRiderCents} but refunds pending ${refundPending}`);
  return problems;
}

/** Throws when a job's books do not balance; called at the end of every transaction that moves its money. */
export async function assertJobBalances(trx: Knex.Transaction, jobId: string): Promise<void> {
  const job = (await trx('jobs').where({ id: jobId }).first()) as JobRow;
  const problems = await ledgerProblems(trx, job);
  if (problems.length) throw new LedgerImbalance(`The books for job ${jobId} do not balance: ${problems.join('; ')}.`);
}
