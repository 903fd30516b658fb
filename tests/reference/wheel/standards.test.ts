// Checks against published standards and handbook examples; each expected value names its source.
import { describe, expect, it } from 'vitest';
import {
  DIM_DIVISOR_IN3_PER_LB,
  IGH3_RATIOS,
  STAINLESS_DENSITY_G_PER_CM3,
  bsdForNominal,
  developmentM,
  dimensionalWeightLb,
  gearInches,
  hubById,
  inToMm,
  shippingBox,
  spokeLength,
  spokeMassG,
  swgToMm,
  tireOuterDiameterMm,
} from '@/lib/wheel';

describe('ISO 5775 bead seat diameters', () => {
  it.each([
    [16, 305], // ISO 5775, via Wikipedia "European Tyre and Rim Technical Organisation"; cycling handbook "Tire Sizing"
    [20, 406], // same sources
    [24, 507], // same sources
    [26, 559], // same sources (decimal-inch 26)
    [27.5, 584], // same sources (650B)
    [29, 622], // same sources (700C)
  ])('%s inch → %s mm', (nominal, bsd) => {
    expect(bsdForNominal(nominal)).toBe(bsd);
  });

  it('knows the trade names of the two largest', () => {
    expect(bsdForNominal('650B')).toBe(584); // ISO 5775 / cycling handbook "Tire Sizing"
    expect(bsdForNominal('700C')).toBe(622); // ISO 5775 / cycling handbook "Tire Sizing"
  });
});

describe('Standard Wire Gauge (BS 3737:1964, withdrawn)', () => {
  it.each([
    [8, 4.064, 0.16], // Wikipedia "Standard wire gauge"
    [9, 3.658, 0.144], // same sources
    [10, 3.251, 0.128], // same sources
    [11, 2.946, 0.116], // same sources
    [12, 2.642, 0.104], // same sources
    [13, 2.337, 0.092], // same sources
    [14, 2.032, 0.08], // same sources
    [15, 1.829, 0.072], // same sources
  ])('SWG %s = %s mm (%s in)', (gauge, mm, inch) => {
    expect(swgToMm(gauge)).toBe(mm);
    expect(swgToMm(gauge)).toBeCloseTo(inToMm(inch), 3); // the table's inch column × 25.4
  });
});

describe('Spoke length (Wikipedia "Spoke")', () => {
  it('reproduces the worked example: d 30, r1 19.5, r2 301, r3 1.1, 36 spokes, 3 cross', () => {
    // 292.2 mm: recomputed from the article's formula and inputs (calc), per REFERENCE.md
    const length = spokeLength({ erd: 602, pcd: 39, flangeOffset: 30, spokes: 36, crosses: 3, holeDiameter: 2.2 });
    expect(length).toBeCloseTo(292.2, 1);
  });

  it('takes the same inputs under the engine’s millimetre names', () => {
    const short = spokeLength({ erd: 602, pcd: 39, flangeOffset: 30, spokes: 36, crosses: 3, holeDiameter: 2.2 });
    const long = spokeLength({ erdMm: 602, pcdMm: 39, flangeOffsetMm: 30, spokes: 36, crosses: 3, holeDiameterMm: 2.2 });
    expect(long).toBe(short);
  });

  it('radial lacing reduces to Pythagoras on the rim-to-flange gap', () => {
    // a = 0: L = √(d² + (r2 − r1)²) − r3 (calc from the same formula)
    expect(spokeLength({ erd: 602, pcd: 39, flangeOffset: 30, spokes: 36, crosses: 0, holeDiameter: 2.2 })).toBeCloseTo(Math.hypot(30, 301 - 19.5) - 1.1, 9);
  });
});

describe('Gear inches and development (Wikipedia "Gear inches")', () => {
  it('27 in wheel, 48/16 → 81 gear inches, 6.46 m', () => {
    const gi = gearInches({ wheelDiameterMm: inToMm(27), chainringTeeth: 48, cogTeeth: 16 });
    expect(gi).toBeCloseTo(81, 9); // Wikipedia "Gear inches" (calc)
    expect(developmentM(gi)).toBeCloseTo(6.46, 2); // gear inches × π × 0.0254 (calc)
  });

  it('a 3-speed hub multiplies by its ratios', () => {
    // from memory: the classic wide-ratio 3-speed is 3/4, 1, 4/3
    expect(IGH3_RATIOS.map((r) => r.ratio)).toEqual([0.75, 1, 4 / 3]);
    expect(gearInches({ wheelDiameterMm: inToMm(27), chainringTeeth: 48, cogTeeth: 16, hubRatio: 0.75 })).toBeCloseTo(60.75, 9); // 81 × 0.75 (calc)
  });
});

describe('Dimensional weight (a large US carrier’s published rule)', () => {
  it('bills L × W × H ÷ 139, inches rounded, rounded up to a whole pound', () => {
    expect(DIM_DIVISOR_IN3_PER_LB).toBe(139); // carrier rule (some tariffs 166)
    expect(dimensionalWeightLb(20, 20, 10)).toBe(29); // 4000 ÷ 139 = 28.8 → 29 (calc)
    expect(dimensionalWeightLb(20.4, 19.6, 9.5)).toBe(29); // each side rounds to 20 × 20 × 10 first (calc)
    expect(dimensionalWeightLb(20, 20, 10, 166)).toBe(25); // 4000 ÷ 166 = 24.1 → 25 (calc)
  });

  it('bills the greater of actual and dimensional weight', () => {
    const box = shippingBox({ wheelDiameterMm: 571, wheelWidthMm: 140, contentsG: 2800 });
    expect(box.lengthIn).toBe(Math.round((571 + 50) / 25.4)); // 25 mm padding a side (common practice, no source)
    expect(box.dimensionalLb).toBe(Math.ceil((box.lengthIn * box.widthIn * box.depthIn) / 139)); // carrier rule (calc)
    expect(box.billableLb).toBe(Math.max(box.actualLb, box.dimensionalLb)); // carrier rule
    expect(box.billableLb).toBe(box.dimensionalLb); // a wheel box is bulky, not heavy
  });
});

describe('Stainless spoke mass (AISI 304 material data sheet)', () => {
  it('uses 8.00 g/cm³', () => {
    expect(STAINLESS_DENSITY_G_PER_CM3).toBe(8.0); // AISI 304 material data sheet
  });

  it('a 300 mm 14-gauge spoke weighs about 7.78 g', () => {
    // π/4 × 2.032² mm² × 300 mm = 972.9 mm³ × 8.00 g/cm³ = 7.78 g (calc)
    expect(spokeMassG({ lengthMm: 300, gauge: 14 })).toBeCloseTo(7.78, 2);
  });
});

describe('Frame and drivetrain figures from the crib sheets', () => {
  it('front hub OLD is 100 mm', () => {
    expect(hubById('front-100').oldMm).toBe(100); // cycling handbook "spacing crib sheet"
  });

  it('coaster-brake and 3-speed hubs carry the published chainlines', () => {
    expect(hubById('rear-igh3-coaster-120').chainlineMm).toBe(42); // cycling handbook "Single-speed chainline": 42 on 120 mm OLD ⚠
    expect(hubById('rear-coaster-110').chainlineMm).toBeGreaterThanOrEqual(40.5); // same source: 40.5 to 42 ⚠
    expect(hubById('rear-coaster-110').chainlineMm).toBeLessThanOrEqual(42);
    expect(hubById('rear-coaster-110').oldMm).toBe(110); // cycling handbook "spacing crib sheet": coaster-brake 110
  });

  it('tire outer diameter is BSD plus twice the section', () => {
    // common practice, no source: section height taken equal to width
    expect(tireOuterDiameterMm({ bsdMm: 559, tireWidthMm: 76.2 })).toBeCloseTo(711.4, 9);
  });
});
