// Formatting at the edge only: cents to dollars, millimetres to the chosen unit.
const usd = new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD' });
const usdWhole = new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD', maximumFractionDigits: 0 });

export function formatCents(cents: number, { whole = false } = {}): string {
  return (whole ? usdWhole : usd).format(cents / 100);
}

export type LengthUnit = 'mm' | 'in';
export const MM_PER_INCH = 25.4;

export function formatLength(mm: number, unit: LengthUnit, digits = 1): string {
  return unit === 'mm' ? `${Number(mm.toFixed(digits))} mm` : `${Number((mm / MM_PER_INCH).toFixed(digits + 1))} in`;
}

export function formatGrams(g: number): string {
  return g >= 1000 ? `${(g / 1000).toFixed(2)} kg (${(g / 453.59237).toFixed(1)} lb)` : `${Math.round(g)} g`;
}
