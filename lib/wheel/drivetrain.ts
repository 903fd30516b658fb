// Chainlines, the chain's run past the tire, and gearing.

import { WheelInputError, requireFinite, requireInteger } from './errors';
import {
  CHAIN_HALF_WIDTH_MM,
  CHAIN_PITCH_MM,
  IGH3_RATIOS,
  MAX_SPINDLE_OVERHANG_MM,
  MIN_CHAIN_TIRE_CLEARANCE_MM,
  RIM_SIDEWALL_DEPTH_MM,
  RING_INSET_FROM_SPINDLE_END_MM,
  RING_TO_SHELL_FACE_MIN_MM,
} from './constants';
import type { CogKind, HubKind, HubSpec } from './catalogue';
import { cogFor } from './catalogue';
import { rimOuterDiameterMm, sectionHalfWidthAt, tireOuterDiameterMm, type WheelSection } from './section';
import { MM_PER_INCH, radToDeg } from './units';

/** Pitch radius of a sprocket: r = p ÷ (2 sin(180° ÷ N)), the standard sprocket pitch-diameter formula (from memory). */
export function sprocketPitchRadiusMm(teeth: number): number {
  requireInteger('teeth', teeth, 8, 120);
  return CHAIN_PITCH_MM / (2 * Math.sin(Math.PI / teeth));
}

/**
 * Rear chainline (frame centre plane to cog middle): the hub's figure with a flat cog, moved outward by an
 * offset cog's dish. Axle spacers changed equally on both sides keep the hub centred, so OLD changes leave it be.
 */
export function rearChainlineMm(hub: HubSpec, cog: CogKind): number {
  if (hub.chainlineMm === null) throw new WheelInputError('hubId', `${hub.label} is not a rear hub`);
  if (cog === 'offset') {
    const offset = cogFor(hub, 'offset');
    if (!offset) throw new WheelInputError('cog', `No offset cog is made for the ${hub.label.toLowerCase()}`);
    return hub.chainlineMm + offset.dishMm;
  }
  return hub.chainlineMm;
}

/** Front chainline from the spindle: ring centre sits a fixed inset in from the spindle end. */
export const frontChainlineMm = (spindleLengthMm: number): number =>
  requireFinite('spindleLengthMm', spindleLengthMm, 50, 300) / 2 - RING_INSET_FROM_SPINDLE_END_MM;

export const spindleLengthForChainlineMm = (chainlineMm: number): number => 2 * (chainlineMm + RING_INSET_FROM_SPINDLE_END_MM);

/** Spindles a shell can carry: long enough for the ring to clear the stay, short enough to keep the overhang. */
export function spindleRangeForShellMm(shellWidthMm: number): { minMm: number; maxMm: number } {
  requireFinite('bbShellWidthMm', shellWidthMm, 40, 200);
  return {
    minMm: shellWidthMm + 2 * (RING_TO_SHELL_FACE_MIN_MM + RING_INSET_FROM_SPINDLE_END_MM),
    maxMm: shellWidthMm + 2 * MAX_SPINDLE_OVERHANG_MM,
  };
}

export interface ChainRun {
  rearChainlineMm: number;
  frontChainlineMm: number;
  /** Rear axle to bottom-bracket centre; the bottom-bracket drop is ignored. */
  chainstayLengthMm: number;
  cogTeeth: number;
  chainringTeeth: number;
}

/** Angle of the chain to the frame centre plane, seen from above. */
export function chainSkewDeg(run: Pick<ChainRun, 'rearChainlineMm' | 'frontChainlineMm' | 'chainstayLengthMm'>): number {
  requireFinite('chainstayLengthMm', run.chainstayLengthMm, 100, 2000);
  return radToDeg(Math.atan(Math.abs(run.frontChainlineMm - run.rearChainlineMm) / run.chainstayLengthMm));
}

export interface ChainClearance {
  /** Least lateral gap between the chain's inner plates and tire or rim along the run. */
  clearanceMm: number;
  /** Where it happens: distance forward of the axle, chain centre x, obstacle half-width. */
  atYMm: number;
  chainXMm: number;
  obstacleHalfWidthMm: number;
  part: 'tire' | 'rim';
  /** Obstacle half-width under the chain, sampled along the run (for drawing). */
  profile: { yMm: number; chainXMm: number; obstacleHalfWidthMm: number }[];
}

const RUN_SAMPLES = 800;
const PROFILE_POINTS = 40;

/** Larger parameter s where the line A + s·D is at distance r from the axle, or null if it never is. */
function lineExitAt(a: { y: number; z: number }, d: { y: number; z: number }, r: number): number | null {
  const qa = d.y * d.y + d.z * d.z;
  const qb = 2 * (a.y * d.y + a.z * d.z);
  const qc = a.y * a.y + a.z * a.z - r * r;
  const disc = qb * qb - 4 * qa * qc;
  if (qa === 0 || disc < 0) return null;
  return (-qb + Math.sqrt(disc)) / (2 * qa);
}

/**
 * Lateral clearance between chain and tire. The upper run is the outer tangent of cog and ring seen from
 * the side (the lower run mirrors it); along it the chain's sideways position moves linearly from the
 * rear chainline to the front one, and the tire's half-width is taken at each point's radius from the axle.
 * Only the stretch that passes beside the rim or tire is sampled. Null when the run never passes beside them.
 */
export function chainToTireClearance(section: WheelSection, run: ChainRun): ChainClearance | null {
  const L = requireFinite('chainstayLengthMm', run.chainstayLengthMm, 100, 2000);
  requireFinite('rearChainlineMm', run.rearChainlineMm, 0, 200);
  requireFinite('frontChainlineMm', run.frontChainlineMm, 0, 200);
  const rc = sprocketPitchRadiusMm(run.cogTeeth);
  const rr = sprocketPitchRadiusMm(run.chainringTeeth);
  const sinB = Math.max(-1, Math.min(1, (rr - rc) / L)); // outer tangent tilt
  const cosB = Math.sqrt(1 - sinB * sinB);
  const a = { y: -rc * sinB, z: rc * cosB };
  const b = { y: L - rr * sinB, z: rr * cosB };
  const d = { y: b.y - a.y, z: b.z - a.z };

  const innerR = section.bsdMm / 2 - RIM_SIDEWALL_DEPTH_MM;
  const outerR = Math.max(tireOuterDiameterMm(section), rimOuterDiameterMm(section.bsdMm)) / 2;
  const sIn = Math.hypot(a.y, a.z) >= innerR ? 0 : lineExitAt(a, d, innerR);
  const sOut = lineExitAt(a, d, outerR);
  if (sIn === null || sIn > 1) return null;
  const s0 = Math.max(0, sIn);
  const s1 = Math.min(1, sOut ?? 1);

  let best: Omit<ChainClearance, 'profile'> | null = null;
  const profile: ChainClearance['profile'] = [];
  const every = Math.max(1, Math.round(RUN_SAMPLES / PROFILE_POINTS));
  for (let i = 0; i <= RUN_SAMPLES; i++) {
    const s = s0 + ((s1 - s0) * i) / RUN_SAMPLES;
    const y = a.y + s * d.y;
    const z = a.z + s * d.z;
    const x = run.rearChainlineMm + s * (run.frontChainlineMm - run.rearChainlineMm);
    const w = sectionHalfWidthAt(section, Math.hypot(y, z));
    if (w.part === null) continue;
    if (i % every === 0) profile.push({ yMm: y, chainXMm: x, obstacleHalfWidthMm: w.halfWidthMm });
    const gap = x - CHAIN_HALF_WIDTH_MM - w.halfWidthMm;
    if (best === null || gap < best.clearanceMm) {
      best = { clearanceMm: gap, atYMm: y, chainXMm: x, obstacleHalfWidthMm: w.halfWidthMm, part: w.part };
    }
  }
  return best === null ? null : { ...best, profile };
}

/**
 * Smallest front chainline that keeps the chain `minClearanceMm` off the tire, for a given rear chainline.
 * Clearance grows with the front chainline, so bisection finds it. Null when no chainline up to 200 mm will do.
 */
export function frontChainlineNeededMm(
  section: WheelSection,
  run: Omit<ChainRun, 'frontChainlineMm'>,
  minClearanceMm: number = MIN_CHAIN_TIRE_CLEARANCE_MM,
): number | null {
  const ok = (cf: number) => (chainToTireClearance(section, { ...run, frontChainlineMm: cf })?.clearanceMm ?? Infinity) >= minClearanceMm;
  let lo = 0;
  let hi = 200;
  if (!ok(hi)) return null;
  if (ok(lo)) return lo;
  for (let i = 0; i < 24; i++) {
    const mid = (lo + hi) / 2;
    if (ok(mid)) hi = mid;
    else lo = mid;
  }
  return hi;
}

// Gearing -----------------------------------------------------------------------------------------

export interface GearInput {
  wheelDiameterMm: number;
  chainringTeeth: number;
  cogTeeth: number;
  hubRatio?: number;
}

/** Gear inches = wheel diameter (in) × ring ÷ cog × hub ratio. Source: Wikipedia "Gear inches". */
export function gearInches({ wheelDiameterMm, chainringTeeth, cogTeeth, hubRatio = 1 }: GearInput): number {
  requireFinite('wheelDiameterMm', wheelDiameterMm, 100, 1500);
  requireInteger('chainringTeeth', chainringTeeth, 8, 120);
  requireInteger('cogTeeth', cogTeeth, 8, 120);
  requireFinite('hubRatio', hubRatio, 0.1, 10);
  return (wheelDiameterMm / MM_PER_INCH) * (chainringTeeth / cogTeeth) * hubRatio;
}

/** Metres of development = gear inches × π × 0.0254. Source: Wikipedia "Gear inches". */
export const developmentM = (gearInchesValue: number): number => requireFinite('gearInches', gearInchesValue, 0) * Math.PI * 0.0254;

export interface Gear {
  label: string;
  hubRatio: number;
  gearInches: number;
  developmentM: number;
}

/** One gear for a single-speed or front-free wheel, three for a 3-speed internal-gear hub. */
export function gearTable(input: Omit<GearInput, 'hubRatio'> & { hubKind: HubKind }): Gear[] {
  const ratios = input.hubKind === 'igh3' ? IGH3_RATIOS : [{ label: 'single', ratio: 1 }];
  return ratios.map(({ label, ratio }) => {
    const gi = gearInches({ ...input, hubRatio: ratio });
    return { label, hubRatio: ratio, gearInches: gi, developmentM: developmentM(gi) };
  });
}
