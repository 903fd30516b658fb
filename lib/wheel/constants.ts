// Every number the geometric model leans on, with where it comes from.
// "from memory" = recalled trade knowledge, not checked against a document;
// "common practice, no source" = a builder's rule of thumb. Treat both as adjustable.

export interface ModelConstant {
  readonly value: number;
  readonly unit: string;
  readonly meaning: string;
  readonly source: string;
}

const k = (value: number, unit: string, meaning: string, source: string): ModelConstant => ({ value, unit, meaning, source });

export const MODEL_CONSTANTS = {
  // Tire and rim section
  tireSectionHeightRatio: k(1, 'ratio', 'tire section height ÷ section width', 'common practice, no source: outer diameter ≈ BSD + 2 × tire width'),
  rimFlangeHeightMm: k(6, 'mm', 'height of the rim flange above the bead seat', 'from memory: about 5 to 7 mm'),
  rimSidewallDepthMm: k(8, 'mm', 'depth below the bead seat over which the rim keeps its full width', 'from memory: single-wall cruiser rims'),
  rimErdInsetMm: k(8, 'mm', 'bead seat to nipple seat, per side (ERD ≈ BSD − 2 × this)', 'from memory: single-wall steel cruiser rims; a measured ERD is better'),

  // Chain and cranks
  chainPitchMm: k(12.7, 'mm', 'bicycle chain pitch (½ inch)', 'from memory: ISO 606 ½-inch pitch'),
  chainHalfWidthMm: k(4.5, 'mm', 'half the outer-plate width of a 1/8-inch chain', 'from memory: about 9 mm across the outer plates'),
  minChainTireClearanceMm: k(2, 'mm', 'least gap between chain plates and tire (or rim) that counts as clear', 'common practice, no source'),
  maxChainSkewDeg: k(2, 'degrees', 'largest angle between chain and frame centre plane for a single-speed or 3-speed chain', 'from memory: beyond about 2° a 1/8-inch chain wears fast, runs loud or drops'),
  offsetCogDishMm: k(12.7, 'mm', 'how far an offset (dished) cog moves the rear chainline outward', 'from memory: about ½ inch; measure the cog in hand'),
  ringInsetFromSpindleEndMm: k(10, 'mm', 'spindle end to chainring centre (front chainline = spindle ÷ 2 − this)', 'from memory: a 107 mm spindle gives about a 43.5 mm chainline'),
  ringToShellFaceMinMm: k(8, 'mm', 'least distance from shell face to chainring centre so the ring clears the chainstay', 'common practice, no source'),
  maxSpindleOverhangMm: k(29.5, 'mm', 'longest spindle stub beyond each shell face', 'from memory: the longest common spindle for a 68 mm shell is about 127 mm, 29.5 mm beyond each face'),
  bbShellRadiusMm: k(20, 'mm', 'outer radius of the bottom-bracket shell tube', 'from memory: shells are about 40 mm across'),
  tireToShellMinMm: k(5, 'mm', 'least gap between the tire tread and the bottom-bracket shell', 'common practice, no source'),

  // Frame and fork
  forkTireMinClearanceMm: k(4, 'mm', 'least gap between tire and each fork blade (blades assumed to rise parallel from the dropouts)', 'common practice, no source'),
  maxColdSetMm: k(10, 'mm', 'largest total change of steel rear spacing by cold-setting', 'common practice, no source; a qualified frame builder decides'),
  maxAxleSpacerMm: k(6, 'mm', 'largest total of axle spacers to fill a frame wider than the hub', 'common practice, no source'),
  maxForkSpreadMm: k(5, 'mm', 'largest total change of fork spacing', 'common practice, no source; a qualified frame builder decides'),

  // Spokes and flanges
  spokeHeadToWireRatio: k(2.2, 'ratio', 'spoke head diameter ÷ wire diameter', 'from memory: a 14-gauge head is about 4.5 mm across'),
  spokeHeadClearanceMm: k(0, 'mm', 'least gap between a spoke’s centreline and the edge of the neighbouring head: it may bear on the edge but not run across the head', 'common practice, no source: 4 cross overlaps heads on small flanges, not on large ones'),
  holeClearanceMinMm: k(0.2, 'mm', 'least gap between spoke wire and flange hole before drilling is needed', 'common practice, no source'),
  drilledHoleOversizeMm: k(0.4, 'mm', 'drilled hole = wire diameter + this', 'common practice, no source: a 14-gauge spoke sits in a 2.4 to 2.6 mm hole'),
  minFlangeWallMm: k(1.5, 'mm', 'least metal left between neighbouring flange holes', 'common practice, no source'),
  stainlessDensityGPerCm3: k(8.0, 'g/cm³', 'density of AISI 304 stainless spoke wire', 'AISI 304 material data sheet (suppliers also quote 7.93)'),
  nipple14gMassG: k(1.0, 'g', 'mass of one 12 mm brass nipple for a 14-gauge spoke (scaled by wire area for others)', 'from memory'),

  // Weight and shipping
  rimMassBaseGPerM: k(200, 'g/m', 'single-wall steel rim mass per metre of circumference, before width', 'from memory, rough: a 26-inch, 80 mm steel rim is about 1.2 kg'),
  rimMassGPerMPerMmWidth: k(6, 'g/m per mm', 'added rim mass per metre of circumference per mm of width', 'from memory, rough'),
  axleStubMm: k(10, 'mm', 'axle end standing past each locknut', 'from memory'),
  heavyWheelG: k(3000, 'g', 'built wheel mass above which brakes and hub get a caution', 'common practice, no source'),
  boxPaddingMm: k(25, 'mm', 'packing added on every side of the wheel', 'common practice, no source'),
  packingMassG: k(900, 'g', 'mass of box and packing', 'common practice, no source'),
  dimDivisorIn3PerLb: k(139, 'in³/lb', 'dimensional weight divisor', "a large US carrier's published billable-weight rule (some tariffs use 166)"),
} as const satisfies Record<string, ModelConstant>;

export const TIRE_SECTION_HEIGHT_RATIO = MODEL_CONSTANTS.tireSectionHeightRatio.value;
export const RIM_FLANGE_HEIGHT_MM = MODEL_CONSTANTS.rimFlangeHeightMm.value;
export const RIM_SIDEWALL_DEPTH_MM = MODEL_CONSTANTS.rimSidewallDepthMm.value;
export const RIM_ERD_INSET_MM = MODEL_CONSTANTS.rimErdInsetMm.value;
export const CHAIN_PITCH_MM = MODEL_CONSTANTS.chainPitchMm.value;
export const CHAIN_HALF_WIDTH_MM = MODEL_CONSTANTS.chainHalfWidthMm.value;
export const MIN_CHAIN_TIRE_CLEARANCE_MM = MODEL_CONSTANTS.minChainTireClearanceMm.value;
export const MAX_CHAIN_SKEW_DEG = MODEL_CONSTANTS.maxChainSkewDeg.value;
export const OFFSET_COG_DISH_MM = MODEL_CONSTANTS.offsetCogDishMm.value;
export const RING_INSET_FROM_SPINDLE_END_MM = MODEL_CONSTANTS.ringInsetFromSpindleEndMm.value;
export const RING_TO_SHELL_FACE_MIN_MM = MODEL_CONSTANTS.ringToShellFaceMinMm.value;
export const MAX_SPINDLE_OVERHANG_MM = MODEL_CONSTANTS.maxSpindleOverhangMm.value;
export const BB_SHELL_RADIUS_MM = MODEL_CONSTANTS.bbShellRadiusMm.value;
export const TIRE_TO_SHELL_MIN_MM = MODEL_CONSTANTS.tireToShellMinMm.value;
export const FORK_TIRE_MIN_CLEARANCE_MM = MODEL_CONSTANTS.forkTireMinClearanceMm.value;
export const MAX_COLD_SET_MM = MODEL_CONSTANTS.maxColdSetMm.value;
export const MAX_AXLE_SPACER_MM = MODEL_CONSTANTS.maxAxleSpacerMm.value;
export const MAX_FORK_SPREAD_MM = MODEL_CONSTANTS.maxForkSpreadMm.value;
export const SPOKE_HEAD_TO_WIRE_RATIO = MODEL_CONSTANTS.spokeHeadToWireRatio.value;
export const SPOKE_HEAD_CLEARANCE_MM = MODEL_CONSTANTS.spokeHeadClearanceMm.value;
export const HOLE_CLEARANCE_MIN_MM = MODEL_CONSTANTS.holeClearanceMinMm.value;
export const DRILLED_HOLE_OVERSIZE_MM = MODEL_CONSTANTS.drilledHoleOversizeMm.value;
export const MIN_FLANGE_WALL_MM = MODEL_CONSTANTS.minFlangeWallMm.value;
export const STAINLESS_DENSITY_G_PER_CM3 = MODEL_CONSTANTS.stainlessDensityGPerCm3.value;
export const NIPPLE_14G_MASS_G = MODEL_CONSTANTS.nipple14gMassG.value;
export const RIM_MASS_BASE_G_PER_M = MODEL_CONSTANTS.rimMassBaseGPerM.value;
export const RIM_MASS_G_PER_M_PER_MM_WIDTH = MODEL_CONSTANTS.rimMassGPerMPerMmWidth.value;
export const AXLE_STUB_MM = MODEL_CONSTANTS.axleStubMm.value;
export const HEAVY_WHEEL_G = MODEL_CONSTANTS.heavyWheelG.value;
export const BOX_PADDING_MM = MODEL_CONSTANTS.boxPaddingMm.value;
export const PACKING_MASS_G = MODEL_CONSTANTS.packingMassG.value;
export const DIM_DIVISOR_IN3_PER_LB = MODEL_CONSTANTS.dimDivisorIn3PerLb.value;

/** Three-speed internal-gear hub ratios (output ÷ input): low, direct, high. */
export const IGH3_RATIOS = [
  { label: 'low', ratio: 3 / 4 }, // from memory: the classic wide-ratio 3-speed, 25 % down
  { label: 'direct', ratio: 1 }, // direct drive
  { label: 'high', ratio: 4 / 3 }, // from memory: 33⅓ % up
] as const;

/** Handbook range of tire width ÷ rim width; wide cruiser rims often run outside it. */
export const TIRE_TO_RIM_WIDTH_RULE = { min: 1.45, max: 2 } as const; // cycling handbook "Tire Sizing"
