// How reviews behave, in one place. Days are whole days of 24 hours from the moment named.
export const REVIEW_SETTINGS = {
  /**
   * Both sides may write for this many days after the job completes. Until both have written, or until
   * this period ends, neither sees the other's review (so neither can answer the other's).
   */
  reviewPeriodDays: 14,
  /** An author may change a review for this many days after writing it, while it is still hidden. */
  editWindowDays: 7,
  /** A reminder goes to each side that has not written this many days after completion (once). */
  reminderAfterDays: 3,
  /** A review with at least this many stars counts as positive in the ranking score. */
  positiveFromStars: 4,
  /** 95 % two-sided normal quantile for the Wilson lower bound. */
  wilsonZ: 1.96,
} as const;

export const DAY_MS = 86_400_000;
export const addDays = (from: Date, days: number): Date => new Date(from.getTime() + days * DAY_MS);
