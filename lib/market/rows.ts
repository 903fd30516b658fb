// Database rows for the market and the JSON the API returns for them (camelCase, cents, ISO UTC).
import type { Verdict } from '@/lib/wheel';
import type { FrameSpec, ProposedChange, WheelSpec } from './schema';
import type { BidStatus, RequestStatus } from './states';

export interface StoredSpec {
  wheels: WheelSpec[];
  frame: FrameSpec;
}

export interface RequestRow {
  id: string;
  rider_id: string;
  title: string;
  status: RequestStatus;
  spec: StoredSpec;
  zip: string;
  city: string;
  region: string;
  latitude: number;
  longitude: number;
  delivery: 'ship' | 'pickup';
  needed_by: Date | string;
  budget_cents: number;
  notes: string;
  fit_verdict: Verdict;
  baseline_low_cents: number;
  baseline_cents: number;
  baseline_high_cents: number;
  accepted_bid_id: string | null;
  published_at: Date | null;
  expires_at: Date | null;
  expiry_warned_at: Date | null;
  closed_at: Date | null;
  created_at: Date;
  updated_at: Date;
}

export interface StoredProposedChange extends ProposedChange {
  /** The engine's verdict on the changed wheels, when a wheel field changes. */
  verdict: Verdict | null;
  cautions: string[];
  baselineCents: number | null;
}

export interface BidRow {
  id: string;
  request_id: string;
  shop_id: string;
  author_id: string | null;
  status: BidStatus;
  parts_cents: number;
  labour_cents: number;
  finish_cents: number;
  shipping_cents: number;
  total_cents: number;
  lead_time_days: number;
  valid_until: Date;
  message: string;
  proposed_change: StoredProposedChange | null;
  revision: number;
  closed_at: Date | null;
  created_at: Date;
  updated_at: Date;
}

const iso = (d: Date | null | undefined): string | null => (d ? new Date(d).toISOString() : null);

/** pg reads a `date` as local midnight; the local parts give back the stored calendar date. */
export function dateOnly(value: Date | string): string {
  if (typeof value === 'string') return value.slice(0, 10);
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${value.getFullYear()}-${pad(value.getMonth() + 1)}-${pad(value.getDate())}`;
}

export interface RequestView {
  id: string;
  riderId: string;
  title: string;
  status: RequestStatus;
  wheels: WheelSpec[];
  frame: FrameSpec;
  zip: string;
  city: string;
  region: string;
  delivery: 'ship' | 'pickup';
  neededBy: string;
  budgetCents: number;
  notes: string;
  fitVerdict: Verdict;
  baseline: { lowCents: number; typicalCents: number; highCents: number };
  acceptedBidId: string | null;
  publishedAt: string | null;
  expiresAt: string | null;
  closedAt: string | null;
  createdAt: string;
  updatedAt: string;
}

export function toRequestView(row: RequestRow): RequestView {
  return {
    id: row.id,
    riderId: row.rider_id,
    title: row.title,
    status: row.status,
    wheels: row.spec.wheels,
    frame: row.spec.frame,
    zip: row.zip,
    city: row.city,
    region: row.region,
    delivery: row.delivery,
    neededBy: dateOnly(row.needed_by),
    budgetCents: row.budget_cents,
    notes: row.notes,
    fitVerdict: row.fit_verdict,
    baseline: { lowCents: row.baseline_low_cents, typicalCents: row.baseline_cents, highCents: row.baseline_high_cents },
    acceptedBidId: row.accepted_bid_id,
    publishedAt: iso(row.published_at),
    expiresAt: iso(row.expires_at),
    closedAt: iso(row.closed_at),
    createdAt: iso(row.created_at)!,
    updatedAt: iso(row.updated_at)!,
  };
}

export interface BidView {
  id: string;
  requestId: string;
  shopId: string;
  status: BidStatus;
  partsCents: number;
  labourCents: number;
  finishCents: number;
  shippingCents: number;
  totalCents: number;
  leadTimeDays: number;
  validUntil: string;
  message: string;
  proposedChange: StoredProposedChange | null;
  revision: number;
  createdAt: string;
  updatedAt: string;
  closedAt: string | null;
}

export function toBidView(row: BidRow): BidView {
  return {
    id: row.id,
    requestId: row.request_id,
    shopId: row.shop_id,
    status: row.status,
    partsCents: row.parts_cents,
    labourCents: row.labour_cents,
    finishCents: row.finish_cents,
    shippingCents: row.shipping_cents,
    totalCents: row.total_cents,
    leadTimeDays: row.lead_time_days,
    validUntil: iso(row.valid_until)!,
    message: row.message,
    proposedChange: row.proposed_change,
    revision: row.revision,
    createdAt: iso(row.created_at)!,
    updatedAt: iso(row.updated_at)!,
    closedAt: iso(row.closed_at),
  };
}

/** What a rider sees about the shop behind a bid. Ratings arrive with reviews; until then none. */
export interface ShopFacts {
  id: string;
  name: string;
  slug: string;
  city: string;
  region: string;
  rating: number | null;
  ratingCount: number;
  completedBuilds: number;
  distanceMiles: number;
}
