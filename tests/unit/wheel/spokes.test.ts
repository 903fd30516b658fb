import { describe, expect, it } from 'vitest';
import {
  SPOKE_ROUNDING_RULE,
  WheelInputError,
  drillingFor,
  lacingPattern,
  roundSpokeLengthMm,
  spokeHeadDiameterMm,
  spokeLength,
  validateLacing,
  wheelSpokeLengths,
} from '@/lib/wheel';

describe('rounding to a length that can be bought or cut', () => {
  it('takes the nearest whole millimetre, an exact half going down', () => {
    expect(roundSpokeLengthMm(255.49)).toBe(255);
    expect(roundSpokeLengthMm(255.5)).toBe(255);
    expect(roundSpokeLengthMm(255.51)).toBe(256);
    expect(SPOKE_ROUNDING_RULE).toMatch(/nearest whole mm/);
  });
});

describe('dished wheels', () => {
  const hub = { erdMm: 543, pcdLeftMm: 68, pcdRightMm: 68, spokes: 36, crosses: 3 };

  it('gives the flange farther from centre the longer spoke, and the dish is half the offset difference', () => {
    const w = wheelSpokeLengths({ ...hub, flangeOffsetLeftMm: 34, flangeOffsetRightMm: 20 });
    expect(w.leftExactMm).toBeGreaterThan(w.rightExactMm);
    expect(w.dishMm).toBe(7);
    expect(w.leftMm).toBe(roundSpokeLengthMm(w.leftExactMm));
  });

  it('uses the hole diameter it is given (a drilled flange shortens the spoke by half the extra)', () => {
    const stock = spokeLength({ erdMm: 543, pcdMm: 68, flangeOffsetMm: 28, spokes: 36, crosses: 3 });
    const drilled = spokeLength({ erdMm: 543, pcdMm: 68, flangeOffsetMm: 28, spokes: 36, crosses: 3, holeDiameterMm: 4.6 });
    expect(stock - drilled).toBeCloseTo(1, 9);
  });

  it('names the field at fault', () => {
    try {
      spokeLength({ erdMm: 543, pcdMm: 68, flangeOffsetMm: 28, spokes: 37, crosses: 3 });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(WheelInputError);
      expect((e as WheelInputError).field).toBe('spokes');
    }
    expect(() => spokeLength({ erdMm: 60, pcdMm: 68, flangeOffsetMm: 28, spokes: 36, crosses: 3 })).toThrow(/pcdMm must be between/);
  });
});

describe('lacing limits', () => {
  const small = { spokes: 36, flangePcdMm: 40, erdMm: 543, gauge: 14, carriesTorque: true };

  it('3 cross fits a small 36-hole flange, 4 cross runs over the neighbouring head', () => {
    // common practice, no source: 4 cross on small flanges covers the next head
    expect(validateLacing({ ...small, crosses: 3 }).ok).toBe(true);
    const four = validateLacing({ ...small, crosses: 4 });
    expect(four.ok).toBe(false);
    expect(four.maxCrosses).toBe(3);
    expect(four.reason).toMatch(/neighbouring head/);
  });

  it('a large flange takes 4 cross, until the spoke would leave it past tangent', () => {
    // common practice, no source: 4 cross is laced on large flanges
    expect(validateLacing({ ...small, flangePcdMm: 68, crosses: 4 }).ok).toBe(true);
    const wide = validateLacing({ ...small, flangePcdMm: 110, crosses: 4 });
    expect(wide.ok).toBe(false);
    expect(wide.reason).toMatch(/past tangent/);
  });

  it('thicker spokes (bigger heads) never allow more crosses', () => {
    for (const pcd of [45, 68, 100, 140]) {
      let last = Infinity;
      for (let g = 15; g >= 8; g--) {
        const m = validateLacing({ ...small, flangePcdMm: pcd, gauge: g, crosses: 0, carriesTorque: false }).maxCrosses ?? -1;
        expect(m).toBeLessThanOrEqual(last);
        last = m;
      }
    }
  });

  it('spoke counts that cannot pair leading and trailing spokes are refused', () => {
    expect(validateLacing({ ...small, spokes: 34, crosses: 3 }).reason).toMatch(/multiple of 4/);
  });

  it('holes too crowded for the heads are refused outright', () => {
    const r = validateLacing({ ...small, spokes: 144, flangePcdMm: 60, gauge: 8, crosses: 1 });
    expect(r.ok).toBe(false);
    expect(r.maxCrosses).toBeNull();
    expect(r.reason).toMatch(/heads are about/);
  });

  it('radial is required where no crossed pattern fits, and allowed only on hubs without torque', () => {
    // A flange almost as large as the rim: even 1 cross would leave it past tangent.
    const crowded = { spokes: 36, flangePcdMm: 190, erdMm: 200, gauge: 14, crosses: 0 };
    const free = validateLacing({ ...crowded, carriesTorque: false });
    expect(free.maxCrosses).toBe(0);
    expect(free.radialRequired).toBe(true);
    expect(free.ok).toBe(true);
    const torque = validateLacing({ ...crowded, carriesTorque: true });
    expect(torque.ok).toBe(false);
    expect(torque.reason).toMatch(/larger flange/);
  });

  it('front hubs may be laced radial', () => {
    const r = validateLacing({ spokes: 36, flangePcdMm: 45, erdMm: 543, gauge: 14, crosses: 0, carriesTorque: false });
    expect(r.ok).toBe(true);
    expect(r.radialAllowed).toBe(true);
  });
});

describe('flange drilling', () => {
  it('keeps stock holes for 14 gauge and drills for 8 gauge, reporting the metal left', () => {
    const stock = drillingFor({ gauge: 14, stockHoleDiameterMm: 2.6, flangePcdMm: 68, spokes: 36 });
    expect(stock.needed).toBe(false);
    expect(stock.holeDiameterMm).toBe(2.6);
    const heavy = drillingFor({ gauge: 8, stockHoleDiameterMm: 2.6, flangePcdMm: 68, spokes: 36 });
    expect(heavy.needed).toBe(true);
    expect(heavy.holeDiameterMm).toBeCloseTo(4.464, 9);
    expect(heavy.wallMm).toBeLessThan(stock.wallMm);
    expect(heavy.wallOk).toBe(true);
    expect(drillingFor({ gauge: 8, stockHoleDiameterMm: 2.6, flangePcdMm: 120, spokes: 144 }).wallOk).toBe(false);
  });

  it('heads grow with the wire', () => {
    expect(spokeHeadDiameterMm(8)).toBeGreaterThan(spokeHeadDiameterMm(14));
  });
});

describe('lacing pattern for drawing', () => {
  it.each([
    [36, 3],
    [72, 4],
    [144, 4],
    [36, 0],
  ])('%s spokes, %s cross: each flange uses every one of its holes once', (spokes, crosses) => {
    const pattern = lacingPattern(spokes, crosses);
    expect(pattern).toHaveLength(spokes);
    for (const side of ['left', 'right'] as const) {
      const angles = pattern.filter((p) => p.side === side).map((p) => Math.round(p.hubAngleDeg * 1000) / 1000);
      expect(new Set(angles).size).toBe(spokes / 2);
      const step = 720 / spokes;
      for (const a of angles) expect(Math.abs(a / step - Math.round(a / step)) < 1e-6 || Math.abs((a - step / 2) / step - Math.round((a - step / 2) / step)) < 1e-6).toBe(true);
    }
    const leading = pattern.filter((p) => p.direction === 'leading').length;
    expect(leading).toBe(crosses === 0 ? 0 : spokes / 2);
  });
});
