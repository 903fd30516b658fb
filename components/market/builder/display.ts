// Small display helpers for the builder pages: dates, wheels and states in plain words.
import type { BoardWheel } from '@/lib/market/board';
import type { Lacing, WheelSpec } from '@/lib/market/schema';
import type { BidStatus, RequestStatus } from '@/lib/market/states';

const DAY_MS = 86_400_000;
const dayFormat = new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', year: 'numeric', timeZone: 'UTC' });

/** "2026-03-04" or an ISO time → "Mar 4, 2026" (calendar dates are kept in UTC). */
export function formatDay(value: string): string {
  const date = /^\d{4}-\d{2}-\d{2}$/.test(value) ? new Date(`${value}T00:00:00Z`) : new Date(value);
  return Number.isNaN(date.getTime()) ? value : dayFormat.format(date);
}

export function todayIso(now = new Date()): string {
  return now.toISOString().slice(0, 10);
}

export function addDaysIso(day: string, days: number): string {
  return new Date(new Date(`${day}T00:00:00Z`).getTime() + days * DAY_MS).toISOString().slice(0, 10);
}

/** Whole days from one calendar date to another (negative when `to` is earlier). */
export function daysBetween(from: string, to: string): number {
  return Math.round((new Date(`${to}T00:00:00Z`).getTime() - new Date(`${from}T00:00:00Z`).getTime()) / DAY_MS);
}

export function lacingText(lacing: Lacing): string {
  if (lacing.kind === 'radial') return 'radial';
  if (lacing.kind === 'cross') return `${lacing.crosses} cross`;
  return `custom (${lacing.description})`;
}

export function positionText(position: WheelSpec['position']): string {
  return position === 'front' ? 'Front' : 'Rear';
}

/** One line per wheel: size, rim, spokes and gauge. */
export function wheelLine(w: Pick<BoardWheel, 'position' | 'nominalDiameterIn' | 'rimWidthMm' | 'spokes' | 'spokeGauge'>): string {
  return `${positionText(w.position)} ${w.nominalDiameterIn}″ · ${w.rimWidthMm} mm rim · ${w.spokes} spokes, ${w.spokeGauge} g`;
}

export const BID_STATUS_LABEL: Record<BidStatus, { label: string; tone: 'petrol' | 'moss' | 'neutral' | 'rust' | 'amber' }> = {
  live: { label: 'Live', tone: 'petrol' },
  accepted: { label: 'Accepted', tone: 'moss' },
  declined: { label: 'Declined', tone: 'rust' },
  withdrawn: { label: 'Withdrawn', tone: 'neutral' },
  expired: { label: 'Expired', tone: 'amber' },
};

export const REQUEST_STATUS_LABEL: Record<RequestStatus, string> = {
  draft: 'Draft',
  open: 'Open',
  awarded: 'Awarded',
  cancelled: 'Cancelled',
  expired: 'Expired',
};
