// Baseline cost of a built wheel from the (demo) price book, in integer cents.

import { WheelInputError, requireFinite, requireInteger } from './errors';
import { hubById } from './catalogue';
import { DEMO_PRICE_BOOK, FINISHES, type Finish, type PriceBook } from './priceBook';
import { bsdForNominal, swgToMm, type NominalDiameterIn, type SpokeGauge } from './standards';
import { drillingNeeded } from './spokes';

export interface CostInput {
  nominalDiameterIn: number;
  rimWidthMm: number;
  spokes: number;
  spokeGauge: number;
  hubId: string;
  finish?: Finish;
  /** From the shipping box; heavier wheels bill more. */
  billableWeightLb: number;
}

export type CostLineKey = 'rim' | 'hub' | 'spokes-and-nipples' | 'labour' | 'hub-drilling' | 'finish' | 'shipping' | 'platform-fee';

export interface CostLine {
  key: CostLineKey;
  label: string;
  cents: number;
}

export interface CostEstimate {
  currency: 'USD';
  priceBookLabel: string;
  demoData: true;
  lines: CostLine[];
  /** Sum of all lines, platform fee included. */
  typicalCents: number;
  lowCents: number;
  highCents: number;
}

const cents = (value: number): number => Math.round(value);

export function estimateBaselineCost(input: CostInput, book: PriceBook = DEMO_PRICE_BOOK): CostEstimate {
  bsdForNominal(input.nominalDiameterIn);
  const nominal = input.nominalDiameterIn as NominalDiameterIn;
  const rimWidthMm = requireFinite('rimWidthMm', input.rimWidthMm, 10, 200);
  const spokes = requireInteger('spokes', input.spokes, 4, 400);
  swgToMm(input.spokeGauge);
  const gauge = input.spokeGauge as SpokeGauge;
  const hub = hubById(input.hubId);
  const finish = input.finish ?? 'bare';
  if (!FINISHES.includes(finish)) throw new WheelInputError('finish', `Finish must be one of ${FINISHES.join(', ')}`);
  const billableLb = requireFinite('billableWeightLb', input.billableWeightLb, 0, 1000);

  const drill = drillingNeeded(gauge, hub.stockHoleDiameterMm);
  const thickerSteps = Math.max(0, 14 - gauge);
  const fin = book.finish[finish];

  const lines: CostLine[] = [
    { key: 'rim', label: `Rim, ${nominal}-inch, ${rimWidthMm} mm wide, ${spokes} holes`, cents: cents(book.rim.baseCentsByNominalIn[nominal] + book.rim.centsPerMmWidth * rimWidthMm + book.rim.centsPerHole * spokes) },
    { key: 'hub', label: `${hub.label}, ${spokes} holes`, cents: cents(book.hub.baseCentsById[hub.id as keyof typeof book.hub.baseCentsById] + book.hub.centsPerHole * spokes) },
    { key: 'spokes-and-nipples', label: `${spokes} spokes and nipples, ${gauge} gauge`, cents: cents(spokes * (book.spokeCentsByGauge[gauge] + book.nippleCentsByGauge[gauge])) },
    { key: 'labour', label: `Lacing, tensioning and truing ${spokes} spokes`, cents: cents(book.labour.baseCents + spokes * (book.labour.centsPerSpoke + thickerSteps * book.labour.centsPerSpokePerGaugeThickerThan14)) },
    { key: 'hub-drilling', label: drill ? `Drilling ${spokes} flange holes for ${gauge}-gauge spokes` : 'Hub drilling (not needed)', cents: drill ? cents(book.drilling.setupCents + spokes * book.drilling.centsPerHole) : 0 },
    { key: 'finish', label: `Finish: ${finish}`, cents: cents(fin.baseCents + fin.centsPerMmRimWidth * rimWidthMm + fin.centsPerSpoke * spokes) },
    { key: 'shipping', label: `Shipping, ${billableLb} lb billable`, cents: cents(book.shipping.baseCents + book.shipping.centsPerBillableLb * billableLb) },
  ];
  const subtotal = lines.reduce((sum, l) => sum + l.cents, 0);
  const fee = cents((subtotal * book.platformFeeBps) / 10000);
  lines.push({ key: 'platform-fee', label: `Platform fee (${book.platformFeeBps / 100} %)`, cents: fee });
  const typicalCents = subtotal + fee;
  return {
    currency: book.currency,
    priceBookLabel: book.label,
    demoData: true,
    lines,
    typicalCents,
    lowCents: cents((typicalCents * book.band.lowBps) / 10000),
    highCents: cents((typicalCents * book.band.highBps) / 10000),
  };
}
