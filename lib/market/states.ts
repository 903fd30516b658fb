// The one state machine for wheel requests and bids: statuses, allowed moves, guards and row locks.
// Every move happens inside a transaction that holds the guarded row's lock (select … for update),
// and the notices it causes are written to the outbox in that same transaction by the caller.
import type { Knex } from 'knex';
import { Conflict, NotFound } from '@/lib/errors';
import { isUuid } from './access';
import type { BidRow, RequestRow } from './rows';

export const REQUEST_STATUSES = ['draft', 'open', 'awarded', 'cancelled', 'expired'] as const;
export type RequestStatus = (typeof REQUEST_STATUSES)[number];

export const BID_STATUSES = ['live', 'accepted', 'declined', 'withdrawn', 'expired'] as const;
export type BidStatus = (typeof BID_STATUSES)[number];

/** How long a published request stays open without an accepted bid, and when the rider is warned. */
export const REQUEST_OPEN_DAYS = 30;
export const EXPIRY_WARNING_HOURS = 72;

type Move<S extends string> = { from: readonly S[]; to: S; verb: string };

export const REQUEST_MOVES = {
  publish: { from: ['draft'], to: 'open', verb: 'published' },
  cancel: { from: ['draft', 'open'], to: 'cancelled', verb: 'cancelled' },
  award: { from: ['open'], to: 'awarded', verb: 'awarded' },
  expire: { from: ['open'], to: 'expired', verb: 'expired' },
} as const satisfies Record<string, Move<RequestStatus>>;
export type RequestMove = keyof typeof REQUEST_MOVES;

export const BID_MOVES = {
  revise: { from: ['live'], to: 'live', verb: 'revised' },
  withdraw: { from: ['live'], to: 'withdrawn', verb: 'withdrawn' },
  accept: { from: ['live'], to: 'accepted', verb: 'accepted' },
  decline: { from: ['live'], to: 'declined', verb: 'declined' },
  expire: { from: ['live'], to: 'expired', verb: 'expired' },
} as const satisfies Record<string, Move<BidStatus>>;
export type BidMove = keyof typeof BID_MOVES;

const REQUEST_STATUS_WORDS: Record<RequestStatus, string> = {
  draft: 'still a draft',
  open: 'open for bids',
  awarded: 'already awarded to a builder',
  cancelled: 'cancelled',
  expired: 'expired',
};

const BID_STATUS_WORDS: Record<BidStatus, string> = {
  live: 'live',
  accepted: 'already accepted',
  declined: 'declined',
  withdrawn: 'withdrawn',
  expired: 'expired',
};

export function canMoveRequest(status: RequestStatus, move: RequestMove): boolean {
  return (REQUEST_MOVES[move].from as readonly RequestStatus[]).includes(status);
}

export function canMoveBid(status: BidStatus, move: BidMove): boolean {
  return (BID_MOVES[move].from as readonly BidStatus[]).includes(status);
}

/** Throws Conflict (409) in plain words when the request cannot make this move. */
export function assertRequestMove(status: RequestStatus, move: RequestMove): RequestStatus {
  if (!canMoveRequest(status, move)) {
    throw new Conflict(`This request is ${REQUEST_STATUS_WORDS[status]}, so it cannot be ${REQUEST_MOVES[move].verb}.`);
  }
  return REQUEST_MOVES[move].to;
}

export function assertBidMove(status: BidStatus, move: BidMove): BidStatus {
  if (!canMoveBid(status, move)) {
    throw new Conflict(`This bid is ${BID_STATUS_WORDS[status]}, so it cannot be ${BID_MOVES[move].verb}.`);
  }
  return BID_MOVES[move].to;
}

/** A request can be edited while a draft, or while open with no live bid priced against it. */
export function isRequestEditable(status: RequestStatus, liveBidCount: number): boolean {
  return status === 'draft' || (status === 'open' && liveBidCount === 0);
}

export function assertRequestEditable(status: RequestStatus, liveBidCount: number): void {
  if (status === 'open' && liveBidCount > 0) {
    throw new Conflict('This request already has a bid, so it can no longer be edited. Cancel it and post a new one to change the wheel.');
  }
  if (!isRequestEditable(status, liveBidCount)) throw new Conflict(`This request is ${REQUEST_STATUS_WORDS[status]}, so it can no longer be edited.`);
}

/** Bids are only taken on a request that is open and not past its expiry time. */
export function assertRequestTakesBids(request: Pick<RequestRow, 'status' | 'expires_at'>, now = new Date()): void {
  if (request.status !== 'open') throw new Conflict(`This request is ${REQUEST_STATUS_WORDS[request.status]}, so it takes no bids.`);
  if (request.expires_at && request.expires_at.getTime() <= now.getTime()) throw new Conflict('This request has expired, so it takes no bids.');
}

/** A live bid whose valid-until time has passed can no longer be accepted. */
export function assertBidStillValid(bid: Pick<BidRow, 'valid_until'>, now = new Date()): void {
  if (bid.valid_until.getTime() <= now.getTime()) throw new Conflict('This bid is past its valid-until date, so it cannot be accepted.');
}

/** Reads and locks one request row for the rest of the transaction. */
export async function lockRequest(trx: Knex.Transaction, id: string, opts: { skipLocked?: boolean } = {}): Promise<RequestRow> {
  if (!isUuid(id)) throw new NotFound('Request not found.');
  const query = trx<RequestRow>('wheel_requests').where({ id }).first().forUpdate();
  const row = await (opts.skipLocked ? query.skipLocked() : query);
  if (!row) throw new NotFound('Request not found.');
  return row as RequestRow;
}

export async function lockBid(trx: Knex.Transaction, id: string): Promise<BidRow> {
  if (!isUuid(id)) throw new NotFound('Bid not found.');
  const row = await trx<BidRow>('bids').where({ id }).first().forUpdate();
  if (!row) throw new NotFound('Bid not found.');
  return row as BidRow;
}

/** Moves a locked request; `changes` are written with the new status. */
export async function moveRequest(trx: Knex.Transaction, request: RequestRow, move: RequestMove, changes: Partial<RequestRow> = {}): Promise<RequestRow> {
  const to = assertRequestMove(request.status, move);
  const [row] = await trx<RequestRow>('wheel_requests')
    .where({ id: request.id, status: request.status })
    .update({ ...changes, status: to, updated_at: trx.fn.now() } as never)
    .returning('*');
  if (!row) throw new Conflict('This request changed while you were working on it; reload and try again.');
  return row as RequestRow;
}

export async function moveBid(trx: Knex.Transaction, bid: BidRow, move: BidMove, changes: Partial<BidRow> = {}): Promise<BidRow> {
  const to = assertBidMove(bid.status, move);
  const closing = to !== 'live';
  const [row] = await trx<BidRow>('bids')
    .where({ id: bid.id, status: bid.status })
    .update({ ...changes, status: to, updated_at: trx.fn.now(), ...(closing ? { closed_at: trx.fn.now() } : {}) } as never)
    .returning('*');
  if (!row) throw new Conflict('This bid changed while you were working on it; reload and try again.');
  return row as BidRow;
}

/** The rider's view of what happens next, in plain words. */
export function nextStepForRider(request: Pick<RequestRow, 'status' | 'expires_at'>, liveBidCount: number): string {
  switch (request.status) {
    case 'draft':
      return 'Publish it when you are ready; builders cannot see a draft.';
    case 'open': {
      const until = request.expires_at ? ` before ${request.expires_at.toISOString().slice(0, 10)}` : '';
      if (liveBidCount === 0) return `Waiting for builders to bid. You can still edit it until the first bid arrives; it closes${until} if no bid is accepted.`;
      return `${liveBidCount} ${liveBidCount === 1 ? 'bid' : 'bids'} to compare. Accept one${until}, or the request expires.`;
    }
    case 'awarded':
      return 'You accepted a bid. Next: pay into escrow so the builder can start.';
    case 'cancelled':
      return 'You cancelled this request. Nothing more happens.';
    case 'expired':
      return 'No bid was accepted in time. Post it again if you still need the wheel.';
  }
}

/** The builder's view of what happens next for one of their bids. */
export function nextStepForShop(bidStatus: BidStatus): string {
  switch (bidStatus) {
    case 'live':
      return 'Waiting for the rider. You can revise or withdraw it until it is accepted.';
    case 'accepted':
      return 'The rider accepted your bid. Next: the rider pays into escrow, then you build.';
    case 'declined':
      return 'The rider went with another bid or closed the request.';
    case 'withdrawn':
      return 'You withdrew this bid.';
    case 'expired':
      return 'This bid passed its valid-until date or the request closed.';
  }
}
