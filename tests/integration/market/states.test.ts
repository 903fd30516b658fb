import { describe, expect, it } from 'vitest';
import { Conflict } from '@/lib/errors';
import {
  BID_MOVES,
  BID_STATUSES,
  REQUEST_MOVES,
  REQUEST_STATUSES,
  assertBidMove,
  assertRequestEditable,
  assertRequestMove,
  canMoveBid,
  canMoveRequest,
  isRequestEditable,
} from '@/lib/market/states';

describe('the request and bid state machine', () => {
  it('allows exactly these request moves', () => {
    const allowed = REQUEST_STATUSES.flatMap((s) => (Object.keys(REQUEST_MOVES) as (keyof typeof REQUEST_MOVES)[]).filter((m) => canMoveRequest(s, m)).map((m) => `${s}:${m}`));
    expect(allowed.sort()).toEqual(['draft:cancel', 'draft:publish', 'open:award', 'open:cancel', 'open:expire']);
  });

  it('allows exactly these bid moves, all from live', () => {
    const allowed = BID_STATUSES.flatMap((s) => (Object.keys(BID_MOVES) as (keyof typeof BID_MOVES)[]).filter((m) => canMoveBid(s, m)).map((m) => `${s}:${m}`));
    expect(allowed.sort()).toEqual(['live:accept', 'live:decline', 'live:expire', 'live:revise', 'live:withdraw']);
  });

  it('answers a wrong move with a Conflict in plain words', () => {
    expect(() => assertRequestMove('expired', 'award')).toThrow(new Conflict('This request is expired, so it cannot be awarded.'));
    expect(() => assertBidMove('declined', 'accept')).toThrow(new Conflict('This bid is declined, so it cannot be accepted.'));
    expect(assertRequestMove('draft', 'publish')).toBe('open');
    expect(assertBidMove('live', 'withdraw')).toBe('withdrawn');
  });

  it('is editable while a draft, or open with no live bid', () => {
    expect(isRequestEditable('draft', 0)).toBe(true);
    expect(isRequestEditable('open', 0)).toBe(true);
    expect(isRequestEditable('open', 1)).toBe(false);
    expect(isRequestEditable('awarded', 0)).toBe(false);
    expect(() => assertRequestEditable('open', 2)).toThrow(/already has a bid/);
    expect(() => assertRequestEditable('cancelled', 0)).toThrow(/cancelled, so it can no longer be edited/);
  });
});
