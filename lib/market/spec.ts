// Between a request's wheel spec and the wheel engine: one place that maps fields and sums a pair.
import { computeFit, WheelInputError, RIM_WIDTH_CLASSES_MM, type FitRequestInput, type Verdict } from '@/lib/wheel';
import { Invalid } from '@/lib/errors';
import type { FrameSpec, Lacing, ProposedChange, WheelSpec } from './schema';

/** The engine models a pattern described in words as 3 cross, the usual pattern for these wheels. */
const CUSTOM_LACING_CROSSES = 3;

export function crossesFor(lacing: Lacing): number {
  if (lacing.kind === 'radial') return 0;
  if (lacing.kind === 'cross') return lacing.crosses;
  return CUSTOM_LACING_CROSSES;
}

export function lacingLabel(lacing: Lacing): string {
  if (lacing.kind === 'radial') return 'radial';
  if (lacing.kind === 'cross') return `${lacing.crosses} cross`;
  return `custom: ${lacing.description}`;
}

export function toFitInput(wheel: WheelSpec, frame: FrameSpec): FitRequestInput {
  return {
    position: wheel.position,
    nominalDiameterIn: wheel.nominalDiameterIn,
    rimWidthMm: wheel.rimWidthMm,
    tireWidthMm: wheel.tireWidthMm,
    spokes: wheel.spokes,
    spokeGauge: wheel.spokeGauge,
    crosses: crossesFor(wheel.lacing),
    hubId: wheel.hubId,
    finish: wheel.finish,
    frameRearSpacingMm: frame.rearSpacingMm,
    forkSpacingMm: frame.frontSpacingMm,
    bbShellWidthMm: frame.bbShellWidthMm,
    ...(frame.chainstayLengthMm !== undefined ? { chainstayLengthMm: frame.chainstayLengthMm } : {}),
  };
}

/** Engine field → where it lives in a request (relative to the wheel unless it starts with "frame"). */
export const FIT_FIELD_TO_REQUEST_PATH: Record<string, (string | number)[]> = {
  position: ['position'],
  nominalDiameterIn: ['nominalDiameterIn'],
  rimWidthMm: ['rimWidthMm'],
  tireWidthMm: ['tireWidthMm'],
  spokes: ['spokes'],
  spokeGauge: ['spokeGauge'],
  crosses: ['lacing'],
  hubId: ['hubId'],
  finish: ['finish'],
  frameRearSpacingMm: ['frame', 'rearSpacingMm'],
  forkSpacingMm: ['frame', 'frontSpacingMm'],
  bbShellWidthMm: ['frame', 'bbShellWidthMm'],
  chainstayLengthMm: ['frame', 'chainstayLengthMm'],
};

/** Nearest rim width class in inches (50, 65, 80, 100, 120 mm are sold as 2, 2½, 3, 4, 5 inch). */
export function rimWidthClassIn(rimWidthMm: number): number {
  const inches = [2, 2.5, 3, 4, 5];
  let best = 0;
  RIM_WIDTH_CLASSES_MM.forEach((mm, i) => {
    if (Math.abs(mm - rimWidthMm) < Math.abs(RIM_WIDTH_CLASSES_MM[best] - rimWidthMm)) best = i;
  });
  return inches[best];
}

export interface WheelAssessment {
  position: WheelSpec['position'];
  verdict: Verdict;
  reasons: string[];
  changes: string[];
  cautions: string[];
  spokeLengthsMm: { left: number; right: number };
  baseline: { lowCents: number; typicalCents: number; highCents: number };
}

export interface SpecAssessment {
  verdict: Verdict;
  wheels: WheelAssessment[];
  /** The pair's baseline is the sum of both wheels. */
  baseline: { lowCents: number; typicalCents: number; highCents: number };
}

const VERDICT_RANK: Record<Verdict, number> = { fits: 0, 'fits-with-changes': 1, 'does-not-fit': 2 };

/** Runs the engine on every wheel; engine input errors become a 400 with field paths. */
export function assessSpec(wheels: WheelSpec[], frame: FrameSpec): SpecAssessment {
  const assessed = wheels.map((wheel, i): WheelAssessment => {
    try {
      const fit = computeFit(toFitInput(wheel, frame));
      return {
        position: wheel.position,
        verdict: fit.verdict,
        reasons: fit.reasons,
        changes: fit.changes,
        cautions: fit.cautions,
        spokeLengthsMm: { left: fit.spokes.leftMm, right: fit.spokes.rightMm },
        baseline: { lowCents: fit.cost.lowCents, typicalCents: fit.cost.typicalCents, highCents: fit.cost.highCents },
      };
    } catch (err) {
      if (!(err instanceof WheelInputError)) throw err;
      const fieldErrors: Record<string, string[]> = {};
      for (const [field, messages] of Object.entries(err.fieldErrors)) {
        const mapped = FIT_FIELD_TO_REQUEST_PATH[field];
        const path = mapped ? (mapped[0] === 'frame' ? mapped : ['wheels', i, ...mapped]) : ['wheels', i];
        fieldErrors[path.join('.')] = messages;
      }
      throw new Invalid('This wheel cannot be worked out as described.', fieldErrors);
    }
  });
  const verdict = assessed.reduce<Verdict>((worst, w) => (VERDICT_RANK[w.verdict] > VERDICT_RANK[worst] ? w.verdict : worst), 'fits');
  const sum = (key: keyof WheelAssessment['baseline']) => assessed.reduce((total, w) => total + w.baseline[key], 0);
  return { verdict, wheels: assessed, baseline: { lowCents: sum('lowCents'), typicalCents: sum('typicalCents'), highCents: sum('highCents') } };
}

/** Findings kept per spec: the engine is pure, so the same spec always gives the same findings. */
const assessedSpecs = new Map<string, SpecAssessment>();
const ASSESSED_SPECS_KEPT = 2_000;

/**
 * assessSpec for pages that show a stored spec on every view (the request page): the engine's work is
 * the costliest part of that page, and a spec changes far less often than it is read. The least
 * recently read specs are forgotten first. Callers must not change the result.
 */
export function assessSpecCached(wheels: WheelSpec[], frame: FrameSpec): SpecAssessment {
  const key = JSON.stringify([wheels, frame]);
  const kept = assessedSpecs.get(key);
  if (kept) {
    assessedSpecs.delete(key);
    assessedSpecs.set(key, kept);
    return kept;
  }
  const fresh = assessSpec(wheels, frame);
  assessedSpecs.set(key, fresh);
  if (assessedSpecs.size > ASSESSED_SPECS_KEPT) assessedSpecs.delete(assessedSpecs.keys().next().value!);
  return fresh;
}

/** The wheels with a builder's proposed changes laid over them. */
export function applyProposedChange(wheels: WheelSpec[], change: ProposedChange): WheelSpec[] {
  for (const c of change.wheels) {
    if (!wheels.some((w) => w.position === c.position)) {
      throw new Invalid('The proposed change names a wheel the request does not have.', {
        'proposedChange.wheels': [`This request has no ${c.position} wheel.`],
      });
    }
  }
  return wheels.map((w) => {
    const c = change.wheels.find((x) => x.position === w.position);
    if (!c) return w;
    const defined = Object.fromEntries(Object.entries(c).filter(([, v]) => v !== undefined)) as Partial<WheelSpec>;
    return { ...w, ...defined };
  });
}

/** Copies of the spec the board filters on. */
export function boardColumns(wheels: WheelSpec[]) {
  const unique = <T>(xs: T[]) => [...new Set(xs)];
  return {
    diameters_in: unique(wheels.map((w) => w.nominalDiameterIn)),
    rim_widths_in: unique(wheels.map((w) => rimWidthClassIn(w.rimWidthMm))),
    spoke_gauges: unique(wheels.map((w) => w.spokeGauge)),
    spoke_counts: unique(wheels.map((w) => w.spokes)),
  };
}
