import { describe, expect, it } from 'vitest';
import { computeFit, nippleMassG, rimMassG, shippingBox, spokeMassG, wheelMass } from '@/lib/wheel';

describe('masses', () => {
  it('spoke mass scales with length and wire area', () => {
    expect(spokeMassG({ lengthMm: 600, gauge: 14 })).toBeCloseTo(2 * spokeMassG({ lengthMm: 300, gauge: 14 }), 9);
    expect(spokeMassG({ lengthMm: 300, gauge: 8 }) / spokeMassG({ lengthMm: 300, gauge: 14 })).toBeCloseTo((4.064 / 2.032) ** 2, 9);
    expect(nippleMassG(14)).toBe(1);
  });

  it('wheel mass is the sum of its parts', () => {
    const m = wheelMass({ bsdMm: 559, rimWidthMm: 80, spokes: 36, gauge: 14, leftLengthMm: 256, rightLengthMm: 255, hubG: 1350 });
    expect(m.wheelG).toBeCloseTo(m.spokesG + m.nipplesG + m.rimG + m.hubG, 9);
    expect(m.rimG).toBe(rimMassG({ bsdMm: 559, widthMm: 80 }));
  });

  it('a 144-spoke wheel weighs more than a 36-spoke one', () => {
    const few = computeFit({ nominalDiameterIn: 20, rimWidthMm: 72, tireWidthMm: 76, chainstayLengthMm: 400 });
    const many = computeFit({ nominalDiameterIn: 20, rimWidthMm: 72, tireWidthMm: 76, chainstayLengthMm: 400, spokes: 144, crosses: 4 });
    expect(many.mass.wheelG).toBeGreaterThan(few.mass.wheelG);
  });
});

describe('shipping box', () => {
  it('grows with the wheel and never bills less for a bigger one', () => {
    const small = shippingBox({ wheelDiameterMm: 418, wheelWidthMm: 140, contentsG: 2500 });
    const big = shippingBox({ wheelDiameterMm: 634, wheelWidthMm: 140, contentsG: 2500 });
    expect(big.billableLb).toBeGreaterThan(small.billableLb);
    expect(big.rule).toMatch(/÷ 139/);
  });

  it('counts actual weight when the wheel is dense enough', () => {
    const heavy = shippingBox({ wheelDiameterMm: 418, wheelWidthMm: 140, contentsG: 40000 });
    expect(heavy.billableLb).toBe(heavy.actualLb);
  });
});
