// The one state machine for jobs: statuses, allowed moves, the row lock, and the move itself.
// Every move runs inside a transaction that holds the job row's lock (select … for update); the ledger
// entries, payout or refund rows and outbox mail it causes are written in that same transaction.
import type { Knex } from 'knex';
import { Conflict, NotFound } from '@/lib/errors';

export const JOB_STATUSES = ['awaiting_payment', 'funded', 'building', 'shipped', 'completed', 'cancelled', 'refunded', 'disputed', 'resolved'] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];

type Move = { from: readonly JobStatus[]; to: JobStatus; verb: string };

export const JOB_MOVES = {
  /** The processor told us the rider's payment succeeded (webhook only). */
  fund: { from: ['awaiting_payment'], to: 'funded', verb: 'marked paid' },
  startBuild: { from: ['funded'], to: 'building', verb: 'started' },
  ship: { from: ['building'], to: 'shipped', verb: 'marked shipped or ready for pickup' },
  /** The rider confirms receipt, or the worker does after the waiting period. */
  confirm: { from: ['shipped'], to: 'completed', verb: 'confirmed as received' },
  /** Before any money: nothing to refund. */
  cancelUnpaid: { from: ['awaiting_payment'], to: 'cancelled', verb: 'cancelled' },
  /** After the money arrived: refunded in full or in part, by the cancellation policy. */
  cancelFunded: { from: ['funded', 'building'], to: 'refunded', verb: 'cancelled' },
  dispute: { from: ['funded', 'building', 'shipped'], to: 'disputed', verb: 'disputed' },
  resolve: { from: ['disputed'], to: 'resolved', verb: 'resolved' },
} as const satisfies Record<string, Move>;
export type JobMove = keyof typeof JOB_MOVES;

/** Statuses in which the rider's money sits in escrow, untouched. */
export const HELD_STATUSES: readonly JobStatus[] = ['funded', 'building', 'shipped', 'disputed'];
export const FINAL_STATUSES: readonly JobStatus[] = ['completed', 'cancelled', 'refunded', 'resolved'];

export const JOB_STATUS_LABELS: Record<JobStatus, string> = {
  awaiting_payment: 'Awaiting payment',
  funded: 'Paid into escrow',
  building: 'Being built',
  shipped: 'Shipped',
  completed: 'Completed',
  cancelled: 'Cancelled',
  refunded: 'Cancelled and refunded',
  disputed: 'In dispute',
  resolved: 'Dispute settled',
};

const STATUS_WORDS: Record<JobStatus, string> = {
  awaiting_payment: 'still awaiting payment',
  funded: 'paid and waiting for the build to start',
  building: 'being built',
  shipped: 'already shipped',
  completed: 'already completed',
  cancelled: 'cancelled',
  refunded: 'cancelled and refunded',
  disputed: 'in dispute, so its money is frozen until an admin decides',
  resolved: 'settled by an admin',
};

export function canMoveJob(status: JobStatus, move: JobMove): boolean {
  return (JOB_MOVES[move].from as readonly JobStatus[]).includes(status);
}

/** Throws Conflict (409) in plain words when the job cannot make this move. */
export function assertJobMove(status: JobStatus, move: JobMove): JobStatus {
  if (!canMoveJob(status, move)) throw new Conflict(`This job is ${STATUS_WORDS[status]}, so it cannot be ${JOB_MOVES[move].verb}.`);
  return JOB_MOVES[move].to;
}

export interface JobRow {
  id: string;
  request_id: string;
  bid_id: string;
  rider_id: string;
  shop_id: string;
  price_cents: number;
  currency: string;
  status: JobStatus;
  fee_bps: number | null;
  fee_cents: number | null;
  /** The payment that funded the escrow; later payments on the same job are refunded. */
  payment_intent_id: string | null;
  charge_id: string | null;
  funded_at: Date | null;
  build_started_at: Date | null;
  shipped_at: Date | null;
  auto_confirm_at: Date | null;
  completed_at: Date | null;
  completed_by: 'rider' | 'auto' | null;
  cancelled_at: Date | null;
  cancelled_by: 'rider' | 'builder' | 'system' | null;
  cancel_reason: string | null;
  disputed_at: Date | null;
  disputed_from: JobStatus | null;
  resolved_at: Date | null;
  handover: 'carrier' | 'pickup' | null;
  carrier: string | null;
  tracking_number: string | null;
  created_at: Date;
  updated_at: Date;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
export const isJobId = (value: string): boolean => UUID.test(value);

/** Reads and locks one job row for the rest of the transaction. */
export async function lockJob(trx: Knex.Transaction, id: string): Promise<JobRow> {
  if (!isJobId(id)) throw new NotFound('Job not found.');
  const row = (await trx('jobs').where({ id }).first().forUpdate()) as JobRow | undefined;
  if (!row) throw new NotFound('Job not found.');
  return row;
}

/** Moves a locked job; `changes` are written with the new status. */
export async function moveJob(trx: Knex.Transaction, job: JobRow, move: JobMove, changes: Partial<JobRow> = {}): Promise<JobRow> {
  const to = assertJobMove(job.status, move);
  const [row] = (await trx('jobs')
    .where({ id: job.id, status: job.status })
    .update({ ...changes, status: to, updated_at: trx.fn.now() } as never)
    .returning('*')) as JobRow[];
  if (!row) throw new Conflict('This job changed while you were working on it; reload and try again.');
  return row;
}
