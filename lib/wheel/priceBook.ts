// DEMO DATA. Every price here is invented for demonstration: not a quote, not market research.
// Shaped so that bigger rims, wider hubs, thicker spokes and more spokes never cost less.

import type { HubId } from './catalogue';
import type { NominalDiameterIn, SpokeGauge } from './standards';

export const FINISHES = ['bare', 'polished', 'painted', 'plated'] as const;
export type Finish = (typeof FINISHES)[number];

interface FinishPrice {
  baseCents: number;
  centsPerMmRimWidth: number;
  centsPerSpoke: number;
}

export interface PriceBook {
  label: string;
  currency: 'USD';
  rim: { baseCentsByNominalIn: Record<NominalDiameterIn, number>; centsPerMmWidth: number; centsPerHole: number };
  hub: { baseCentsById: Record<HubId, number>; centsPerHole: number };
  spokeCentsByGauge: Record<SpokeGauge, number>;
  nippleCentsByGauge: Record<SpokeGauge, number>;
  labour: { baseCents: number; centsPerSpoke: number; centsPerSpokePerGaugeThickerThan14: number };
  drilling: { setupCents: number; centsPerHole: number };
  finish: Record<Finish, FinishPrice>;
  shipping: { baseCents: number; centsPerBillableLb: number };
  platformFeeBps: number;
  band: { lowBps: number; highBps: number };
}

export const DEMO_PRICE_BOOK: PriceBook = {
  label: 'DEMO DATA: invented prices for demonstration only; not quotes',
  currency: 'USD',
  rim: {
    baseCentsByNominalIn: { 16: 2400, 20: 2800, 24: 3300, 26: 3800, 27.5: 4300, 29: 4800 },
    centsPerMmWidth: 55,
    centsPerHole: 12,
  },
  hub: {
    baseCentsById: {
      'rear-coaster-110': 3500,
      'rear-igh3-coaster-120': 9500,
      'rear-igh3-120': 8000,
      'rear-ss-135': 4200,
      'rear-ss-170': 6500,
      'rear-ss-190': 7600,
      'front-100': 2000,
      'front-115': 2800,
      'front-135': 3800,
    },
    centsPerHole: 20,
  },
  spokeCentsByGauge: { 15: 40, 14: 45, 13: 55, 12: 70, 11: 90, 10: 115, 9: 145, 8: 180 },
  nippleCentsByGauge: { 15: 12, 14: 12, 13: 15, 12: 20, 11: 28, 10: 38, 9: 50, 8: 65 },
  labour: { baseCents: 4500, centsPerSpoke: 75, centsPerSpokePerGaugeThickerThan14: 10 },
  drilling: { setupCents: 1500, centsPerHole: 35 },
  finish: {
    bare: { baseCents: 0, centsPerMmRimWidth: 0, centsPerSpoke: 0 },
    polished: { baseCents: 2500, centsPerMmRimWidth: 8, centsPerSpoke: 0 },
    painted: { baseCents: 3500, centsPerMmRimWidth: 10, centsPerSpoke: 0 },
    plated: { baseCents: 6000, centsPerMmRimWidth: 15, centsPerSpoke: 25 },
  },
  shipping: { baseCents: 1400, centsPerBillableLb: 95 },
  platformFeeBps: 800,
  band: { lowBps: 8500, highBps: 13000 },
};
