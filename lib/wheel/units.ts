// Lengths are millimetres inside the engine; inches appear only at the edges (forms, gear inches, parcel rules).

export const MM_PER_INCH = 25.4; // exact, by definition of the international inch (1959)
export const G_PER_LB = 453.59237; // exact, by definition of the international avoirdupois pound (1959)

export const inToMm = (inches: number): number => inches * MM_PER_INCH;
export const mmToIn = (mm: number): number => mm / MM_PER_INCH;
export const gToLb = (g: number): number => g / G_PER_LB;

/** Rounds to `digits` decimals for display-stable results (no float noise like 292.19999999). */
export const roundTo = (value: number, digits = 1): number => {
  const f = 10 ** digits;
  return Math.round(value * f) / f;
};

export const degToRad = (deg: number): number => (deg * Math.PI) / 180;
export const radToDeg = (rad: number): number => (rad * 180) / Math.PI;
