/**
 * Lacewright's own map palette: soft and warm, land like unbleached paper,
 * water a muted sea-glass. Exported so the design tokens can reference the same values.
 */
export const MAP_COLORS = {
  water: '#c6dad4',
  /** Land outside the US: a shade darker so the country reads first. */
  foreignLand: '#e8dfcc',
  usLand: '#f8f1e3',
  countyBorder: '#e4d3bd',
  stateBorder: '#b8927a',
  countryBorder: '#94705c',
} as const;

export type MapColorName = keyof typeof MAP_COLORS;
