import { describe, expect, it } from 'vitest';
import { WheelInputError, computeFit, fitRequestFieldErrors, fitRequestSchema, parseFitRequest } from '@/lib/wheel';

const errorsFor = (input: unknown) => {
  const r = fitRequestSchema.safeParse(input);
  if (r.success) throw new Error('expected a failure');
  return fitRequestFieldErrors(r.error);
};

describe('fitRequestSchema', () => {
  it('fills sensible defaults: a 26-inch, 3-inch-wide rear wheel on a 3-speed coaster hub', () => {
    const v = fitRequestSchema.parse({});
    expect(v).toMatchObject({
      position: 'rear',
      nominalDiameterIn: 26,
      rimWidthMm: 80,
      spokes: 36,
      spokeGauge: 14,
      crosses: 3,
      hubId: 'rear-igh3-coaster-120',
      cog: 'standard',
      frameRearSpacingMm: 120,
      forkSpacingMm: 100,
      bbShellWidthMm: 68,
      finish: 'bare',
    });
    expect(v.erdMm).toBeUndefined();
    expect(v.spindleLengthMm).toBeUndefined();
  });

  it('picks the usual front hub for a front wheel', () => {
    expect(fitRequestSchema.parse({ position: 'front' }).hubId).toBe('front-100');
  });

  it('gives a plain message per field', () => {
    expect(errorsFor({ nominalDiameterIn: 28 }).nominalDiameterIn![0]).toMatch(/Wheel size must be one of 16, 20, 24, 26, 27.5, 29/);
    expect(errorsFor({ spokeGauge: 7 }).spokeGauge![0]).toMatch(/Spoke gauge must be at least 8/);
    expect(errorsFor({ spokeGauge: 12.5 }).spokeGauge![0]).toMatch(/whole number/);
    expect(errorsFor({ rimWidthMm: 'wide' }).rimWidthMm![0]).toMatch(/Rim width must be a number of millimetres/);
    expect(errorsFor({ rimWidthMm: Number.NaN }).rimWidthMm![0]).toMatch(/Rim width/);
    expect(errorsFor({ chainstayLengthMm: 200 }).chainstayLengthMm![0]).toMatch(/between 300 and 700 mm/);
    expect(errorsFor({ hubId: 'any-brand-hub' }).hubId![0]).toMatch(/Hub must be one of/);
  });

  it('checks the fields against each other and the catalogue', () => {
    expect(errorsFor({ position: 'front', hubId: 'rear-igh3-120' }).hubId![0]).toMatch(/rear hub; choose a front hub/);
    expect(errorsFor({ spokes: 40 }).spokes![0]).toMatch(/drilled for 36, 48, 72, 144 spokes/);
    expect(errorsFor({ hubId: 'rear-ss-135', cog: 'offset' }).cog![0]).toMatch(/No offset cog/);
    expect(errorsFor({ erdMm: 600 }).erdMm![0]).toMatch(/below the 559 mm bead seat/);
    expect(errorsFor({ rimWidthMm: 120, tireWidthMm: 50 }).tireWidthMm![0]).toMatch(/too narrow/);
  });

  it('parseFitRequest throws one WheelInputError carrying every field message', () => {
    try {
      parseFitRequest({ spokeGauge: 3, rimWidthMm: -1 });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(WheelInputError);
      const err = e as WheelInputError;
      expect(['spokeGauge', 'rimWidthMm']).toContain(err.field);
      expect(Object.keys(err.fieldErrors).sort()).toEqual(['rimWidthMm', 'spokeGauge']);
    }
  });

  it('computeFit accepts the same input the route and form send', () => {
    const r = computeFit({ position: 'rear', nominalDiameterIn: 20, spokes: 72, crosses: 4, rimWidthMm: 72, tireWidthMm: 76, chainstayLengthMm: 400 });
    expect(r.input.hubId).toBe('rear-igh3-coaster-120');
    expect(r.spokes.count).toBe(72);
  });
});
