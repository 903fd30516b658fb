// Spoke length, dish, rounding, drilling and lacing limits.

import { WheelInputError, requireFinite, requireInteger } from './errors';
import {
  DRILLED_HOLE_OVERSIZE_MM,
  HOLE_CLEARANCE_MIN_MM,
  MIN_FLANGE_WALL_MM,
  SPOKE_HEAD_CLEARANCE_MM,
  SPOKE_HEAD_TO_WIRE_RATIO,
} from './constants';
import { swgToMm } from './standards';
import { radToDeg } from './units';

export const DEFAULT_HOLE_DIAMETER_MM = 2.6;

/** Spoke length inputs in the engine's own names (mm). */
export interface SpokeLengthInputMm {
  erdMm: number;
  pcdMm: number;
  flangeOffsetMm: number;
  /** Total spokes in the wheel; each flange carries half. */
  spokes: number;
  crosses: number;
  holeDiameterMm?: number;
}

/** The same inputs under the short names used by the classic formula (all mm). */
export interface SpokeLengthInputShort {
  erd: number;
  pcd: number;
  flangeOffset: number;
  spokes: number;
  crosses: number;
  holeDiameter?: number;
}

export type SpokeLengthInput = SpokeLengthInputMm | SpokeLengthInputShort;

function normaliseSpokeInput(input: SpokeLengthInput): Required<SpokeLengthInputMm> {
  const s = input as Partial<SpokeLengthInputMm & SpokeLengthInputShort>;
  return {
    erdMm: s.erdMm ?? s.erd ?? NaN,
    pcdMm: s.pcdMm ?? s.pcd ?? NaN,
    flangeOffsetMm: s.flangeOffsetMm ?? s.flangeOffset ?? NaN,
    spokes: s.spokes ?? NaN,
    crosses: s.crosses ?? NaN,
    holeDiameterMm: s.holeDiameterMm ?? s.holeDiameter ?? DEFAULT_HOLE_DIAMETER_MM,
  };
}

/**
 * Spoke length for one flange, mm.
 * L = √(d² + r₁² + r₂² − 2·r₁·r₂·cos a) − r₃, a = 360° × crosses ÷ (spokes per flange). Source: Wikipedia "Spoke".
 */
export function spokeLength(input: SpokeLengthInput): number {
  const { erdMm, pcdMm, flangeOffsetMm, spokes, crosses, holeDiameterMm } = normaliseSpokeInput(input);
  requireFinite('erdMm', erdMm, 50, 1000);
  requireFinite('pcdMm', pcdMm, 10, erdMm);
  requireFinite('flangeOffsetMm', flangeOffsetMm, 0, 200);
  requireInteger('spokes', spokes, 4, 400);
  if (spokes % 2 !== 0) throw new WheelInputError('spokes', `Spoke count must be even so both flanges carry half (got ${spokes})`);
  requireInteger('crosses', crosses, 0, spokes / 2);
  requireFinite('holeDiameterMm', holeDiameterMm, 0, 10);
  const d = flangeOffsetMm;
  const r1 = pcdMm / 2;
  const r2 = erdMm / 2;
  const r3 = holeDiameterMm / 2;
  const a = (2 * Math.PI * crosses) / (spokes / 2);
  return Math.sqrt(d * d + r1 * r1 + r2 * r2 - 2 * r1 * r2 * Math.cos(a)) - r3;
}

/**
 * Rounding to a length that can be bought or cut: the nearest whole millimetre, a half rounding down.
 * Spokes are cut and threaded in 1 mm steps and the nipple's thread takes up half a millimetre either
 * way; short beats long, which can bottom out in the nipple before the wheel is tight (common practice, no source).
 */
export const SPOKE_ROUNDING_RULE = 'nearest whole mm; an exact half rounds down, since a spoke a little short still tensions and one too long can bottom in the nipple';

export const roundSpokeLengthMm = (lengthMm: number): number => Math.ceil(requireFinite('lengthMm', lengthMm, 0) - 0.5);

export interface WheelSpokeInput {
  erdMm: number;
  /** Flange pitch-circle diameters; left is the non-drive side. */
  pcdLeftMm: number;
  pcdRightMm: number;
  /** OLD centre plane to each flange. */
  flangeOffsetLeftMm: number;
  flangeOffsetRightMm: number;
  spokes: number;
  crosses: number;
  holeDiameterMm?: number;
}

export interface WheelSpokeLengths {
  leftMm: number;
  rightMm: number;
  leftExactMm: number;
  rightExactMm: number;
  roundingRule: string;
  /**
   * How far the rim sits off the midpoint between the flanges, toward the flange closer to centre,
   * so that it stays centred between the locknuts.
   */
  dishMm: number;
}

/** Left and right spoke lengths for a wheel whose flanges sit at different distances from centre. */
export function wheelSpokeLengths(input: WheelSpokeInput): WheelSpokeLengths {
  const common = { erdMm: input.erdMm, spokes: input.spokes, crosses: input.crosses, holeDiameterMm: input.holeDiameterMm };
  const leftExactMm = spokeLength({ ...common, pcdMm: input.pcdLeftMm, flangeOffsetMm: input.flangeOffsetLeftMm });
  const rightExactMm = spokeLength({ ...common, pcdMm: input.pcdRightMm, flangeOffsetMm: input.flangeOffsetRightMm });
  return {
    leftMm: roundSpokeLengthMm(leftExactMm),
    rightMm: roundSpokeLengthMm(rightExactMm),
    leftExactMm,
    rightExactMm,
    roundingRule: SPOKE_ROUNDING_RULE,
    dishMm: Math.abs(input.flangeOffsetLeftMm - input.flangeOffsetRightMm) / 2,
  };
}

// Flange holes and drilling -------------------------------------------------------------------------

export const spokeHeadDiameterMm = (gauge: number): number => swgToMm(gauge) * SPOKE_HEAD_TO_WIRE_RATIO;

export interface DrillingCheck {
  needed: boolean;
  wireDiameterMm: number;
  stockHoleDiameterMm: number;
  /** The hole the spoke will sit in: stock, or drilled out to wire + oversize. */
  holeDiameterMm: number;
  /** Metal left between neighbouring holes after any drilling. */
  wallMm: number;
  wallOk: boolean;
}

/** Whether stock flange holes are too tight for this gauge's wire. */
export const drillingNeeded = (gauge: number, stockHoleDiameterMm: number): boolean => swgToMm(gauge) + HOLE_CLEARANCE_MIN_MM > stockHoleDiameterMm;

/** Whether a flange's stock holes take this gauge, and what drilling leaves between holes. */
export function drillingFor(args: { gauge: number; stockHoleDiameterMm: number; flangePcdMm: number; spokes: number }): DrillingCheck {
  const wire = swgToMm(args.gauge);
  requireFinite('stockHoleDiameterMm', args.stockHoleDiameterMm, 0.5, 10);
  requireFinite('flangePcdMm', args.flangePcdMm, 10, 500);
  requireInteger('spokes', args.spokes, 4, 400);
  const needed = drillingNeeded(args.gauge, args.stockHoleDiameterMm);
  const hole = needed ? wire + DRILLED_HOLE_OVERSIZE_MM : args.stockHoleDiameterMm;
  const perFlange = args.spokes / 2;
  const chord = args.flangePcdMm * Math.sin(Math.PI / perFlange);
  const wallMm = chord - hole;
  return { needed, wireDiameterMm: wire, stockHoleDiameterMm: args.stockHoleDiameterMm, holeDiameterMm: hole, wallMm, wallOk: wallMm >= MIN_FLANGE_WALL_MM };
}

// Lacing --------------------------------------------------------------------------------------------

export interface LacingInput {
  spokes: number;
  crosses: number;
  flangePcdMm: number;
  erdMm: number;
  gauge: number;
  /** Drive or brake torque goes through the spokes: radial lacing cannot carry it. */
  carriesTorque: boolean;
}

export interface LacingCheck {
  ok: boolean;
  reason: string;
  /** Most crosses this spoke count and flange allow (0 = radial only); null when the holes themselves do not fit. */
  maxCrosses: number | null;
  radialAllowed: boolean;
  radialRequired: boolean;
  /** Gap between a spoke and the neighbouring spoke head at the requested crosses (mm). */
  headGapMm: number | null;
  spokesPerFlange: number;
  holeSpacingMm: number;
}

/**
 * Gap between the centreline of a spoke leaving hole P and the edge of the head in the next hole along,
 * which sits on the face the spoke runs across (heads alternate in and out). Plane geometry in the wheel
 * plane; the spoke's lift off the flange face is ignored, which errs on the safe side.
 * Returns -Infinity when the spoke would wrap around the flange (past tangent).
 */
function headGapMm(flangePcdMm: number, erdMm: number, spokesPerFlange: number, crosses: number, gauge: number): number {
  const r1 = flangePcdMm / 2;
  const r2 = erdMm / 2;
  const a = (2 * Math.PI * crosses) / spokesPerFlange;
  if (Math.cos(a) <= r1 / r2) return -Infinity; // at or past tangent: the spoke would wrap the flange
  const step = (2 * Math.PI) / spokesPerFlange;
  const p = { x: r1, y: 0 };
  const q = { x: r2 * Math.cos(a), y: r2 * Math.sin(a) };
  const n = { x: r1 * Math.cos(step), y: r1 * Math.sin(step) };
  const dx = q.x - p.x;
  const dy = q.y - p.y;
  const distance = Math.abs(dx * (n.y - p.y) - dy * (n.x - p.x)) / Math.hypot(dx, dy);
  return distance - spokeHeadDiameterMm(gauge) / 2;
}

/** Whether a cross count laces on this flange: hole spacing, head interference, tangent limit, and torque. */
export function validateLacing(input: LacingInput): LacingCheck {
  const spokes = requireInteger('spokes', input.spokes, 4, 400);
  const crosses = requireInteger('crosses', input.crosses, 0, 50);
  const pcd = requireFinite('flangePcdMm', input.flangePcdMm, 10, 500);
  const erd = requireFinite('erdMm', input.erdMm, 50, 1000);
  if (pcd >= erd) throw new WheelInputError('flangePcdMm', `Flange PCD (${pcd} mm) must be smaller than the ERD (${erd} mm)`);
  const gauge = input.gauge;
  swgToMm(gauge);

  const perFlange = spokes / 2;
  const holeSpacingMm = pcd * Math.sin(Math.PI / perFlange);
  const base = { spokesPerFlange: perFlange, holeSpacingMm };

  if (spokes % 4 !== 0) {
    const even = spokes % 2 === 0;
    return {
      ...base,
      ok: false,
      reason: even
        ? `${spokes} spokes leave an odd number per flange (${perFlange}); crossed lacing pairs leading and trailing spokes, so use a multiple of 4`
        : `${spokes} spokes cannot be shared equally between two flanges`,
      maxCrosses: null,
      radialAllowed: false,
      radialRequired: false,
      headGapMm: null,
    };
  }

  // Heads alternate in and out, so heads on one face are two holes apart.
  const sameFaceSpacing = pcd * Math.sin((2 * Math.PI) / perFlange);
  const headDiameter = spokeHeadDiameterMm(gauge);
  if (sameFaceSpacing < headDiameter) {
    return {
      ...base,
      ok: false,
      reason: `${perFlange} holes per flange on a ${pcd} mm flange leave ${sameFaceSpacing.toFixed(1)} mm between heads on one face; ${gauge}-gauge heads are about ${headDiameter.toFixed(1)} mm across`,
      maxCrosses: null,
      radialAllowed: false,
      radialRequired: false,
      headGapMm: null,
    };
  }

  let maxCrosses = 0;
  for (let k = 1; k <= perFlange / 2; k++) {
    if (headGapMm(pcd, erd, perFlange, k, gauge) >= SPOKE_HEAD_CLEARANCE_MM) maxCrosses = k;
    else break;
  }
  const radialAllowed = !input.carriesTorque;
  const radialRequired = maxCrosses === 0;
  const gap = headGapMm(pcd, erd, perFlange, crosses, gauge);
  const headGap = Number.isFinite(gap) ? gap : null;
  const exitDeg = radToDeg((2 * Math.PI * crosses) / perFlange);

  if (radialRequired && !radialAllowed) {
    return {
      ...base,
      ok: false,
      reason: `No crossed pattern fits ${perFlange} holes per flange on a ${pcd} mm flange, and this hub carries drive or brake torque, which radial spokes cannot; a larger flange is needed`,
      maxCrosses,
      radialAllowed,
      radialRequired,
      headGapMm: headGap,
    };
  }
  if (crosses === 0) {
    return radialAllowed
      ? { ...base, ok: true, reason: radialRequired ? 'Radial: the only pattern this flange allows' : 'Radial lacing fits this hub', maxCrosses, radialAllowed, radialRequired, headGapMm: headGap }
      : {
          ...base,
          ok: false,
          reason: `Radial spokes cannot carry this hub's drive or brake torque; lace it crossed (up to ${maxCrosses} cross)`,
          maxCrosses,
          radialAllowed,
          radialRequired,
          headGapMm: headGap,
        };
  }
  if (crosses > maxCrosses) {
    const why = headGap === null ? 'the spoke would wrap around the flange past tangent' : `each spoke would run over the neighbouring head (gap ${headGap.toFixed(1)} mm)`;
    return {
      ...base,
      ok: false,
      reason: `${crosses} cross is too many for ${spokes} spokes on a ${pcd} mm flange: ${why}; ${radialRequired ? 'only radial fits' : `${maxCrosses} cross is the most`}`,
      maxCrosses,
      radialAllowed,
      radialRequired,
      headGapMm: headGap,
    };
  }
  return {
    ...base,
    ok: true,
    reason: `${crosses} cross fits: spokes leave the flange ${exitDeg.toFixed(0)}° round from their rim hole and clear the neighbouring heads by ${(headGap ?? 0).toFixed(1)} mm (up to ${maxCrosses} cross fits)`,
    maxCrosses,
    radialAllowed,
    radialRequired,
    headGapMm: headGap,
  };
}

export interface LacedSpoke {
  side: 'left' | 'right';
  /** Angle of the flange hole and of the rim hole, degrees round the wheel. */
  hubAngleDeg: number;
  rimAngleDeg: number;
  /** Leading spokes point forward of the hub hole, trailing ones back. */
  direction: 'leading' | 'trailing' | 'radial';
}

/** Every spoke's hub and rim angles for drawing a lacing pattern. Rim holes alternate left and right. */
export function lacingPattern(spokes: number, crosses: number): LacedSpoke[] {
  requireInteger('spokes', spokes, 4, 400);
  if (spokes % 4 !== 0) throw new WheelInputError('spokes', `A laced pattern needs a multiple of 4 spokes (got ${spokes})`);
  requireInteger('crosses', crosses, 0, spokes / 2);
  const perFlange = spokes / 2;
  const holeStep = 360 / spokes;
  const out: LacedSpoke[] = [];
  for (let i = 0; i < spokes; i++) {
    const side = i % 2 === 0 ? 'left' : 'right';
    const indexOnFlange = Math.floor(i / 2);
    const direction = crosses === 0 ? 'radial' : indexOnFlange % 2 === 0 ? 'leading' : 'trailing';
    const rimAngleDeg = i * holeStep;
    const sweep = (360 * crosses) / perFlange;
    const hubAngleDeg = direction === 'leading' ? rimAngleDeg - sweep : direction === 'trailing' ? rimAngleDeg + sweep : rimAngleDeg;
    out.push({ side, hubAngleDeg: ((hubAngleDeg % 360) + 360) % 360, rimAngleDeg, direction });
  }
  return out;
}
