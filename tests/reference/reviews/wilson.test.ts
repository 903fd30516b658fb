// The ranking score of a shop is the Wilson score interval's lower bound (z = 1.96) of the share of
// positive reviews. Checked against published worked examples.
import { describe, expect, it } from 'vitest';
import { ratingSummary, wilsonInterval, wilsonLowerBound } from '@/lib/reviews/score';

describe('Wilson score interval, 95 %', () => {
  // Source: R. G. Newcombe (1998), "Two-sided confidence intervals for the single proportion: comparison of
  // seven methods", Statistics in Medicine 17:857–872 — its four worked examples, score method without
  // continuity correction, to 4 decimal places.
  const NEWCOMBE_1998 = [
    { positive: 81, total: 263, lower: 0.2553, upper: 0.3662 },
    { positive: 15, total: 148, lower: 0.0624, upper: 0.1605 },
    { positive: 0, total: 20, lower: 0, upper: 0.1611 },
    { positive: 1, total: 29, lower: 0.0061, upper: 0.1718 },
  ];

  it.each(NEWCOMBE_1998)('$positive/$total → $lower to $upper (Newcombe 1998)', ({ positive, total, lower, upper }) => {
    const interval = wilsonInterval(positive, total, 1.96);
    expect(interval.lower).toBeCloseTo(lower, 4);
    expect(interval.upper).toBeCloseTo(upper, 4);
    expect(wilsonLowerBound(positive, total)).toBeCloseTo(lower, 4);
  });

  it('ranks more evidence above the same share from fewer reviews (common practice, no source)', () => {
    expect(wilsonLowerBound(10, 10)).toBeGreaterThan(wilsonLowerBound(1, 1));
    expect(wilsonLowerBound(90, 100)).toBeGreaterThan(wilsonLowerBound(9, 10));
    // A 100 % share from one review ranks below 90 % from a hundred.
    expect(wilsonLowerBound(1, 1)).toBeLessThan(wilsonLowerBound(90, 100));
  });

  it('gives 0 with no reviews and refuses impossible counts', () => {
    expect(wilsonLowerBound(0, 0)).toBe(0);
    expect(() => wilsonInterval(3, 2)).toThrow(RangeError);
    expect(() => wilsonInterval(-1, 2)).toThrow(RangeError);
    expect(() => wilsonInterval(1.5, 2)).toThrow(RangeError);
  });

  it('summarises a shop: average stars, count, positives and the score', () => {
    // 4 reviews: 5, 5, 4, 2 stars → 16 stars, 3 positive (4 or 5 stars).
    expect(ratingSummary(4, 16, 3)).toEqual({ average: 4, count: 4, positive: 3, score: wilsonLowerBound(3, 4) });
    expect(ratingSummary(0, 0, 0)).toEqual({ average: null, count: 0, positive: 0, score: 0 });
  });
});
