// Shop rating maths: the plain average for people to read, and a confidence-adjusted score to rank by.
import { REVIEW_SETTINGS } from './settings';

/**
 * Lower bound of the Wilson score interval for a binomial proportion (positive reviews of all reviews).
 * (p̂ + z²/2n − z·√(p̂(1 − p̂)/n + z²/4n²)) ÷ (1 + z²/n) — Wilson (1927); Newcombe (1998), Stat Med 17:857–872.
 * With no reviews there is no evidence, so the bound is 0.
 */
export function wilsonLowerBound(positive: number, total: number, z: number = REVIEW_SETTINGS.wilsonZ): number {
  return wilsonInterval(positive, total, z).lower;
}

/** Both ends of the Wilson score interval; [0, 1] when there are no trials. */
export function wilsonInterval(positive: number, total: number, z: number = REVIEW_SETTINGS.wilsonZ): { lower: number; upper: number } {
  if (!Number.isInteger(total) || total < 0 || !Number.isInteger(positive) || positive < 0 || positive > total) {
    throw new RangeError(`wilsonInterval needs whole numbers 0 ≤ positive ≤ total (got ${positive}/${total})`);
  }
  if (total === 0) return { lower: 0, upper: 1 };
  const p = positive / total;
  const z2 = z * z;
  const centre = p + z2 / (2 * total);
  const spread = z * Math.sqrt((p * (1 - p)) / total + z2 / (4 * total * total));
  const denominator = 1 + z2 / total;
  // Clamp away floating-point dust at the ends (0/n and n/n give exactly 0 and 1 in exact arithmetic).
  return { lower: Math.max(0, (centre - spread) / denominator), upper: Math.min(1, (centre + spread) / denominator) };
}

export interface RatingSummary {
  /** Mean of the overall stars, or null with no reviews. */
  average: number | null;
  count: number;
  /** Reviews of REVIEW_SETTINGS.positiveFromStars stars or more. */
  positive: number;
  /** Wilson lower bound of the positive share: what the shop ranks by (0 to 1). */
  score: number;
}

export function ratingSummary(count: number, starTotal: number, positive: number): RatingSummary {
  return {
    average: count === 0 ? null : starTotal / count,
    count,
    positive,
    score: wilsonLowerBound(positive, count),
  };
}

export const isPositive = (overall: number): boolean => overall >= REVIEW_SETTINGS.positiveFromStars;
