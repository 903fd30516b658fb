// Everything the fitment page shows for one wheel in one frame, from one validated request.

import { WheelInputError } from './errors';
import { CHAIN_HALF_WIDTH_MM, HEAVY_WHEEL_G, MODEL_CONSTANTS, RIM_ERD_INSET_MM } from './constants';
import { hubById, hubDrilling, type HubKind } from './catalogue';
import { estimateBaselineCost, type CostEstimate } from './cost';
import { gearTable, sprocketPitchRadiusMm, type Gear } from './drivetrain';
import { CAUTIONS, checkFitment, type FitmentResult, type Verdict } from './fitment';
import { fitRequestFieldErrors, fitRequestSchema, type FitRequest, type FitRequestInput } from './schema';
import { rimOuterDiameterMm, tireOuterDiameterMm, tireSectionHeightMm, tireSectionWidthMm, topViewOutline } from './section';
import { BSD_BY_NOMINAL_IN, swgToMm } from './standards';
import { drillingFor, lacingPattern, validateLacing, wheelSpokeLengths, type DrillingCheck, type LacedSpoke, type LacingCheck, type WheelSpokeLengths } from './spokes';
import { mmToIn } from './units';
import { shippingBox, wheelMass, wheelPackWidthMm, type ShippingBox, type WheelMass } from './weight';

export interface FitResult {
  input: FitRequest;
  verdict: Verdict;
  reasons: string[];
  changes: string[];
  cautions: string[];
  fitment: FitmentResult;
  lacing: LacingCheck;
  spokes: WheelSpokeLengths & { count: number; crosses: number; gauge: number; wireDiameterMm: number; drilling: DrillingCheck };
  cost: CostEstimate;
  mass: WheelMass;
  dimensions: {
    bsdMm: number;
    erdMm: number;
    erdMeasured: boolean;
    rimOuterDiameterMm: number;
    tireOuterDiameterMm: number;
    tireOuterDiameterIn: number;
    tireSectionWidthMm: number;
    tireSectionHeightMm: number;
  };
  shipping: ShippingBox;
  gearing: { hubKind: HubKind; chainringTeeth: number; cogTeeth: number; gears: Gear[] } | null;
  geometry: {
    lacing: {
      spokes: number;
      crosses: number;
      erdMm: number;
      flangePcdMm: number;
      flangeOffsetLeftMm: number;
      flangeOffsetRightMm: number;
      oldMm: number;
      dishMm: number;
      pattern: LacedSpoke[];
    };
    /** Top view of tire, chain and cog (rear wheels); x is sideways from the frame centre plane, y forward of the axle. */
    topView: {
      chainstayLengthMm: number;
      tireHalfWidthMm: number;
      rimHalfWidthMm: number;
      tireOuterRadiusMm: number;
      chainHalfWidthMm: number;
      cogXMm: number;
      chainringXMm: number;
      cogPitchRadiusMm: number;
      chainringPitchRadiusMm: number;
      closestYMm: number | null;
      chainXAtClosestMm: number | null;
      obstacleHalfWidthAtClosestMm: number | null;
      clearanceMm: number | null;
      clearancePart: 'tire' | 'rim' | null;
      chainProfile: { yMm: number; chainXMm: number; obstacleHalfWidthMm: number }[];
      wheelOutline: { yMm: number; halfWidthMm: number }[];
    } | null;
    /** Front view of tire between the fork blades (front wheels). */
    fork: { forkSpacingMm: number; tireHalfWidthMm: number; bladeClearanceMm: number } | null;
  };
  model: { constants: typeof MODEL_CONSTANTS; note: string };
}

/** Parses with the shared schema; throws WheelInputError naming the first bad field (all of them in fieldErrors). */
export function parseFitRequest(input: unknown): FitRequest {
  const parsed = fitRequestSchema.safeParse(input ?? {});
  if (!parsed.success) {
    const fieldErrors = fitRequestFieldErrors(parsed.error);
    const first = parsed.error.issues[0]!;
    throw new WheelInputError(first.path.join('.') || 'input', first.message, fieldErrors);
  }
  return parsed.data;
}

/** Validates the request with the shared schema, then computes fitment, spokes, lacing, cost, masses, gearing and diagram geometry. */
export function computeFit(raw: FitRequestInput): FitResult;
export function computeFit(raw: unknown): FitResult;
export function computeFit(raw: unknown): FitResult {
  const input = parseFitRequest(raw);
  const hub = hubById(input.hubId);
  const drilled = hubDrilling(hub, input.spokes);
  const bsdMm = BSD_BY_NOMINAL_IN[input.nominalDiameterIn];
  const erdMm = input.erdMm ?? bsdMm - 2 * RIM_ERD_INSET_MM;
  const section = { bsdMm, rimWidthMm: input.rimWidthMm, tireWidthMm: input.tireWidthMm };

  const drilling = drillingFor({ gauge: input.spokeGauge, stockHoleDiameterMm: hub.stockHoleDiameterMm, flangePcdMm: drilled.flangePcdMm, spokes: input.spokes });
  const lengths = wheelSpokeLengths({
    erdMm,
    pcdLeftMm: drilled.flangePcdMm,
    pcdRightMm: drilled.flangePcdMm,
    flangeOffsetLeftMm: hub.flangeOffsetLeftMm,
    flangeOffsetRightMm: hub.flangeOffsetRightMm,
    spokes: input.spokes,
    crosses: input.crosses,
    holeDiameterMm: drilling.holeDiameterMm,
  });
  const lacing = validateLacing({ spokes: input.spokes, crosses: input.crosses, flangePcdMm: drilled.flangePcdMm, erdMm, gauge: input.spokeGauge, carriesTorque: hub.carriesTorque });

  const fitment = checkFitment({
    position: input.position,
    ...section,
    hub,
    cog: input.cog,
    cogTeeth: input.cogTeeth,
    chainringTeeth: input.chainringTeeth,
    frameRearSpacingMm: input.frameRearSpacingMm,
    forkSpacingMm: input.forkSpacingMm,
    bbShellWidthMm: input.bbShellWidthMm,
    chainstayLengthMm: input.chainstayLengthMm,
    spindleLengthMm: input.spindleLengthMm ?? null,
  });

  const mass = wheelMass({ bsdMm, rimWidthMm: input.rimWidthMm, spokes: input.spokes, gauge: input.spokeGauge, leftLengthMm: lengths.leftMm, rightLengthMm: lengths.rightMm, hubG: drilled.weightG });
  const rimOd = rimOuterDiameterMm(bsdMm);
  const tireOd = tireOuterDiameterMm(section);
  const shipping = shippingBox({ wheelDiameterMm: rimOd, wheelWidthMm: wheelPackWidthMm(hub.oldMm, input.rimWidthMm), contentsG: mass.wheelG });
  const cost = estimateBaselineCost({
    nominalDiameterIn: input.nominalDiameterIn,
    rimWidthMm: input.rimWidthMm,
    spokes: input.spokes,
    spokeGauge: input.spokeGauge,
    hubId: hub.id,
    finish: input.finish,
    billableWeightLb: shipping.billableLb,
  });

  // The wheel itself: lacing, drilling, weight.
  const reasons = [...fitment.reasons];
  const changes = [...fitment.changes];
  const cautions = [...fitment.cautions];
  let verdict = fitment.verdict;
  const worsen = (to: Verdict) => {
    const rank: Record<Verdict, number> = { fits: 0, 'fits-with-changes': 1, 'does-not-fit': 2 };
    if (rank[to] > rank[verdict]) verdict = to;
  };

  reasons.push(`Lacing: ${lacing.reason}.`);
  if (!lacing.ok) {
    const canCross = lacing.maxCrosses !== null && lacing.maxCrosses >= 1;
    if (canCross && input.crosses > 0) {
      changes.push(`Lace ${lacing.maxCrosses} cross instead of ${input.crosses}`);
      worsen('fits-with-changes');
    } else if (canCross && input.crosses === 0) {
      changes.push(`Lace it crossed (up to ${lacing.maxCrosses} cross) instead of radial`);
      worsen('fits-with-changes');
    } else if (lacing.maxCrosses === 0 && lacing.radialAllowed) {
      changes.push('Lace it radial');
      worsen('fits-with-changes');
    } else {
      worsen('does-not-fit');
    }
  }
  if (drilling.needed) {
    reasons.push(`${input.spokeGauge}-gauge spokes (${drilling.wireDiameterMm} mm) are too thick for the ${drilling.stockHoleDiameterMm} mm stock flange holes: drill them to ${drilling.holeDiameterMm.toFixed(1)} mm.`);
    cautions.push(
      `Drilling the flange holes to ${drilling.holeDiameterMm.toFixed(1)} mm removes metal (${drilling.wallMm.toFixed(1)} mm left between holes); a qualified builder decides whether this flange can take it.`,
    );
  }
  if (!drilling.wallOk) {
    reasons.push(`${input.spokes} holes of ${drilling.holeDiameterMm.toFixed(1)} mm on a ${drilled.flangePcdMm} mm flange leave only ${drilling.wallMm.toFixed(1)} mm of metal between holes: use thinner spokes or a larger flange.`);
    worsen('does-not-fit');
  }
  const heavy = mass.wheelG > HEAVY_WHEEL_G || input.spokeGauge <= 10;
  if (heavy) {
    cautions.push(
      `Heavy wheel (about ${(mass.wheelG / 1000).toFixed(1)} kg without tire): more mass to stop and more load through the hub; check that the brakes and the hub are up to it.`,
    );
    if (hub.brake === 'coaster') cautions.push('The coaster brake is the only brake on this hub and heats on long descents; a heavy wheel makes that worse, so add a hand brake where the frame allows.');
    if (hub.kind === 'igh3') cautions.push('A heavy, wide wheel puts more torque through a 3-speed hub’s internals; ask the builder whether this hub is rated for it.');
  }
  if (input.position === 'front' && heavy) cautions.push('A heavy front wheel changes steering and stopping; check the fork and front brake are up to it.');

  const uniqueCautions = [CAUTIONS.estimate, ...new Set(cautions.filter((c) => c !== CAUTIONS.estimate))];

  const drive = fitment.drive;
  const ringTeeth = input.chainringTeeth;
  const topView =
    input.position === 'rear' && drive
      ? {
          chainstayLengthMm: input.chainstayLengthMm,
          tireHalfWidthMm: tireSectionWidthMm(section) / 2,
          rimHalfWidthMm: input.rimWidthMm / 2,
          tireOuterRadiusMm: tireOd / 2,
          chainHalfWidthMm: CHAIN_HALF_WIDTH_MM,
          cogXMm: drive.rearChainlineMm,
          chainringXMm: drive.frontChainlineMm,
          cogPitchRadiusMm: sprocketPitchRadiusMm(input.cogTeeth),
          chainringPitchRadiusMm: sprocketPitchRadiusMm(ringTeeth),
          closestYMm: drive.clearance?.atYMm ?? null,
          chainXAtClosestMm: drive.clearance?.chainXMm ?? null,
          obstacleHalfWidthAtClosestMm: drive.clearance?.obstacleHalfWidthMm ?? null,
          clearanceMm: drive.clearanceMm,
          clearancePart: drive.clearance?.part ?? null,
          chainProfile: drive.clearance?.profile ?? [],
          wheelOutline: topViewOutline(section),
        }
      : null;

  return {
    input,
    verdict,
    reasons,
    changes,
    cautions: uniqueCautions,
    fitment,
    lacing,
    spokes: { ...lengths, count: input.spokes, crosses: input.crosses, gauge: input.spokeGauge, wireDiameterMm: swgToMm(input.spokeGauge), drilling },
    cost,
    mass,
    dimensions: {
      bsdMm,
      erdMm,
      erdMeasured: input.erdMm !== undefined,
      rimOuterDiameterMm: rimOd,
      tireOuterDiameterMm: tireOd,
      tireOuterDiameterIn: mmToIn(tireOd),
      tireSectionWidthMm: tireSectionWidthMm(section),
      tireSectionHeightMm: tireSectionHeightMm(input.tireWidthMm),
    },
    shipping,
    gearing:
      input.position === 'rear'
        ? { hubKind: hub.kind, chainringTeeth: ringTeeth, cogTeeth: input.cogTeeth, gears: gearTable({ wheelDiameterMm: tireOd, chainringTeeth: ringTeeth, cogTeeth: input.cogTeeth, hubKind: hub.kind }) }
        : null,
    geometry: {
      lacing: {
        spokes: input.spokes,
        crosses: input.crosses,
        erdMm,
        flangePcdMm: drilled.flangePcdMm,
        flangeOffsetLeftMm: hub.flangeOffsetLeftMm,
        flangeOffsetRightMm: hub.flangeOffsetRightMm,
        oldMm: hub.oldMm,
        dishMm: lengths.dishMm,
        pattern: lacingPattern(input.spokes, input.crosses),
      },
      topView,
      fork:
        input.position === 'front' && fitment.forkBladeClearanceMm !== null
          ? { forkSpacingMm: input.forkSpacingMm, tireHalfWidthMm: tireSectionWidthMm(section) / 2, bladeClearanceMm: fitment.forkBladeClearanceMm }
          : null,
    },
    model: {
      constants: MODEL_CONSTANTS,
      note: 'A geometric estimate: each constant names its source, "from memory" or "common practice, no source". Prices are demo data.',
    },
  };
}
