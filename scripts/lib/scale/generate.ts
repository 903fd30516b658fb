// The scale data set, as rows ready for bulk insert. Deterministic: the same seed and the same day give
// the same rows. Times are counted back from the start of the current UTC day, so open requests are open
// whenever the data is made. Statuses follow the market's state machine (lib/market/states.ts).
import bcrypt from 'bcryptjs';
import { Rng } from './random';
import { randomPlace, type Place } from './places';
import { bidMessage, personName, requestNotes, reviewBody, riderLine, shopBio, shopLine, shopName, slugify } from './vocabulary';
import { specTemplates, type SpecTemplate } from './wheels';

export const SCALE_SEED = 20261202;
export const SCALE_PASSWORD = 'lacewright-scale';
export const SCALE_EMAIL_DOMAIN = 'scale.lacewright.test';
export const scaleBuilderEmail = (i: number) => `builder-${String(i + 1).padStart(4, '0')}@${SCALE_EMAIL_DOMAIN}`;
export const scaleRiderEmail = (i: number) => `rider-${String(i + 1).padStart(5, '0')}@${SCALE_EMAIL_DOMAIN}`;
export const SCALE_ADMIN_EMAIL = `admin@${SCALE_EMAIL_DOMAIN}`;

export interface ScaleCounts {
  shops: number;
  riders: number;
  requests: number;
  openRequests: number;
  bids: number;
  messages: number;
  reviews: number;
}

export const FULL_SCALE: ScaleCounts = { shops: 500, riders: 20_000, requests: 50_000, openRequests: 10_000, bids: 250_000, messages: 100_000, reviews: 20_000 };

/** Shops with broad capabilities, so the board has plenty for them (the benchmark signs in as these). */
export const GENERALIST_SHOPS = 40;

const DAY = 86_400_000;
const HOUR = 3_600_000;

type Row = Record<string, unknown>;

export interface ScaleData {
  users: Row[];
  shops: Row[];
  shopMembers: Row[];
  requests: Row[];
  bids: Row[];
  /** Applied after the bids exist: the accepted bid of each awarded request. */
  awards: { request_id: string; accepted_bid_id: string }[];
  jobs: Row[];
  reviews: Row[];
  messages: Row[];
  threadReads: Row[];
}

const iso = (ms: number) => new Date(ms).toISOString();
const dateOnly = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/** Spreads `total` units over `n` slots, each at least `min` and at most `max`. */
function spread(rng: Rng, n: number, total: number, min: number, max: number): number[] {
  const counts = new Array<number>(n).fill(min);
  let left = total - n * min;
  if (left < 0 || total > n * max) throw new Error(`cannot spread ${total} over ${n} slots between ${min} and ${max}`);
  while (left > 0) {
    const i = Math.floor(rng.next() * n);
    if (counts[i] < max) {
      counts[i] += 1;
      left -= 1;
    }
  }
  return counts;
}

/** Splits a total into the four bid lines. */
function bidLines(totalCents: number) {
  const parts = Math.round(totalCents * 0.55);
  const labour = Math.round(totalCents * 0.3);
  const finish = Math.round(totalCents * 0.07);
  return { parts_cents: parts, labour_cents: labour, finish_cents: finish, shipping_cents: totalCents - parts - labour - finish };
}

const RIM_WIDTHS_IN = [2.5, 3, 4, 5];
const DIAMETERS_IN = [20, 24, 26, 27.5, 29];
const GAUGES = [10, 12, 13, 14];
const SPOKE_COUNTS = [36, 48, 72, 144];

function capabilities(rng: Rng, generalist: boolean) {
  if (generalist) return { rimWidthsIn: RIM_WIDTHS_IN, diametersIn: DIAMETERS_IN, gauges: GAUGES, spokeCounts: SPOKE_COUNTS, hubDrilling: true, finishes: ['polished', 'painted', 'plated'] };
  return {
    rimWidthsIn: rng.subset(RIM_WIDTHS_IN, 2),
    diametersIn: rng.subset(DIAMETERS_IN, 2),
    gauges: rng.subset(GAUGES, 2),
    spokeCounts: rng.subset(SPOKE_COUNTS, 2),
    hubDrilling: rng.chance(0.5),
    finishes: rng.subset(['polished', 'painted', 'plated', 'black'], 1),
  };
}

/** Stars leaning high, as review sites see them. */
const stars = (rng: Rng) => rng.weighted([[5, 50], [4, 30], [3, 12], [2, 5], [1, 3]] as const);
const near = (rng: Rng, s: number) => Math.min(5, Math.max(1, s + rng.weighted([[0, 6], [-1, 2], [1, 2]] as const)));

export function generateScaleData(counts: ScaleCounts = FULL_SCALE, seed = SCALE_SEED, anchorMs = Date.UTC(new Date().getUTCFullYear(), new Date().getUTCMonth(), new Date().getUTCDate())): ScaleData {
  const rng = new Rng(seed);
  const templates: SpecTemplate[] = specTemplates(rng, 240);
  const salt = `$2b$11$${Array.from({ length: 22 }, () => rng.pick('./ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789'.split(''))).join('')}`;
  const passwordHash = bcrypt.hashSync(SCALE_PASSWORD, salt);

  // People and shops.
  const users: Row[] = [];
  const person = (email: string, role: string, createdMs: number) => {
    const id = rng.uuid();
    users.push({ id, email, name: personName(rng), role, password_hash: passwordHash, email_verified_at: iso(createdMs), created_at: iso(createdMs), updated_at: iso(createdMs) });
    return id;
  };
  person(SCALE_ADMIN_EMAIL, 'admin', anchorMs - 800 * DAY);
  const shops: Row[] = [];
  const shopMembers: Row[] = [];
  const shopOwner: string[] = [];
  for (let i = 0; i < counts.shops; i++) {
    const created = anchorMs - rng.int(30, 900) * DAY;
    const ownerId = person(scaleBuilderEmail(i), 'builder', created);
    const place: Place = randomPlace(rng);
    const id = rng.uuid();
    const name = shopName(rng, i);
    shops.push({
      id,
      name,
      slug: slugify(name),
      bio: shopBio(rng),
      city: place.city,
      region: place.region,
      zip: place.zip,
      latitude: place.latitude,
      longitude: place.longitude,
      capabilities: capabilities(rng, i < GENERALIST_SHOPS),
      labour_rate_cents_per_hour: rng.int(40, 110) * 100,
      builds_at_once: rng.int(1, 6),
      created_at: iso(created),
      updated_at: iso(created),
    });
    shopMembers.push({ shop_id: id, user_id: ownerId, member_role: 'owner', created_at: iso(created) });
    shopOwner.push(ownerId);
  }
  const riders: string[] = [];
  for (let i = 0; i < counts.riders; i++) riders.push(person(scaleRiderEmail(i), 'rider', anchorMs - rng.int(1, 900) * DAY));

  // Requests by status: open, awarded, expired, cancelled, draft.
  const closed = counts.requests - counts.openRequests;
  const awardedCount = Math.round(closed * 0.55);
  const expiredCount = Math.round(closed * 0.25);
  const cancelledCount = Math.round(closed * 0.125);
  const draftCount = closed - awardedCount - expiredCount - cancelledCount;
  const statuses: string[] = [
    ...new Array(counts.openRequests).fill('open'),
    ...new Array(awardedCount).fill('awarded'),
    ...new Array(expiredCount).fill('expired'),
    ...new Array(cancelledCount).fill('cancelled'),
    ...new Array(draftCount).fill('draft'),
  ];
  const requests: Row[] = [];
  /** When each request stopped taking bids (or now, for open ones): bids fall between publishing and this. */
  const window: { from: number; to: number; status: string; riderId: string; baseline: number }[] = [];
  for (const status of statuses) {
    const template = rng.pick(templates);
    const place = randomPlace(rng);
    // A few riders post many requests, most post one or two.
    const riderId = riders[Math.floor(riders.length * rng.next() ** 1.6)];
    let published: number | null = null;
    let closedAt: number | null = null;
    let neededBy: number;
    if (status === 'open') {
      published = anchorMs - rng.int(1, 28 * 24) * HOUR;
      neededBy = anchorMs + rng.int(14, 150) * DAY;
    } else if (status === 'draft') {
      neededBy = anchorMs + rng.int(20, 200) * DAY;
    } else {
      published = anchorMs - rng.int(32, 720) * DAY - rng.int(0, 23) * HOUR;
      neededBy = published + rng.int(30, 120) * DAY;
      if (status === 'awarded') closedAt = published + rng.int(2, 25) * DAY + rng.int(0, 23) * HOUR;
      if (status === 'expired') closedAt = published + 30 * DAY + rng.int(0, 6) * HOUR;
      if (status === 'cancelled') closedAt = published + rng.int(1, 20) * DAY;
    }
    if (status === 'cancelled' && rng.chance(0.3)) published = null; // a draft the rider gave up on
    const created = (published ?? anchorMs - rng.int(1, 200) * DAY) - rng.int(0, 72) * HOUR;
    const expires = published !== null ? published + 30 * DAY : null;
    const id = rng.uuid();
    const budget = Math.round((template.baseline.typicalCents * rng.between(0.8, 1.5)) / 1000) * 1000;
    requests.push({
      id,
      rider_id: riderId,
      title: template.title,
      // Inserted as open and moved to awarded once the accepted bid exists (the two rows point at each other).
      status: status === 'awarded' ? 'open' : status,
      spec: template.spec,
      ...template.columns,
      zip: place.zip,
      city: place.city,
      region: place.region,
      latitude: place.latitude,
      longitude: place.longitude,
      delivery: rng.chance(0.75) ? 'ship' : 'pickup',
      needed_by: dateOnly(neededBy),
      budget_cents: budget,
      notes: requestNotes(rng),
      fit_verdict: template.verdict,
      baseline_low_cents: template.baseline.lowCents,
      baseline_cents: template.baseline.typicalCents,
      baseline_high_cents: template.baseline.highCents,
      accepted_bid_id: null,
      published_at: published !== null ? iso(published) : null,
      expires_at: expires !== null ? iso(expires) : null,
      expiry_warned_at: status === 'expired' && expires !== null ? iso(expires - 72 * HOUR) : null,
      closed_at: closedAt !== null ? iso(closedAt) : null,
      created_at: iso(created),
      updated_at: iso(closedAt ?? published ?? created),
    });
    window.push({ from: published ?? created, to: closedAt ?? anchorMs, status, riderId, baseline: template.baseline.typicalCents });
  }

  // Bids: a share of the total per status group, at most one per shop per request.
  const groups: Record<string, number> = { open: 0.2, awarded: 0.528, expired: 0.16, cancelled: 0.112 };
  const bidCounts = new Array<number>(requests.length).fill(0);
  let assigned = 0;
  const groupNames = Object.keys(groups);
  groupNames.forEach((group, gi) => {
    const members = requests.map((_, i) => i).filter((i) => window[i].status === group && requests[i].published_at !== null);
    const total = gi === groupNames.length - 1 ? counts.bids - assigned : Math.round(counts.bids * groups[group]);
    const each = spread(rng, members.length, total, group === 'awarded' ? 1 : 0, 30);
    members.forEach((i, k) => (bidCounts[i] = each[k]));
    assigned += total;
  });
  const shopIndexes = shops.map((_, i) => i);
  const bids: Row[] = [];
  const awards: ScaleData['awards'] = [];
  const acceptedBids: { requestIndex: number; bid: Row; shopIndex: number; at: number }[] = [];
  const bidsForThreads: { requestIndex: number; shopIndex: number; from: number; to: number }[] = [];
  requests.forEach((request, ri) => {
    const n = bidCounts[ri];
    if (n === 0) return;
    const w = window[ri];
    const chosen = rng.sample(shopIndexes, n);
    const acceptIndex = w.status === 'awarded' ? rng.int(0, n - 1) : -1;
    chosen.forEach((si, k) => {
      const created = w.from + Math.floor(rng.next() * Math.max(HOUR, w.to - w.from - HOUR));
      const total = Math.round((w.baseline * rng.between(0.8, 1.35)) / 100) * 100;
      const revision = rng.weighted([[1, 80], [2, 15], [3, 5]] as const);
      let status: string;
      let closedAt: number | null = null;
      if (k === acceptIndex) {
        status = 'accepted';
        closedAt = w.to;
      } else if (rng.chance(w.status === 'open' ? 0.1 : 0.15)) {
        status = 'withdrawn';
        closedAt = created + Math.floor(rng.next() * Math.max(HOUR, w.to - created));
      } else if (w.status === 'open') status = 'live';
      else {
        status = w.status === 'expired' ? 'expired' : 'declined';
        closedAt = w.to;
      }
      const validUntil = status === 'live' ? anchorMs + rng.int(3, 60) * DAY : created + rng.int(14, 60) * DAY;
      const updated = revision > 1 ? created + Math.floor(rng.next() * Math.max(HOUR, (closedAt ?? anchorMs) - created)) : created;
      const bid: Row = {
        id: rng.uuid(),
        request_id: request.id,
        shop_id: shops[si].id,
        author_id: shopOwner[si],
        status,
        ...bidLines(total),
        lead_time_days: rng.int(7, 60),
        valid_until: iso(validUntil),
        message: bidMessage(rng),
        proposed_change: null,
        revision,
        closed_at: closedAt !== null ? iso(closedAt) : null,
        created_at: iso(created),
        updated_at: iso(closedAt ?? updated),
      };
      bids.push(bid);
      if (status === 'accepted') {
        awards.push({ request_id: request.id as string, accepted_bid_id: bid.id as string });
        acceptedBids.push({ requestIndex: ri, bid, shopIndex: si, at: w.to });
      }
      bidsForThreads.push({ requestIndex: ri, shopIndex: si, from: created, to: closedAt ?? anchorMs });
    });
  });

  // Jobs for awarded requests: older ones finished, recent ones under way.
  const jobs: Row[] = [];
  const completedJobs: { job: Row; completedMs: number; riderId: string; shopIndex: number }[] = [];
  for (const a of acceptedBids) {
    const request = requests[a.requestIndex];
    const ageDays = (anchorMs - a.at) / DAY;
    const price = (a.bid.parts_cents as number) + (a.bid.labour_cents as number) + (a.bid.finish_cents as number) + (a.bid.shipping_cents as number);
    const status =
      ageDays > 60
        ? rng.weighted([['completed', 92], ['cancelled', 8]] as const)
        : ageDays > 20
          ? rng.weighted([['completed', 50], ['shipped', 20], ['building', 25], ['cancelled', 5]] as const)
          : rng.weighted([['awaiting_payment', 40], ['funded', 25], ['building', 30], ['cancelled', 5]] as const);
    const funded = status === 'awaiting_payment' || (status === 'cancelled' && rng.chance(0.5)) ? null : a.at + rng.int(1, 72) * HOUR;
    const started = funded !== null && ['building', 'shipped', 'completed'].includes(status) ? funded + rng.int(1, 5) * DAY : null;
    const shipped = started !== null && ['shipped', 'completed'].includes(status) ? started + rng.int(5, 30) * DAY : null;
    const completed = shipped !== null && status === 'completed' ? Math.min(shipped + rng.int(2, 14) * DAY, anchorMs - DAY) : null;
    const cancelled = status === 'cancelled' ? (funded ?? a.at) + rng.int(1, 5) * DAY : null;
    const feeCents = Math.round((price * 1000) / 10_000);
    const handover = request.delivery === 'pickup' ? 'pickup' : 'carrier';
    const job: Row = {
      id: rng.uuid(),
      request_id: request.id,
      bid_id: a.bid.id,
      rider_id: request.rider_id,
      shop_id: a.bid.shop_id,
      price_cents: price,
      status,
      currency: 'usd',
      fee_bps: funded !== null ? 1000 : null,
      fee_cents: completed !== null ? feeCents : null,
      payment_intent_id: funded !== null ? `pi_scale_${String(jobs.length + 1).padStart(6, '0')}` : null,
      charge_id: funded !== null ? `ch_scale_${String(jobs.length + 1).padStart(6, '0')}` : null,
      funded_at: funded !== null ? iso(funded) : null,
      build_started_at: started !== null ? iso(started) : null,
      shipped_at: shipped !== null ? iso(shipped) : null,
      auto_confirm_at: shipped !== null ? iso(shipped + 14 * DAY) : null,
      completed_at: completed !== null ? iso(completed) : null,
      completed_by: completed !== null ? rng.weighted([['rider', 85], ['auto', 15]] as const) : null,
      cancelled_at: cancelled !== null ? iso(cancelled) : null,
      cancelled_by: cancelled !== null ? 'rider' : null,
      cancel_reason: cancelled !== null ? 'Changed plans' : null,
      handover: shipped !== null ? handover : null,
      carrier: shipped !== null && handover === 'carrier' ? 'Ground parcel' : null,
      tracking_number: shipped !== null && handover === 'carrier' ? `SCALE${String(jobs.length + 1).padStart(8, '0')}` : null,
      created_at: iso(a.at),
      updated_at: iso(completed ?? cancelled ?? shipped ?? started ?? funded ?? a.at),
    };
    jobs.push(job);
    if (completed !== null) completedJobs.push({ job, completedMs: completed, riderId: request.rider_id as string, shopIndex: a.shopIndex });
  }

  // Reviews: riders review shops on most finished jobs, shops review riders on fewer; double-blind windows long over.
  const reviews: Row[] = [];
  const order = rng.sample(completedJobs, completedJobs.length);
  const riderSide = Math.min(order.length, Math.ceil(counts.reviews * 0.55));
  const shopSide = Math.min(order.length, counts.reviews - riderSide);
  order.forEach((c, k) => {
    const writeRider = k < riderSide;
    const writeShop = k < shopSide;
    if (!writeRider && !writeShop) return;
    const riderAt = c.completedMs + rng.int(1, 10 * 24) * HOUR;
    const shopAt = c.completedMs + rng.int(1, 10 * 24) * HOUR;
    const hidden = writeRider && writeShop ? Math.max(riderAt, shopAt) : c.completedMs + 14 * DAY;
    if (writeRider) {
      const overall = stars(rng);
      reviews.push({
        id: rng.uuid(),
        job_id: c.job.id,
        author_side: 'rider',
        author_id: c.riderId,
        subject_shop_id: c.job.shop_id,
        subject_rider_id: null,
        overall,
        build_quality: near(rng, overall),
        communication: near(rng, overall),
        on_time: near(rng, overall),
        clear_spec: null,
        payment: null,
        body: reviewBody(rng),
        editable_until: iso(riderAt + 7 * DAY),
        hidden_until: iso(hidden),
        created_at: iso(riderAt),
        updated_at: iso(riderAt),
      });
    }
    if (writeShop) {
      const overall = stars(rng);
      reviews.push({
        id: rng.uuid(),
        job_id: c.job.id,
        author_side: 'shop',
        author_id: shopOwner[c.shopIndex],
        subject_shop_id: null,
        subject_rider_id: c.riderId,
        overall,
        build_quality: null,
        communication: near(rng, overall),
        on_time: null,
        clear_spec: near(rng, overall),
        payment: near(rng, overall),
        body: reviewBody(rng),
        editable_until: iso(shopAt + 7 * DAY),
        hidden_until: iso(hidden),
        created_at: iso(shopAt),
        updated_at: iso(shopAt),
      });
    }
  });

  // Messages: threads between a request's rider and a shop that bid, a few lines each.
  const messages: Row[] = [];
  const threadReads: Row[] = [];
  const threads = rng.sample(bidsForThreads, bidsForThreads.length);
  for (const t of threads) {
    if (messages.length >= counts.messages) break;
    const n = Math.min(rng.int(1, 7), counts.messages - messages.length);
    const request = requests[t.requestIndex];
    const riderId = request.rider_id as string;
    const builderId = shopOwner[t.shopIndex];
    let at = t.from;
    let riderTurn = rng.chance(0.6);
    for (let k = 0; k < n; k++) {
      at += rng.int(10, 36 * 60) * 60_000;
      if (at > anchorMs - 60_000) at = anchorMs - 60_000 - (n - k) * 1000;
      messages.push({
        id: rng.uuid(),
        request_id: request.id,
        shop_id: shops[t.shopIndex].id,
        author_id: riderTurn ? riderId : builderId,
        body: riderTurn ? riderLine(rng) : shopLine(rng),
        created_at: iso(at),
      });
      riderTurn = !riderTurn;
    }
    if (rng.chance(0.8)) threadReads.push({ user_id: riderId, request_id: request.id, shop_id: shops[t.shopIndex].id, last_read_at: iso(at) });
    if (rng.chance(0.7)) threadReads.push({ user_id: builderId, request_id: request.id, shop_id: shops[t.shopIndex].id, last_read_at: iso(at - rng.int(0, 2) * HOUR) });
  }

  return { users, shops, shopMembers, requests, bids, awards, jobs, reviews, messages, threadReads };
}
