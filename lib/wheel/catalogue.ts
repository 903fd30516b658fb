// Components by specification only: our own ids and plain descriptions, no makers or models.
// Dimensions are typical figures for the class (from memory unless a source is named), not any
// one product's data sheet; a builder measures the part in hand.

import { WheelInputError } from './errors';
import { BSD_BY_NOMINAL_IN, NOMINAL_DIAMETERS_IN, type NominalDiameterIn } from './standards';
import { OFFSET_COG_DISH_MM, RIM_ERD_INSET_MM } from './constants';

export type WheelPosition = 'front' | 'rear';
export type HubKind = 'igh3' | 'single-speed' | 'front';
export type CogKind = 'standard' | 'offset';
export type CogMount = 'three-lug splined' | 'threaded freewheel';

export interface HubDrilling {
  /** Total spoke holes (both flanges). */
  readonly spokes: number;
  /** Flange pitch-circle diameter for this drilling; more holes need a larger flange. */
  readonly flangePcdMm: number;
  readonly weightG: number;
}

export interface HubSpec {
  readonly id: string;
  readonly label: string;
  readonly position: WheelPosition;
  readonly kind: HubKind;
  readonly brake: 'coaster' | 'none';
  /** Over-locknut dimension as supplied. */
  readonly oldMm: number;
  /** Narrowest OLD reachable by thinner axle spacers (equal to oldMm when fixed). */
  readonly oldMinMm: number;
  /** Rear chainline with a standard cog at oldMm; null for front hubs. */
  readonly chainlineMm: number | null;
  readonly chainlineSource: string;
  readonly cogMount: CogMount | null;
  readonly offsetCogAvailable: boolean;
  /** Distance from the OLD centre plane to each flange. Left is the non-drive side. */
  readonly flangeOffsetLeftMm: number;
  readonly flangeOffsetRightMm: number;
  /** Spoke hole diameter as supplied. */
  readonly stockHoleDiameterMm: number;
  /** Drive or brake torque passes through the spokes, so radial lacing is out. */
  readonly carriesTorque: boolean;
  readonly drillings: readonly HubDrilling[];
}

const drillings = (base: readonly [number, number, number][]): HubDrilling[] =>
  base.map(([spokes, flangePcdMm, weightG]) => ({ spokes, flangePcdMm, weightG }));

// Hole counts double (36, 72, 144) in this trade; 48 is the common heavy-duty step between.
// Flange PCDs grow with hole count so neighbouring holes keep metal between them.
const REAR_DRILLINGS = drillings([
  [36, 68, 0],
  [48, 80, 60],
  [72, 100, 160],
  [144, 140, 380],
]);
const FRONT_DRILLINGS = drillings([
  [36, 45, 0],
  [48, 58, 40],
  [72, 100, 140],
  [144, 140, 340],
]);

const withBaseWeight = (list: HubDrilling[], baseG: number): HubDrilling[] => list.map((d) => ({ ...d, weightG: d.weightG + baseG }));

export const HUBS = [
  {
    id: 'rear-coaster-110',
    label: 'Single-speed coaster-brake hub, 110 mm OLD',
    position: 'rear',
    kind: 'single-speed',
    brake: 'coaster',
    oldMm: 110,
    oldMinMm: 110,
    chainlineMm: 40.5,
    chainlineSource: 'cycling handbook "Single-speed chainline": coaster-brake hubs 40.5 to 42 mm ⚠',
    cogMount: 'three-lug splined',
    offsetCogAvailable: true,
    flangeOffsetLeftMm: 27,
    flangeOffsetRightMm: 23,
    stockHoleDiameterMm: 2.6,
    carriesTorque: true,
    drillings: withBaseWeight(REAR_DRILLINGS, 950),
  },
  {
    id: 'rear-igh3-coaster-120',
    label: '3-speed internal-gear hub, 120 mm OLD (116 mm with thinner axle spacers), coaster brake',
    position: 'rear',
    kind: 'igh3',
    brake: 'coaster',
    oldMm: 120,
    oldMinMm: 116,
    chainlineMm: 42,
    chainlineSource: 'cycling handbook "Single-speed chainline": older internal-gear hubs 40.5 to 42 mm, 42 on 120 mm OLD ⚠',
    cogMount: 'three-lug splined',
    offsetCogAvailable: true,
    flangeOffsetLeftMm: 28,
    flangeOffsetRightMm: 22,
    stockHoleDiameterMm: 2.6,
    carriesTorque: true,
    drillings: withBaseWeight(REAR_DRILLINGS, 1350),
  },
  {
    id: 'rear-igh3-120',
    label: '3-speed internal-gear hub, 120 mm OLD (116 mm with thinner axle spacers), no brake (for hand brakes)',
    position: 'rear',
    kind: 'igh3',
    brake: 'none',
    oldMm: 120,
    oldMinMm: 116,
    chainlineMm: 42,
    chainlineSource: 'cycling handbook "Single-speed chainline": older internal-gear hubs 40.5 to 42 mm, 42 on 120 mm OLD ⚠',
    cogMount: 'three-lug splined',
    offsetCogAvailable: true,
    flangeOffsetLeftMm: 28,
    flangeOffsetRightMm: 22,
    stockHoleDiameterMm: 2.6,
    carriesTorque: true,
    drillings: withBaseWeight(REAR_DRILLINGS, 1100),
  },
  {
    id: 'rear-ss-135',
    label: 'Single-speed freewheel hub, 135 mm OLD',
    position: 'rear',
    kind: 'single-speed',
    brake: 'none',
    oldMm: 135,
    oldMinMm: 135,
    chainlineMm: 52,
    chainlineSource: 'cycling handbook "Single-speed chainline": single-speed mountain 47.5 or 52 mm ⚠',
    cogMount: 'threaded freewheel',
    offsetCogAvailable: false,
    flangeOffsetLeftMm: 34,
    flangeOffsetRightMm: 22,
    stockHoleDiameterMm: 2.6,
    carriesTorque: true,
    drillings: withBaseWeight(REAR_DRILLINGS, 600),
  },
  {
    id: 'rear-ss-170',
    label: 'Single-speed freewheel hub, 170 mm OLD (wide)',
    position: 'rear',
    kind: 'single-speed',
    brake: 'none',
    oldMm: 170,
    oldMinMm: 170,
    chainlineMm: 66,
    chainlineSource: 'from memory: wide (170 mm) rear ends run about 66 mm ⚠',
    cogMount: 'threaded freewheel',
    offsetCogAvailable: false,
    flangeOffsetLeftMm: 40,
    flangeOffsetRightMm: 34,
    stockHoleDiameterMm: 2.6,
    carriesTorque: true,
    drillings: withBaseWeight(REAR_DRILLINGS, 750),
  },
  {
    id: 'rear-ss-190',
    label: 'Single-speed freewheel hub, 190 mm OLD (extra wide)',
    position: 'rear',
    kind: 'single-speed',
    brake: 'none',
    oldMm: 190,
    oldMinMm: 190,
    chainlineMm: 74,
    chainlineSource: 'from memory: extra-wide (190 mm) rear ends run about 73 to 75 mm ⚠',
    cogMount: 'threaded freewheel',
    offsetCogAvailable: false,
    flangeOffsetLeftMm: 46,
    flangeOffsetRightMm: 40,
    stockHoleDiameterMm: 2.6,
    carriesTorque: true,
    drillings: withBaseWeight(REAR_DRILLINGS, 820),
  },
  {
    id: 'front-100',
    label: 'Front hub, 100 mm OLD',
    position: 'front',
    kind: 'front',
    brake: 'none',
    oldMm: 100,
    oldMinMm: 100,
    chainlineMm: null,
    chainlineSource: 'not applicable',
    cogMount: null,
    offsetCogAvailable: false,
    flangeOffsetLeftMm: 35,
    flangeOffsetRightMm: 35,
    stockHoleDiameterMm: 2.6,
    carriesTorque: false,
    drillings: withBaseWeight(FRONT_DRILLINGS, 350),
  },
  {
    id: 'front-115',
    label: 'Wide front hub, 115 mm OLD',
    position: 'front',
    kind: 'front',
    brake: 'none',
    oldMm: 115,
    oldMinMm: 115,
    chainlineMm: null,
    chainlineSource: 'not applicable',
    cogMount: null,
    offsetCogAvailable: false,
    flangeOffsetLeftMm: 42,
    flangeOffsetRightMm: 42,
    stockHoleDiameterMm: 2.6,
    carriesTorque: false,
    drillings: withBaseWeight(FRONT_DRILLINGS, 400),
  },
  {
    id: 'front-135',
    label: 'Extra-wide front hub, 135 mm OLD',
    position: 'front',
    kind: 'front',
    brake: 'none',
    oldMm: 135,
    oldMinMm: 135,
    chainlineMm: null,
    chainlineSource: 'not applicable',
    cogMount: null,
    offsetCogAvailable: false,
    flangeOffsetLeftMm: 50,
    flangeOffsetRightMm: 50,
    stockHoleDiameterMm: 2.6,
    carriesTorque: false,
    drillings: withBaseWeight(FRONT_DRILLINGS, 450),
  },
] as const satisfies readonly HubSpec[];

export type HubId = (typeof HUBS)[number]['id'];
export const HUB_IDS = HUBS.map((h) => h.id) as [HubId, ...HubId[]];
export const DEFAULT_HUB_ID: Record<WheelPosition, HubId> = { rear: 'rear-igh3-coaster-120', front: 'front-100' };

export function hubById(id: string): HubSpec {
  const hub = (HUBS as readonly HubSpec[]).find((h) => h.id === id);
  if (!hub) throw new WheelInputError('hubId', `Unknown hub "${id}"; choose one of ${HUB_IDS.join(', ')}`);
  return hub;
}

export function hubDrilling(hub: HubSpec, spokes: number): HubDrilling {
  const d = hub.drillings.find((x) => x.spokes === spokes);
  if (!d) {
    throw new WheelInputError('spokes', `The ${hub.label.toLowerCase()} comes drilled for ${hub.drillings.map((x) => x.spokes).join(', ')} spokes, not ${spokes}`);
  }
  return d;
}

export interface CogSpec {
  readonly id: string;
  readonly label: string;
  readonly kind: CogKind;
  readonly mount: CogMount;
  /** Outward move of the chainline compared with a flat cog. */
  readonly dishMm: number;
  readonly teethMin: number;
  readonly teethMax: number;
}

export const COGS = [
  { id: 'cog-splined-standard', label: 'Standard flat cog, 3-lug splined, 16 to 24 teeth', kind: 'standard', mount: 'three-lug splined', dishMm: 0, teethMin: 16, teethMax: 24 },
  { id: 'cog-splined-offset', label: 'Offset (dished) cog, 3-lug splined, 16 to 24 teeth', kind: 'offset', mount: 'three-lug splined', dishMm: OFFSET_COG_DISH_MM, teethMin: 16, teethMax: 24 },
  { id: 'freewheel-single', label: 'Single-speed threaded freewheel, 16 to 22 teeth', kind: 'standard', mount: 'threaded freewheel', dishMm: 0, teethMin: 16, teethMax: 22 },
] as const satisfies readonly CogSpec[];

/** The cog of a kind that mounts on a hub, or null when none is made for it. */
export function cogFor(hub: HubSpec, kind: CogKind): CogSpec | null {
  return (COGS as readonly CogSpec[]).find((c) => c.mount === hub.cogMount && c.kind === kind) ?? null;
}

export interface BbShellSpec {
  readonly id: string;
  readonly label: string;
  readonly widthMm: number;
}

// The shells built into cruiser, lowrider and wide-tire frames. Downhill (83 mm) shells are left out:
// they are not built into these frames (common practice, no source).
export const BB_SHELLS = [
  { id: 'bb-68', label: '68 mm threaded shell', widthMm: 68 }, // Wikipedia "Bottom bracket"
  { id: 'bb-2.75in', label: '2¾-inch shell for a one-piece crank (about 70 mm)', widthMm: 69.85 }, // 2.75 in; common practice, no source
  { id: 'bb-73', label: '73 mm threaded shell', widthMm: 73 }, // Wikipedia "Bottom bracket"
  { id: 'bb-100', label: '100 mm wide shell', widthMm: 100 }, // Wikipedia "Bottom bracket" (fat bikes) ⚠
  { id: 'bb-120', label: '120 mm wide shell (custom frames)', widthMm: 120 }, // common practice, no source ⚠
] as const satisfies readonly BbShellSpec[];

export interface SpindleSpec {
  readonly id: string;
  readonly label: string;
  readonly lengthMm: number;
}

// Lengths from memory: the usual square-taper steps, then the long ones wide shells take.
const SPINDLE_LENGTHS_MM = [103, 107, 110, 113, 118, 122, 127, 135, 140, 145, 150, 156, 160, 165, 170, 175] as const;
export const SPINDLES: readonly SpindleSpec[] = SPINDLE_LENGTHS_MM.map((lengthMm) => ({
  id: `spindle-${lengthMm}`,
  label: `Bottom-bracket spindle, ${lengthMm} mm`,
  lengthMm,
}));

export interface RimSpec {
  readonly id: string;
  readonly label: string;
  readonly nominalDiameterIn: NominalDiameterIn;
  readonly bsdMm: number;
  readonly erdMm: number;
  readonly widthMm: number;
}

/** Rim widths the trade sells for these wheels: 2, 2½, 3, 4 and 5 inch classes (about 50, 65, 80, 100, 120 mm). */
export const RIM_WIDTH_CLASSES_MM = [50, 65, 80, 100, 120] as const;

/** A single-wall steel rim described by size; ERD from the bead seat by the model's inset. */
export function rimSpec(nominalDiameterIn: NominalDiameterIn, widthMm: number): RimSpec {
  const bsdMm = BSD_BY_NOMINAL_IN[nominalDiameterIn];
  return {
    id: `rim-${nominalDiameterIn}-${widthMm}`,
    label: `${nominalDiameterIn}-inch rim, ${widthMm} mm wide, single-wall steel`,
    nominalDiameterIn,
    bsdMm,
    erdMm: bsdMm - 2 * RIM_ERD_INSET_MM,
    widthMm,
  };
}

export const RIMS: readonly RimSpec[] = NOMINAL_DIAMETERS_IN.flatMap((d) => RIM_WIDTH_CLASSES_MM.map((w) => rimSpec(d, w)));
