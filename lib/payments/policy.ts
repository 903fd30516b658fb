// Money rules in one place: the referral fee, the cancellation and refund policy, and how a dispute's
// decision divides the escrow. Pure functions over integer cents and basis points.
import { Invalid } from '@/lib/errors';
import type { JobStatus } from './jobStates';

/** Share of the price the builder keeps when the rider cancels after the build has started: 25 %. */
export const BUILD_STARTED_KEEP_BPS = 2500;

/** The cancellation and refund policy, as shown to riders and builders wherever they can cancel. */
export const REFUND_POLICY = {
  title: 'Cancellation and refunds',
  points: [
    'Before you pay: either side can cancel; nothing has been charged.',
    'After payment, before the build starts: either side can cancel and the rider gets everything back.',
    `After the build has started: if the rider cancels, the builder keeps ${BUILD_STARTED_KEEP_BPS / 100}% of the price for parts and bench time already spent (paid to the builder less our referral fee) and the rider gets the rest back. If the builder cancels, the rider gets everything back.`,
    'Once the wheel is shipped or ready for pickup, nobody can cancel: the rider confirms receipt, or either side opens a dispute and an admin decides.',
    'While a dispute is open the money stays frozen in escrow until an admin releases it to the builder, refunds it to the rider, or splits it, with a written reason.',
  ],
} as const;

/** The referral fee on an amount paid to a builder, rounded half up to a whole cent. */
export function referralFeeCents(amountCents: number, feeBps: number): number {
  if (!Number.isInteger(amountCents) || amountCents < 0) throw new Error(`amount must be whole cents, got ${amountCents}`);
  if (!Number.isInteger(feeBps) || feeBps < 0 || feeBps > 10_000) throw new Error(`fee must be 0 to 10000 basis points, got ${feeBps}`);
  return Math.floor((amountCents * feeBps + 5_000) / 10_000);
}

/** How one decision divides the escrowed price: what goes back to the rider, what the builder is paid, and the fee. */
export interface MoneySplit {
  refundCents: number;
  /** The builder's share before the fee. */
  shareCents: number;
  feeCents: number;
  /** What is transferred to the builder: share − fee. */
  payoutCents: number;
}

export function splitFor(priceCents: number, refundCents: number, feeBps: number): MoneySplit {
  if (!Number.isInteger(refundCents) || refundCents < 0 || refundCents > priceCents) {
    throw new Invalid(`The refund must be whole cents between 0 and ${priceCents}.`, { refundCents: ['Enter an amount between nothing and the full price.'] });
  }
  const shareCents = priceCents - refundCents;
  const feeCents = referralFeeCents(shareCents, feeBps);
  return { refundCents, shareCents, feeCents, payoutCents: shareCents - feeCents };
}

export type CancelSide = 'rider' | 'builder';

export interface CancellationTerms {
  allowed: boolean;
  /** Why not, when not allowed. */
  reason?: string;
  split: MoneySplit | null;
  /** One sentence for the confirm dialog. */
  summary: string;
}

const usd = (cents: number) => `$${(cents / 100).toFixed(2)}`;

/** What cancelling now means for this side, by the policy above. */
export function cancellationTerms(status: JobStatus, side: CancelSide, priceCents: number, feeBps: number): CancellationTerms {
  switch (status) {
    case 'awaiting_payment':
      return { allowed: true, split: null, summary: 'Nothing has been charged, so there is nothing to refund. The job closes.' };
    case 'funded': {
      const split = splitFor(priceCents, priceCents, feeBps);
      return { allowed: true, split, summary: `The build has not started: the rider gets the full ${usd(priceCents)} back.` };
    }
    case 'building': {
      if (side === 'builder') {
        const split = splitFor(priceCents, priceCents, feeBps);
        return { allowed: true, split, summary: `You are backing out after starting: the rider gets the full ${usd(priceCents)} back and you are paid nothing.` };
      }
      const kept = Math.floor((priceCents * BUILD_STARTED_KEEP_BPS) / 10_000);
      const split = splitFor(priceCents, priceCents - kept, feeBps);
      return {
        allowed: true,
        split,
        summary: `The build has started: you get ${usd(split.refundCents)} back; the builder keeps ${usd(split.shareCents)} (${BUILD_STARTED_KEEP_BPS / 100}%) for parts and work already done.`,
      };
    }
    case 'shipped':
      return { allowed: false, split: null, reason: 'The wheel is already shipped or ready for pickup. Confirm receipt, or open a dispute if something is wrong.', summary: '' };
    case 'disputed':
      return { allowed: false, split: null, reason: 'A dispute is open; an admin decides what happens to the money.', summary: '' };
    default:
      return { allowed: false, split: null, reason: 'This job is already closed.', summary: '' };
  }
}
