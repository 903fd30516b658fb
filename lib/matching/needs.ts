// What a request's wheels ask of a shop, read once from the stored spec.
import { computeFit } from '@/lib/wheel';
import type { StoredSpec } from '@/lib/market/rows';
import { rimWidthClassIn, toFitInput } from '@/lib/market/spec';

export interface WheelNeeds {
  position: string;
  rimWidthIn: number;
  diameterIn: number;
  gauge: number;
  spokes: number;
  /** The engine says the hub's stock flange holes are too small for these spokes. */
  needsDrilling: boolean;
}

function drillingNeeded(wheel: StoredSpec['wheels'][number], frame: StoredSpec['frame']): boolean {
  try {
    return computeFit(toFitInput(wheel, frame)).spokes.drilling.needed;
  } catch {
    // A wheel the engine cannot work out was refused when the request was saved; count no drilling.
    return false;
  }
}

export function requestNeeds(spec: StoredSpec): WheelNeeds[] {
  return spec.wheels.map((w) => ({
    position: w.position,
    rimWidthIn: rimWidthClassIn(w.rimWidthMm),
    diameterIn: w.nominalDiameterIn,
    gauge: w.spokeGauge,
    spokes: w.spokes,
    needsDrilling: drillingNeeded(w, spec.frame),
  }));
}
