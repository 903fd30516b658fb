// Does this wheel fit this frame? Decided from geometry: tire section, chain run, chainlines, shell and fork.

import { WheelInputError, requireFinite, requireInteger } from './errors';
import {
  BB_SHELL_RADIUS_MM,
  FORK_TIRE_MIN_CLEARANCE_MM,
  MAX_AXLE_SPACER_MM,
  MAX_CHAIN_SKEW_DEG,
  MAX_COLD_SET_MM,
  MAX_FORK_SPREAD_MM,
  MIN_CHAIN_TIRE_CLEARANCE_MM,
  TIRE_TO_RIM_WIDTH_RULE,
  TIRE_TO_SHELL_MIN_MM,
} from './constants';
import { BB_SHELLS, HUBS, SPINDLES, cogFor, type CogKind, type HubKind, type HubSpec, type WheelPosition } from './catalogue';
import {
  chainSkewDeg,
  chainToTireClearance,
  frontChainlineMm,
  frontChainlineNeededMm,
  rearChainlineMm,
  spindleRangeForShellMm,
  type ChainClearance,
} from './drivetrain';
import { checkSection, tireOuterDiameterMm, tireSectionWidthMm, type WheelSection } from './section';

export type Verdict = 'fits' | 'fits-with-changes' | 'does-not-fit';

export const CAUTIONS = {
  estimate: 'These results are estimates from a geometric model; a qualified wheel builder confirms every measurement before building.',
  frameUnseen: 'The model does not see your frame’s stays, seat tube or fork crown: check the tire clears them too.',
  frameChange: 'Changing frame or fork spacing (cold-setting) is work for a qualified frame builder under local practice; never cold-set an aluminium or carbon frame.',
  offsetCogTorque: 'Some builders report that an offset cog on some 3-speed hubs under 4-inch wheels can damage the hub internals through torque; ask your builder about this hub and cog pairing.',
  customFrame: 'Frames with shells of 100 mm and wider are mostly custom-built.',
  tireRimRule: (ratio: number) =>
    `Tire width is ${ratio.toFixed(2)} × rim width, outside the handbook range of ${TIRE_TO_RIM_WIDTH_RULE.min} to ${TIRE_TO_RIM_WIDTH_RULE.max}; wide cruiser rims often are, so check the tire maker’s fitting chart.`,
} as const;

export interface FitmentInput {
  position: WheelPosition;
  bsdMm: number;
  rimWidthMm: number;
  tireWidthMm: number;
  hub: HubSpec;
  cog: CogKind;
  cogTeeth: number;
  chainringTeeth: number;
  frameRearSpacingMm: number;
  forkSpacingMm: number;
  bbShellWidthMm: number;
  chainstayLengthMm: number;
  /** Leave out to let the engine pick the spindle the shell and wheel call for. */
  spindleLengthMm?: number | null;
}

export interface DriveSetup {
  hubId: string;
  hubLabel: string;
  cog: CogKind;
  rearChainlineMm: number;
  bbShellWidthMm: number;
  spindleLengthMm: number;
  frontChainlineMm: number;
  skewDeg: number;
  clearanceMm: number | null;
  clearance: ChainClearance | null;
  /** Clearance and skew both within limits. */
  ok: boolean;
}

export interface FitmentNeeds {
  /** Plain hub class, e.g. "3-speed internal-gear hub". */
  hubClass: string;
  hubKind: HubKind | null;
  hubId: string | null;
  hubLabel: string | null;
  oldMm: number | null;
  /** Range of OLD the hub can be set to with axle spacers. */
  oldRangeMm: [number, number] | null;
  cog: CogKind | null;
  bbShellWidthMm: number | null;
  spindleLengthMm: number | null;
  frontChainlineMm: number | null;
  /** Front hub (and fork) width this tire takes. */
  frontHubOldMm: number | null;
  /** Shortest chainstay that keeps the tire off the bottom-bracket shell. */
  chainstayMinMm: number | null;
}

export interface FitmentResult {
  verdict: Verdict;
  position: WheelPosition;
  needs: FitmentNeeds;
  /** The drivetrain as it would be set up in this frame (rear wheels). */
  drive: DriveSetup | null;
  chainToTireClearanceMm: number | null;
  /** Gap between tire and each fork blade at the fork spacing used (front wheels). */
  forkBladeClearanceMm: number | null;
  /** Things to change for the wheel to fit, in plain words. */
  changes: string[];
  reasons: string[];
  cautions: string[];
}

export function hubClassLabel(hub: HubSpec): string {
  if (hub.kind === 'igh3') return hub.brake === 'coaster' ? '3-speed internal-gear hub with coaster brake' : '3-speed internal-gear hub';
  if (hub.kind === 'single-speed') return hub.brake === 'coaster' ? 'single-speed coaster-brake hub' : 'single-speed freewheel hub';
  return 'front hub';
}

const fmt = (mm: number, digits = 1): string => `${Number(mm.toFixed(digits))} mm`;

function checkInput(input: FitmentInput): void {
  if (input.position !== 'front' && input.position !== 'rear') throw new WheelInputError('position', 'Wheel position must be "front" or "rear"');
  checkSection(input);
  if (input.hub.position !== input.position) {
    throw new WheelInputError('hubId', `The ${input.hub.label.toLowerCase()} is a ${input.hub.position} hub; choose a ${input.position} hub`);
  }
  requireFinite('frameRearSpacingMm', input.frameRearSpacingMm, 80, 250);
  requireFinite('forkSpacingMm', input.forkSpacingMm, 70, 200);
  requireFinite('bbShellWidthMm', input.bbShellWidthMm, 40, 200);
  requireFinite('chainstayLengthMm', input.chainstayLengthMm, 250, 1000);
  requireInteger('cogTeeth', input.cogTeeth, 8, 60);
  requireInteger('chainringTeeth', input.chainringTeeth, 12, 80);
  if (input.spindleLengthMm != null) requireFinite('spindleLengthMm', input.spindleLengthMm, 80, 250);
}

/** Chain clearance and skew for one hub, cog, shell and spindle. */
export function evaluateDrive(
  section: WheelSection,
  args: { hub: HubSpec; cog: CogKind; bbShellWidthMm: number; spindleLengthMm: number; chainstayLengthMm: number; cogTeeth: number; chainringTeeth: number },
): DriveSetup {
  const rear = rearChainlineMm(args.hub, args.cog);
  const front = frontChainlineMm(args.spindleLengthMm);
  const run = { rearChainlineMm: rear, frontChainlineMm: front, chainstayLengthMm: args.chainstayLengthMm, cogTeeth: args.cogTeeth, chainringTeeth: args.chainringTeeth };
  const clearance = chainToTireClearance(section, run);
  const skewDeg = chainSkewDeg(run);
  const clearanceMm = clearance?.clearanceMm ?? null;
  return {
    hubId: args.hub.id,
    hubLabel: args.hub.label,
    cog: args.cog,
    rearChainlineMm: rear,
    bbShellWidthMm: args.bbShellWidthMm,
    spindleLengthMm: args.spindleLengthMm,
    frontChainlineMm: front,
    skewDeg,
    clearanceMm,
    clearance,
    ok: (clearanceMm === null || clearanceMm >= MIN_CHAIN_TIRE_CLEARANCE_MM) && skewDeg <= MAX_CHAIN_SKEW_DEG,
  };
}

/** Catalogue spindles a shell can carry; if none, the ends of its range in whole millimetres. */
function spindlesForShell(shellWidthMm: number): number[] {
  const { minMm, maxMm } = spindleRangeForShellMm(shellWidthMm);
  const list = SPINDLES.map((s) => s.lengthMm).filter((l) => l >= minMm && l <= maxMm);
  return list.length > 0 ? list : [Math.ceil(minMm), Math.floor(maxMm)].filter((l, i, a) => a.indexOf(l) === i);
}

/**
 * The best spindle for a frame's shell: among setups within both limits, the straightest chain (then the
 * most clearance); failing that, the most clearance among straight-enough chains; failing that, the straightest.
 */
function bestDriveForShell(section: WheelSection, base: Omit<Parameters<typeof evaluateDrive>[1], 'spindleLengthMm'>): DriveSetup {
  const setups = spindlesForShell(base.bbShellWidthMm).map((spindleLengthMm) => evaluateDrive(section, { ...base, spindleLengthMm }));
  const gap = (s: DriveSetup) => s.clearanceMm ?? Infinity;
  const ok = setups.filter((s) => s.ok);
  if (ok.length > 0) return ok.reduce((a, b) => (b.skewDeg < a.skewDeg - 1e-9 || (Math.abs(b.skewDeg - a.skewDeg) <= 1e-9 && gap(b) > gap(a)) ? b : a));
  const straight = setups.filter((s) => s.skewDeg <= MAX_CHAIN_SKEW_DEG);
  if (straight.length > 0) return straight.reduce((a, b) => (gap(b) > gap(a) ? b : a));
  return setups.reduce((a, b) => (b.skewDeg < a.skewDeg ? b : a));
}

/** Rear hubs to try, the rider's own first, each with a flat cog and then an offset one where made. */
function rearCandidates(hub: HubSpec): { hub: HubSpec; cog: CogKind }[] {
  const hubs = [hub, ...(HUBS as readonly HubSpec[]).filter((h) => h.position === 'rear' && h.id !== hub.id)];
  return hubs.flatMap((h) => (['standard', 'offset'] as const).filter((c) => c === 'standard' || cogFor(h, c) !== null).map((cog) => ({ hub: h, cog })));
}

/**
 * The setup an ideal frame would have for this wheel and hub: the front chainline that lets the chain run
 * straight, or angle outward only as far as clearance needs, then the narrowest shell whose spindles reach it.
 */
function idealDrive(section: WheelSection, hub: HubSpec, cog: CogKind, chainstayLengthMm: number, cogTeeth: number, chainringTeeth: number): DriveSetup | null {
  const rear = rearChainlineMm(hub, cog);
  const needed = frontChainlineNeededMm(section, { rearChainlineMm: rear, chainstayLengthMm, cogTeeth, chainringTeeth });
  if (needed === null) return null;
  const target = Math.max(rear, needed);
  if (chainSkewDeg({ rearChainlineMm: rear, frontChainlineMm: target, chainstayLengthMm }) > MAX_CHAIN_SKEW_DEG) return null;
  const shells = [...BB_SHELLS].sort((a, b) => a.widthMm - b.widthMm);
  for (const shell of shells) {
    const reach = spindlesForShell(shell.widthMm).filter((l) => frontChainlineMm(l) >= target - 1e-9);
    for (const spindleLengthMm of reach) {
      const setup = evaluateDrive(section, { hub, cog, bbShellWidthMm: shell.widthMm, spindleLengthMm, chainstayLengthMm, cogTeeth, chainringTeeth });
      if (setup.ok) return setup;
    }
  }
  return null;
}

/** Smallest catalogue front hub whose OLD leaves fork-blade clearance for this tire. */
export function frontHubOldNeededMm(section: WheelSection): number | null {
  const needMm = tireSectionWidthMm(section) + 2 * FORK_TIRE_MIN_CLEARANCE_MM;
  const olds = (HUBS as readonly HubSpec[]).filter((h) => h.position === 'front').map((h) => h.oldMm).sort((a, b) => a - b);
  return olds.find((o) => o >= needMm) ?? null;
}

/** Spacing change needed to fit `hub` into `spacingMm`: none, spacers, a cold-set, or too far. */
function spacingChange(hub: HubSpec, spacingMm: number, maxCloseMm: number, maxOpenMm: number): { kind: 'none' | 'spacers' | 'respace' | 'too-far'; usedOldMm: number; deltaMm: number } {
  if (spacingMm >= hub.oldMinMm - 0.5 && spacingMm <= hub.oldMm + 0.5) return { kind: 'none', usedOldMm: Math.min(Math.max(spacingMm, hub.oldMinMm), hub.oldMm), deltaMm: 0 };
  if (spacingMm > hub.oldMm) {
    const delta = spacingMm - hub.oldMm;
    return { kind: delta <= maxCloseMm ? 'spacers' : 'too-far', usedOldMm: hub.oldMm, deltaMm: delta };
  }
  const delta = hub.oldMinMm - spacingMm;
  return { kind: delta <= maxOpenMm ? 'respace' : 'too-far', usedOldMm: hub.oldMinMm, deltaMm: delta };
}

export function checkFitment(input: FitmentInput): FitmentResult {
  checkInput(input);
  const section: WheelSection = { bsdMm: input.bsdMm, rimWidthMm: input.rimWidthMm, tireWidthMm: input.tireWidthMm };
  const reasons: string[] = [];
  const changes: string[] = [];
  const cautions: string[] = [CAUTIONS.estimate];
  let blocked = false;

  const ratio = input.tireWidthMm / input.rimWidthMm;
  if (ratio < TIRE_TO_RIM_WIDTH_RULE.min || ratio > TIRE_TO_RIM_WIDTH_RULE.max) cautions.push(CAUTIONS.tireRimRule(ratio));

  const frontHubOldMm = frontHubOldNeededMm(section);
  const sectionWidth = tireSectionWidthMm(section);

  if (input.position === 'front') {
    const hub = input.hub;
    const needs: FitmentNeeds = {
      hubClass: 'front hub',
      hubKind: 'front',
      hubId: frontHubOldMm === null ? null : ((HUBS as readonly HubSpec[]).find((h) => h.position === 'front' && h.oldMm === frontHubOldMm)?.id ?? null),
      hubLabel: null,
      oldMm: frontHubOldMm,
      oldRangeMm: frontHubOldMm === null ? null : [frontHubOldMm, frontHubOldMm],
      cog: null,
      bbShellWidthMm: null,
      spindleLengthMm: null,
      frontChainlineMm: null,
      frontHubOldMm,
      chainstayMinMm: null,
    };
    needs.hubLabel = needs.hubId === null ? null : (HUBS as readonly HubSpec[]).find((h) => h.id === needs.hubId)!.label;

    const bladeGap = (spacing: number) => (spacing - sectionWidth) / 2;
    if (frontHubOldMm === null) {
      blocked = true;
      reasons.push(`A tire section ${fmt(sectionWidth, 0)} wide needs more than the widest front hub in the catalogue.`);
    } else {
      reasons.push(`A tire section ${fmt(sectionWidth, 0)} wide takes a ${frontHubOldMm} mm front hub and fork (at least ${FORK_TIRE_MIN_CLEARANCE_MM} mm to each blade); 100 mm is standard and fits most forks.`);
    }

    // The fork's own spacing decides blade clearance (blades assumed to rise parallel from the dropouts).
    let spacingUsed = input.forkSpacingMm;
    const forkGap = bladeGap(input.forkSpacingMm);
    if (forkGap < FORK_TIRE_MIN_CLEARANCE_MM) {
      blocked = true;
      const where = forkGap < 0 ? `would overlap each blade of the ${fmt(input.forkSpacingMm, 0)} fork by ${fmt(-forkGap)}` : `would pass only ${fmt(forkGap)} from each blade of the ${fmt(input.forkSpacingMm, 0)} fork`;
      reasons.push(`The tire ${where} (needs ${FORK_TIRE_MIN_CLEARANCE_MM} mm): this wheel needs a ${frontHubOldMm ?? 'wider'} mm fork and hub.`);
    } else {
      const space = spacingChange(hub, input.forkSpacingMm, MAX_FORK_SPREAD_MM, MAX_FORK_SPREAD_MM);
      const matching = (HUBS as readonly HubSpec[]).find((h) => h.position === 'front' && spacingChange(h, input.forkSpacingMm, 0, 0).kind === 'none');
      if (space.kind === 'none') {
        reasons.push(`The tire clears each fork blade by ${fmt(forkGap)}.`);
      } else if (matching) {
        changes.push(`Use the ${matching.label.toLowerCase()} to match the ${input.forkSpacingMm} mm fork`);
        reasons.push(`The ${hub.oldMm} mm hub does not match the ${input.forkSpacingMm} mm fork; with a ${matching.oldMm} mm hub the tire clears each blade by ${fmt(forkGap)}.`);
      } else if (space.kind !== 'too-far' && bladeGap(space.usedOldMm) >= FORK_TIRE_MIN_CLEARANCE_MM) {
        spacingUsed = space.usedOldMm;
        changes.push(`Respace the fork from ${input.forkSpacingMm} mm to ${space.usedOldMm} mm`);
        cautions.push(CAUTIONS.frameChange);
        reasons.push(`Respaced to ${space.usedOldMm} mm the fork leaves ${fmt(bladeGap(space.usedOldMm))} to each blade.`);
      } else {
        blocked = true;
        reasons.push(`The ${hub.oldMm} mm hub does not fit the ${input.forkSpacingMm} mm fork.`);
      }
    }
    const gap = bladeGap(spacingUsed);
    cautions.push(CAUTIONS.frameUnseen);
    const verdict: Verdict = blocked ? 'does-not-fit' : changes.length > 0 ? 'fits-with-changes' : 'fits';
    return { verdict, position: 'front', needs, drive: null, chainToTireClearanceMm: null, forkBladeClearanceMm: gap, changes, reasons, cautions };
  }

  // Rear wheel ------------------------------------------------------------------------------------
  const hub = input.hub;
  const teeth = { cogTeeth: input.cogTeeth, chainringTeeth: input.chainringTeeth };
  const outerRadius = tireOuterDiameterMm(section) / 2;
  const chainstayMinMm = outerRadius + BB_SHELL_RADIUS_MM + TIRE_TO_SHELL_MIN_MM;
  const stayForIdeal = Math.max(input.chainstayLengthMm, chainstayMinMm);

  // What the wheel calls for in a frame built around it.
  let ideal: DriveSetup | null = null;
  let idealHub: HubSpec | null = null;
  for (const c of rearCandidates(hub)) {
    ideal = idealDrive(section, c.hub, c.cog, stayForIdeal, teeth.cogTeeth, teeth.chainringTeeth);
    if (ideal) {
      idealHub = c.hub;
      break;
    }
  }
  const needs: FitmentNeeds = {
    hubClass: idealHub ? hubClassLabel(idealHub) : 'none in the catalogue',
    hubKind: idealHub?.kind ?? null,
    hubId: idealHub?.id ?? null,
    hubLabel: idealHub?.label ?? null,
    oldMm: idealHub?.oldMm ?? null,
    oldRangeMm: idealHub ? [idealHub.oldMinMm, idealHub.oldMm] : null,
    cog: ideal?.cog ?? null,
    bbShellWidthMm: ideal?.bbShellWidthMm ?? null,
    spindleLengthMm: ideal?.spindleLengthMm ?? null,
    frontChainlineMm: ideal?.frontChainlineMm ?? null,
    frontHubOldMm,
    chainstayMinMm,
  };
  if (ideal && idealHub) {
    reasons.push(
      `This wheel calls for a ${hubClassLabel(idealHub)} of ${idealHub.oldMinMm === idealHub.oldMm ? `${idealHub.oldMm}` : `${idealHub.oldMinMm} to ${idealHub.oldMm}`} mm OLD with ${ideal.cog === 'offset' ? 'an offset' : 'a standard'} cog, a ${fmt(ideal.bbShellWidthMm)} bottom-bracket shell and a ${ideal.spindleLengthMm} mm spindle.`,
    );
    if (ideal.bbShellWidthMm >= 100) cautions.push(CAUTIONS.customFrame);
  } else {
    reasons.push('No hub, cog and shell in the catalogue keep the chain off this tire with a straight enough chainline.');
  }

  // This frame.
  if (input.chainstayLengthMm < chainstayMinMm) {
    blocked = true;
    reasons.push(`The ${fmt(input.chainstayLengthMm, 0)} chainstay is too short: the tire (outer radius ${fmt(outerRadius, 0)}) would hit the bottom-bracket shell; it needs at least ${fmt(chainstayMinMm, 0)}.`);
  }
  const space = spacingChange(hub, input.frameRearSpacingMm, MAX_AXLE_SPACER_MM, MAX_COLD_SET_MM);
  if (space.kind === 'too-far') {
    blocked = true;
    reasons.push(`The ${hub.oldMinMm === hub.oldMm ? hub.oldMm : `${hub.oldMinMm} to ${hub.oldMm}`} mm hub does not fit a ${input.frameRearSpacingMm} mm rear end without more change than is sensible.`);
  } else if (space.kind === 'spacers') {
    changes.push(`Add ${fmt(space.deltaMm)} of axle spacers, split evenly, to fill the ${input.frameRearSpacingMm} mm rear end`);
  } else if (space.kind === 'respace') {
    changes.push(`Cold-set the rear end from ${input.frameRearSpacingMm} mm to ${space.usedOldMm} mm`);
    cautions.push(CAUTIONS.frameChange);
  } else if (input.frameRearSpacingMm < hub.oldMm - 0.5) {
    reasons.push(`Set the hub to ${input.frameRearSpacingMm} mm OLD with thinner axle spacers.`);
  }

  const base = { hub, cog: input.cog, bbShellWidthMm: input.bbShellWidthMm, chainstayLengthMm: input.chainstayLengthMm, ...teeth };
  const givenSpindle = input.spindleLengthMm ?? null;
  let drive = givenSpindle !== null ? evaluateDrive(section, { ...base, spindleLengthMm: givenSpindle }) : bestDriveForShell(section, base);
  const range = spindleRangeForShellMm(input.bbShellWidthMm);
  if (givenSpindle !== null && (givenSpindle < range.minMm || givenSpindle > range.maxMm)) {
    drive = { ...drive, ok: false };
    reasons.push(`A ${givenSpindle} mm spindle does not suit a ${fmt(input.bbShellWidthMm)} shell (${Math.ceil(range.minMm)} to ${Math.floor(range.maxMm)} mm keeps the ring clear of the stay without overhanging the bearings).`);
  }

  if (!drive.ok) {
    // Try the changes a builder would: another spindle, then an offset cog.
    const tries: { setup: DriveSetup; change: string[] }[] = [];
    const other = bestDriveForShell(section, base);
    if (other.ok) tries.push({ setup: other, change: [`Change the spindle to ${other.spindleLengthMm} mm`] });
    if (input.cog === 'standard' && cogFor(hub, 'offset')) {
      const offset = bestDriveForShell(section, { ...base, cog: 'offset' });
      if (offset.ok) {
        const change = ['Fit an offset (dished) cog to move the chainline outward'];
        if (givenSpindle !== null && givenSpindle !== offset.spindleLengthMm) change.push(`Change the spindle to ${offset.spindleLengthMm} mm`);
        tries.push({ setup: offset, change });
      }
    }
    explainDrive(drive, reasons);
    if (tries.length > 0) {
      drive = tries[0]!.setup;
      changes.push(...tries[0]!.change);
    } else {
      blocked = true;
      if (ideal && ideal.bbShellWidthMm > input.bbShellWidthMm + 0.5) {
        reasons.push(`This wheel calls for a ${fmt(ideal.bbShellWidthMm)} shell; the frame has ${fmt(input.bbShellWidthMm)}, so it takes a different frame.`);
      }
      const alternative = rearCandidates(hub)
        .filter((c) => c.hub.id !== hub.id && spacingChange(c.hub, input.frameRearSpacingMm, MAX_AXLE_SPACER_MM, MAX_COLD_SET_MM).kind !== 'too-far')
        .find((c) => bestDriveForShell(section, { ...base, hub: c.hub, cog: c.cog }).ok);
      if (alternative) reasons.push(`A ${alternative.hub.label.toLowerCase()} with ${alternative.cog === 'offset' ? 'an offset' : 'a standard'} cog would suit this frame.`);
    }
  }
  if (drive.ok) explainDrive(drive, reasons);

  if (drive.cog === 'offset' && hub.kind === 'igh3') cautions.push(CAUTIONS.offsetCogTorque);
  else if (needs.cog === 'offset' && idealHub?.kind === 'igh3') cautions.push(CAUTIONS.offsetCogTorque);
  cautions.push(CAUTIONS.frameUnseen);

  const verdict: Verdict = blocked ? 'does-not-fit' : changes.length > 0 ? 'fits-with-changes' : 'fits';
  return {
    verdict,
    position: 'rear',
    needs,
    drive,
    chainToTireClearanceMm: drive.clearanceMm,
    forkBladeClearanceMm: null,
    changes,
    reasons,
    cautions: [...new Set(cautions)],
  };
}

function explainDrive(d: DriveSetup, reasons: string[]): void {
  const line = `With ${d.cog === 'offset' ? 'an offset' : 'a standard'} cog the rear chainline is ${fmt(d.rearChainlineMm)}; a ${d.spindleLengthMm} mm spindle puts the front at ${fmt(d.frontChainlineMm)}`;
  if (d.clearanceMm !== null && d.clearanceMm < MIN_CHAIN_TIRE_CLEARANCE_MM) {
    reasons.push(
      `${line}, and the chain ${d.clearanceMm < 0 ? `would rub the ${d.clearance?.part ?? 'tire'} (${fmt(-d.clearanceMm)} overlap)` : `passes only ${fmt(d.clearanceMm)} from the ${d.clearance?.part ?? 'tire'} (needs ${MIN_CHAIN_TIRE_CLEARANCE_MM} mm)`}.`,
    );
  } else if (d.skewDeg > MAX_CHAIN_SKEW_DEG) {
    reasons.push(`${line}: the chain runs ${d.skewDeg.toFixed(1)}° off line (more than ${MAX_CHAIN_SKEW_DEG}°), so it would wear fast or drop.`);
  } else {
    reasons.push(`${line}: the chain clears the ${d.clearance?.part ?? 'tire'} by ${fmt(d.clearanceMm ?? 0)} and runs ${d.skewDeg.toFixed(1)}° off line.`);
  }
}
