// Masses of spokes, nipples, rim and wheel; the shipping box and its billable weight.

import { requireFinite, requireInteger } from './errors';
import {
  AXLE_STUB_MM,
  BOX_PADDING_MM,
  DIM_DIVISOR_IN3_PER_LB,
  NIPPLE_14G_MASS_G,
  PACKING_MASS_G,
  RIM_MASS_BASE_G_PER_M,
  RIM_MASS_G_PER_M_PER_MM_WIDTH,
  STAINLESS_DENSITY_G_PER_CM3,
} from './constants';
import { SWG_MM, swgToMm } from './standards';
import { G_PER_LB, mmToIn } from './units';

/** Mass of a plain stainless spoke: wire volume × density (AISI 304 material data sheet, 8.00 g/cm³). Head and bend ignored. */
export function spokeMassG({ lengthMm, gauge }: { lengthMm: number; gauge: number }): number {
  requireFinite('lengthMm', lengthMm, 0, 2000);
  const d = swgToMm(gauge);
  const volumeMm3 = (Math.PI / 4) * d * d * lengthMm;
  return (volumeMm3 / 1000) * STAINLESS_DENSITY_G_PER_CM3;
}

/** Brass nipple mass, scaled from the 14-gauge figure by wire cross-section. */
export const nippleMassG = (gauge: number): number => NIPPLE_14G_MASS_G * (swgToMm(gauge) / SWG_MM[14]) ** 2;

/** Rim mass from its circumference and width (rough single-wall steel model). */
export function rimMassG({ bsdMm, widthMm }: { bsdMm: number; widthMm: number }): number {
  requireFinite('bsdMm', bsdMm, 100, 1000);
  requireFinite('rimWidthMm', widthMm, 10, 200);
  const circumferenceM = (Math.PI * bsdMm) / 1000;
  return circumferenceM * (RIM_MASS_BASE_G_PER_M + RIM_MASS_G_PER_M_PER_MM_WIDTH * widthMm);
}

export interface WheelMass {
  spokeLeftEachG: number;
  spokeRightEachG: number;
  spokesG: number;
  nipplesG: number;
  rimG: number;
  hubG: number;
  /** Built wheel, no tire, tube or cog. */
  wheelG: number;
}

export function wheelMass(args: {
  bsdMm: number;
  rimWidthMm: number;
  spokes: number;
  gauge: number;
  leftLengthMm: number;
  rightLengthMm: number;
  hubG: number;
}): WheelMass {
  const spokes = requireInteger('spokes', args.spokes, 2, 400);
  requireFinite('hubG', args.hubG, 0, 20000);
  const spokeLeftEachG = spokeMassG({ lengthMm: args.leftLengthMm, gauge: args.gauge });
  const spokeRightEachG = spokeMassG({ lengthMm: args.rightLengthMm, gauge: args.gauge });
  const spokesG = (spokes / 2) * (spokeLeftEachG + spokeRightEachG);
  const nipplesG = spokes * nippleMassG(args.gauge);
  const rimG = rimMassG({ bsdMm: args.bsdMm, widthMm: args.rimWidthMm });
  return { spokeLeftEachG, spokeRightEachG, spokesG, nipplesG, rimG, hubG: args.hubG, wheelG: spokesG + nipplesG + rimG + args.hubG };
}

export interface ShippingBox {
  lengthMm: number;
  widthMm: number;
  depthMm: number;
  /** Each side rounded to the nearest whole inch, as the carrier rule measures. */
  lengthIn: number;
  widthIn: number;
  depthIn: number;
  actualLb: number;
  dimensionalLb: number;
  billableLb: number;
  divisorIn3PerLb: number;
  rule: string;
}

/** Axle length across the locknuts and stubs; the box must take it or the rim, whichever is wider. */
export const wheelPackWidthMm = (oldMm: number, rimWidthMm: number): number => Math.max(oldMm + 2 * AXLE_STUB_MM, rimWidthMm);

/**
 * Box for a built wheel, and the weight a parcel carrier bills: the greater of actual weight and
 * L × W × H (inches, each rounded) ÷ 139, rounded up to a whole pound. Source: a large US carrier's published rule.
 */
export function shippingBox({ wheelDiameterMm, wheelWidthMm, contentsG }: { wheelDiameterMm: number; wheelWidthMm: number; contentsG: number }): ShippingBox {
  requireFinite('wheelDiameterMm', wheelDiameterMm, 50, 2000);
  requireFinite('wheelWidthMm', wheelWidthMm, 1, 1000);
  requireFinite('contentsG', contentsG, 0, 200000);
  const lengthMm = wheelDiameterMm + 2 * BOX_PADDING_MM;
  const widthMm = lengthMm;
  const depthMm = wheelWidthMm + 2 * BOX_PADDING_MM;
  const lengthIn = Math.round(mmToIn(lengthMm));
  const widthIn = Math.round(mmToIn(widthMm));
  const depthIn = Math.round(mmToIn(depthMm));
  const dimensionalLb = Math.ceil((lengthIn * widthIn * depthIn) / DIM_DIVISOR_IN3_PER_LB);
  const actualLb = Math.ceil((contentsG + PACKING_MASS_G) / G_PER_LB);
  return {
    lengthMm,
    widthMm,
    depthMm,
    lengthIn,
    widthIn,
    depthIn,
    actualLb,
    dimensionalLb,
    billableLb: Math.max(actualLb, dimensionalLb),
    divisorIn3PerLb: DIM_DIVISOR_IN3_PER_LB,
    rule: `billable = greater of actual weight and L × W × H (in) ÷ ${DIM_DIVISOR_IN3_PER_LB}, rounded up to a whole pound`,
  };
}

/** The carrier rule on its own, for any box: inches rounded, result rounded up to a whole pound. */
export function dimensionalWeightLb(lengthIn: number, widthIn: number, heightIn: number, divisor: number = DIM_DIVISOR_IN3_PER_LB): number {
  const dims = [lengthIn, widthIn, heightIn].map((v, i) => Math.round(requireFinite(['lengthIn', 'widthIn', 'heightIn'][i]!, v, 0, 1000)));
  requireFinite('divisor', divisor, 1, 10000);
  return Math.ceil((dims[0]! * dims[1]! * dims[2]!) / divisor);
}
