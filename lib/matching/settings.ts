// How the matcher weighs shops for a newly published request. The parts are each 0 to 1; the weights sum to 1.
export const MATCH_WEIGHTS = {
  /** Does the shop list what the wheels need (gauge, spoke count, hub drilling when needed)? */
  capability: 0.4,
  /** Nearer is better: shipping costs less, and a rider can visit. */
  distance: 0.25,
  /** Wilson lower bound of the shop's positive reviews: proven good work ranks higher. */
  rating: 0.2,
  /** Free build slots: open jobs against the builds the shop takes at once. */
  backlog: 0.15,
} as const;

export const MATCH_SETTINGS = {
  /** How many of the best-ranked shops are invited to bid when a request is published. */
  inviteCount: 5,
  /** The distance part is 1/2 at this distance (1 at the door, falling smoothly after). */
  distanceHalfScoreMiles: 300,
  /** A rider who picks the wheel up is matched only with shops this close. */
  pickupRadiusMiles: 150,
  /** A requirement a shop has not listed at all (say, no gauges given) counts this much of a match. */
  unlistedCredit: 0.5,
} as const;

/** Jobs a shop has taken on and not yet shipped: they fill its build slots. */
export const OPEN_JOB_STATUSES = ['awaiting_payment', 'funded', 'building'] as const;
