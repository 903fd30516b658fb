import { WheelInputError } from './errors';

/** ISO 5775 bead seat diameters for decimal-inch nominal sizes. Source: ISO 5775 via ETRTO tables (Wikipedia); cycling handbook "Tire Sizing". */
export const BSD_BY_NOMINAL_IN = {
  16: 305,
  20: 406,
  24: 507,
  26: 559,
  27.5: 584, // 650B
  29: 622, // 700C
} as const;

export type NominalDiameterIn = keyof typeof BSD_BY_NOMINAL_IN;
export const NOMINAL_DIAMETERS_IN = [16, 20, 24, 26, 27.5, 29] as const satisfies readonly NominalDiameterIn[];

const NOMINAL_ALIASES: Record<string, NominalDiameterIn> = { '650b': 27.5, '700c': 29 };

/** Bead seat diameter (mm) for a nominal wheel size in inches; also takes "650B" and "700C". */
export function bsdForNominal(inches: number | string): number {
  let nominal: number | undefined;
  if (typeof inches === 'number') nominal = inches;
  else if (typeof inches === 'string') {
    const key = inches.trim().toLowerCase();
    nominal = NOMINAL_ALIASES[key] ?? (key !== '' && Number.isFinite(Number(key)) ? Number(key) : undefined);
  }
  const bsd = nominal === undefined ? undefined : (BSD_BY_NOMINAL_IN as Record<number, number>)[nominal];
  if (bsd === undefined) {
    throw new WheelInputError(
      'nominalDiameterIn',
      `No ISO 5775 bead seat diameter for a ${String(inches)}-inch wheel; choose one of ${NOMINAL_DIAMETERS_IN.join(', ')} (fractional sizes such as 26 × 1⅜ have other BSDs)`,
    );
  }
  return bsd;
}

/** Standard Wire Gauge diameters, mm. Source: BS 3737:1964 (withdrawn), as tabulated in Wikipedia "Standard wire gauge". */
export const SWG_MM = {
  8: 4.064,
  9: 3.658,
  10: 3.251,
  11: 2.946,
  12: 2.642,
  13: 2.337,
  14: 2.032,
  15: 1.829,
} as const;

export type SpokeGauge = keyof typeof SWG_MM;
export const SPOKE_GAUGES = [8, 9, 10, 11, 12, 13, 14, 15] as const satisfies readonly SpokeGauge[];

/** Spoke wire diameter (mm) for SWG 8 to 15; a lower gauge number is a thicker spoke. */
export function swgToMm(gauge: number): number {
  const mm = Number.isInteger(gauge) ? (SWG_MM as Record<number, number>)[gauge] : undefined;
  if (mm === undefined) {
    throw new WheelInputError('spokeGauge', `Spoke gauge must be a whole SWG number from 8 (thickest) to 15 (thinnest); got ${String(gauge)}`);
  }
  return mm;
}
