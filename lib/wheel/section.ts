// The wheel seen in cross-section: rim and tire widths as a function of radius from the axle.

import { requireFinite } from './errors';
import { RIM_FLANGE_HEIGHT_MM, RIM_SIDEWALL_DEPTH_MM, TIRE_SECTION_HEIGHT_RATIO } from './constants';

export interface WheelSection {
  bsdMm: number;
  rimWidthMm: number;
  tireWidthMm: number;
}

export function checkSection(s: WheelSection): WheelSection {
  requireFinite('bsdMm', s.bsdMm, 100, 1000);
  requireFinite('rimWidthMm', s.rimWidthMm, 10, 200);
  requireFinite('tireWidthMm', s.tireWidthMm, 15, 200);
  return s;
}

/** A tire mounted on a rim wider than itself spreads to the rim, so its section is never narrower than the rim. */
export const tireSectionWidthMm = (s: WheelSection): number => Math.max(s.tireWidthMm, s.rimWidthMm);

export const tireSectionHeightMm = (tireWidthMm: number): number => requireFinite('tireWidthMm', tireWidthMm, 15, 200) * TIRE_SECTION_HEIGHT_RATIO;

/** Outer diameter of the inflated tire: BSD + 2 × section height (common practice, no source). */
export function tireOuterDiameterMm(s: Pick<WheelSection, 'bsdMm' | 'tireWidthMm'>): number {
  requireFinite('bsdMm', s.bsdMm, 100, 1000);
  return s.bsdMm + 2 * tireSectionHeightMm(s.tireWidthMm);
}

/** Outer diameter of the bare rim: BSD plus the flanges. */
export const rimOuterDiameterMm = (bsdMm: number): number => requireFinite('bsdMm', bsdMm, 100, 1000) + 2 * RIM_FLANGE_HEIGHT_MM;

export interface SectionWidthAt {
  halfWidthMm: number;
  part: 'tire' | 'rim' | null;
}

/**
 * Half-width of rim or tire at `radiusMm` from the axle. The tire is modelled as an ellipse spanning
 * the bead seat to the tread; the rim keeps its full width from a little below the bead seat to its flange top.
 */
export function sectionHalfWidthAt(s: WheelSection, radiusMm: number): SectionWidthAt {
  const bead = s.bsdMm / 2;
  const height = tireSectionHeightMm(s.tireWidthMm);
  const centre = bead + height / 2;
  const u = (radiusMm - centre) / (height / 2);
  const tireHalf = Math.abs(u) <= 1 ? (tireSectionWidthMm(s) / 2) * Math.sqrt(1 - u * u) : 0;
  const inRim = radiusMm >= bead - RIM_SIDEWALL_DEPTH_MM && radiusMm <= bead + RIM_FLANGE_HEIGHT_MM;
  const rimHalf = inRim ? s.rimWidthMm / 2 : 0;
  if (tireHalf === 0 && rimHalf === 0) return { halfWidthMm: 0, part: null };
  return tireHalf >= rimHalf ? { halfWidthMm: tireHalf, part: 'tire' } : { halfWidthMm: rimHalf, part: 'rim' };
}

/**
 * The wheel's outline seen from above, from the axle forward: at each distance the widest part of rim or
 * tire at that distance or beyond (the outline is symmetric about the axle).
 */
export function topViewOutline(s: WheelSection, points = 60): { yMm: number; halfWidthMm: number }[] {
  const outer = tireOuterDiameterMm(s) / 2;
  const radialSteps = 400;
  const widths: number[] = [];
  for (let i = 0; i <= radialSteps; i++) widths.push(sectionHalfWidthAt(s, (outer * i) / radialSteps).halfWidthMm);
  for (let i = radialSteps - 1; i >= 0; i--) widths[i] = Math.max(widths[i]!, widths[i + 1]!);
  const out: { yMm: number; halfWidthMm: number }[] = [];
  for (let j = 0; j <= points; j++) {
    const y = (outer * j) / points;
    out.push({ yMm: y, halfWidthMm: widths[Math.min(radialSteps, Math.round((y / outer) * radialSteps))]! });
  }
  return out;
}
