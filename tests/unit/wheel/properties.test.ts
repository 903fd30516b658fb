// Properties that must hold for every input, checked with generated cases.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  FINISHES,
  HUBS,
  HUB_IDS,
  NOMINAL_DIAMETERS_IN,
  WheelInputError,
  bsdForNominal,
  computeFit,
  estimateBaselineCost,
  fitRequestSchema,
  hubById,
  spokeLength,
  swgToMm,
  wheelSpokeLengths,
  type CostInput,
  type FitRequestInput,
} from '@/lib/wheel';
import { nonFiniteNumbers } from './finite';

const SLOW = 120_000;

const costInput = fc.record({
  nominalDiameterIn: fc.constantFrom(...NOMINAL_DIAMETERS_IN),
  rimWidthMm: fc.double({ min: 19, max: 150, noNaN: true }),
  spokes: fc.integer({ min: 4, max: 144 }),
  spokeGauge: fc.integer({ min: 8, max: 15 }),
  hubId: fc.constantFrom(...HUB_IDS),
  finish: fc.constantFrom(...FINISHES),
  billableWeightLb: fc.integer({ min: 0, max: 80 }),
});

const band = (c: CostInput) => {
  const e = estimateBaselineCost(c);
  return [e.lowCents, e.typicalCents, e.highCents];
};
const notLower = (a: number[], b: number[]) => b.every((v, i) => v >= a[i]!);

describe('baseline cost never falls as the wheel grows', () => {
  it('more spokes', () => {
    fc.assert(
      fc.property(costInput, fc.integer({ min: 0, max: 140 }), (c, more) => {
        const bigger = { ...c, spokes: Math.min(400, c.spokes + more) };
        expect(notLower(band(c), band(bigger))).toBe(true);
      }),
    );
  });

  it('thicker spokes (lower gauge number)', () => {
    fc.assert(
      fc.property(costInput, fc.integer({ min: 0, max: 7 }), (c, steps) => {
        const thicker = { ...c, spokeGauge: Math.max(8, c.spokeGauge - steps) };
        expect(notLower(band(c), band(thicker))).toBe(true);
      }),
    );
  });

  it('wider rims', () => {
    fc.assert(
      fc.property(costInput, fc.double({ min: 0, max: 100, noNaN: true }), (c, more) => {
        const wider = { ...c, rimWidthMm: Math.min(150, c.rimWidthMm + more) };
        expect(notLower(band(c), band(wider))).toBe(true);
      }),
    );
  });

  it('is whole cents, with low ≤ typical ≤ high, and the lines add up', () => {
    fc.assert(
      fc.property(costInput, (c) => {
        const e = estimateBaselineCost(c);
        for (const v of [e.lowCents, e.typicalCents, e.highCents, ...e.lines.map((l) => l.cents)]) expect(Number.isInteger(v)).toBe(true);
        expect(e.lowCents).toBeLessThanOrEqual(e.typicalCents);
        expect(e.typicalCents).toBeLessThanOrEqual(e.highCents);
        expect(e.lines.reduce((s, l) => s + l.cents, 0)).toBe(e.typicalCents);
      }),
    );
  });
});

// Valid fit requests: hub matches position, spoke count is one the hub is drilled for, offset only where made.
const validRequest: fc.Arbitrary<FitRequestInput> = fc
  .record({
    position: fc.constantFrom('front' as const, 'rear' as const),
    hubPick: fc.nat(),
    spokePick: fc.nat(),
    nominalDiameterIn: fc.constantFrom(...NOMINAL_DIAMETERS_IN),
    rimWidthMm: fc.double({ min: 19, max: 150, noNaN: true }),
    tireOverRim: fc.double({ min: 0.6, max: 3, noNaN: true }),
    erdInset: fc.option(fc.double({ min: 0.5, max: 79, noNaN: true }), { nil: undefined }),
    spokeGauge: fc.integer({ min: 8, max: 15 }),
    crosses: fc.integer({ min: 0, max: 12 }),
    offset: fc.boolean(),
    chainringTeeth: fc.integer({ min: 20, max: 60 }),
    cogTeeth: fc.integer({ min: 12, max: 30 }),
    frameRearSpacingMm: fc.double({ min: 100, max: 200, noNaN: true }),
    forkSpacingMm: fc.double({ min: 90, max: 150, noNaN: true }),
    bbShellWidthMm: fc.double({ min: 60, max: 130, noNaN: true }),
    spindleLengthMm: fc.option(fc.double({ min: 90, max: 200, noNaN: true }), { nil: undefined }),
    chainstayLengthMm: fc.double({ min: 300, max: 700, noNaN: true }),
    finish: fc.constantFrom(...FINISHES),
  })
  .map((g) => {
    const hubs = HUBS.filter((h) => h.position === g.position);
    const hub = hubs[g.hubPick % hubs.length]!;
    const spokes = hub.drillings[g.spokePick % hub.drillings.length]!.spokes;
    const bsd = bsdForNominal(g.nominalDiameterIn);
    return {
      position: g.position,
      hubId: hub.id,
      spokes,
      nominalDiameterIn: g.nominalDiameterIn,
      rimWidthMm: g.rimWidthMm,
      tireWidthMm: Math.min(160, Math.max(20, g.rimWidthMm * g.tireOverRim)),
      erdMm: g.erdInset === undefined ? undefined : Math.max(200, bsd - g.erdInset),
      spokeGauge: g.spokeGauge,
      crosses: g.crosses,
      cog: g.offset && hub.offsetCogAvailable ? ('offset' as const) : ('standard' as const),
      chainringTeeth: g.chainringTeeth,
      cogTeeth: g.cogTeeth,
      frameRearSpacingMm: g.frameRearSpacingMm,
      forkSpacingMm: g.forkSpacingMm,
      bbShellWidthMm: g.bbShellWidthMm,
      spindleLengthMm: g.spindleLengthMm,
      chainstayLengthMm: g.chainstayLengthMm,
      finish: g.finish,
    };
  })
  .filter((r) => fitRequestSchema.safeParse(r).success);

describe('computeFit', () => {
  it(
    'never returns NaN or an infinite number for any valid request',
    () => {
      fc.assert(
        fc.property(validRequest, (req) => {
          const result = computeFit(req);
          expect(nonFiniteNumbers(result)).toEqual([]);
          expect(['fits', 'fits-with-changes', 'does-not-fit']).toContain(result.verdict);
          expect(result.reasons.length).toBeGreaterThan(0);
          expect(JSON.parse(JSON.stringify(result)).verdict).toBe(result.verdict);
        }),
        { numRuns: 150 },
      );
    },
    SLOW,
  );

  it(
    'cost does not fall with thicker spokes, wider rims, or a hub drilled for more spokes',
    () => {
      fc.assert(
        fc.property(validRequest, fc.integer({ min: 0, max: 7 }), fc.double({ min: 0, max: 40, noNaN: true }), (req, steps, wider) => {
          const cost = (r: FitRequestInput) => computeFit(r).cost.typicalCents;
          const base = cost(req);
          expect(cost({ ...req, spokeGauge: Math.max(8, req.spokeGauge! - steps) })).toBeGreaterThanOrEqual(base);
          const rimWidthMm = Math.min(150, req.rimWidthMm! + wider);
          const widerReq = { ...req, rimWidthMm, tireWidthMm: Math.max(req.tireWidthMm!, rimWidthMm * 0.6) };
          expect(cost(widerReq)).toBeGreaterThanOrEqual(base);
          const more = hubById(req.hubId!).drillings.map((d) => d.spokes).filter((n) => n > req.spokes!);
          if (more.length > 0) expect(cost({ ...req, spokes: more[0] })).toBeGreaterThanOrEqual(base);
        }),
        { numRuns: 40 },
      );
    },
    SLOW,
  );

  it('turns anything that is not a valid request into a WheelInputError naming a field', () => {
    fc.assert(
      fc.property(
        fc.record({
          spokes: fc.oneof(fc.constant(Number.NaN), fc.constant(Infinity), fc.integer({ min: -50, max: 11 }), fc.string()),
          rimWidthMm: fc.anything(),
        }),
        (bad) => {
          let thrown: unknown;
          try {
            computeFit(bad);
          } catch (e) {
            thrown = e;
          }
          expect(thrown).toBeInstanceOf(WheelInputError);
          expect((thrown as WheelInputError).field).not.toBe('');
          expect((thrown as WheelInputError).message.length).toBeGreaterThan(10);
        },
      ),
    );
  });
});

const spokeGeometry = fc
  .record({
    pcdMm: fc.double({ min: 30, max: 150, noNaN: true }),
    flangeOffsetMm: fc.double({ min: 0, max: 80, noNaN: true }),
    spokesPerQuarter: fc.integer({ min: 3, max: 36 }),
    crossPick: fc.nat(),
    holeDiameterMm: fc.double({ min: 1.8, max: 5, noNaN: true }),
    erdMm: fc.double({ min: 200, max: 640, noNaN: true }),
    erdMoreMm: fc.double({ min: 0.01, max: 100, noNaN: true }),
  })
  .map((g) => {
    const spokes = g.spokesPerQuarter * 4;
    return { ...g, spokes, crosses: g.crossPick % (g.spokesPerQuarter + 1) };
  });

describe('spoke length', () => {
  it('grows with ERD', () => {
    fc.assert(
      fc.property(spokeGeometry, (g) => {
        const short = spokeLength({ ...g, erdMm: g.erdMm });
        const long = spokeLength({ ...g, erdMm: g.erdMm + g.erdMoreMm });
        expect(long).toBeGreaterThan(short);
      }),
    );
  });

  it('is the same left and right on a symmetric hub, with no dish', () => {
    fc.assert(
      fc.property(spokeGeometry, (g) => {
        const w = wheelSpokeLengths({
          erdMm: g.erdMm,
          pcdLeftMm: g.pcdMm,
          pcdRightMm: g.pcdMm,
          flangeOffsetLeftMm: g.flangeOffsetMm,
          flangeOffsetRightMm: g.flangeOffsetMm,
          spokes: g.spokes,
          crosses: g.crosses,
          holeDiameterMm: g.holeDiameterMm,
        });
        expect(w.leftExactMm).toBe(w.rightExactMm);
        expect(w.leftMm).toBe(w.rightMm);
        expect(w.dishMm).toBe(0);
      }),
    );
  });

  it('throws a WheelInputError, never NaN, on any bad number', () => {
    const bad = fc.oneof(fc.constant(Number.NaN), fc.constant(Infinity), fc.constant(-Infinity), fc.double({ max: -0.001, noNaN: true }));
    const field = fc.constantFrom('erdMm', 'pcdMm', 'flangeOffsetMm', 'spokes', 'crosses', 'holeDiameterMm');
    fc.assert(
      fc.property(spokeGeometry, field, bad, (g, key, value) => {
        const input = { erdMm: g.erdMm, pcdMm: g.pcdMm, flangeOffsetMm: g.flangeOffsetMm, spokes: g.spokes, crosses: g.crosses, holeDiameterMm: g.holeDiameterMm, [key]: value };
        expect(() => spokeLength(input)).toThrow(WheelInputError);
      }),
    );
  });

  it('rejects sizes and gauges outside the tables with a clear message', () => {
    fc.assert(
      fc.property(fc.double({ noNaN: false }), (x) => {
        fc.pre(![16, 20, 24, 26, 27.5, 29].includes(x));
        expect(() => bsdForNominal(x)).toThrow(/No ISO 5775 bead seat diameter/);
      }),
    );
    fc.assert(
      fc.property(fc.double({ noNaN: false }), (x) => {
        fc.pre(!(Number.isInteger(x) && x >= 8 && x <= 15));
        expect(() => swgToMm(x)).toThrow(/Spoke gauge must be a whole SWG number from 8/);
      }),
    );
  });
});
