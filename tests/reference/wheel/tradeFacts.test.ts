// Facts of the wide-wheel trade the geometric model must reproduce. Each is common practice, no source:
// they fall out of the geometry (tire section, chain run, chainlines, shell, fork), not from a lookup.
import { describe, expect, it } from 'vitest';
import {
  CAUTIONS,
  DEMO_PRICE_BOOK,
  HUBS,
  SPINDLES,
  computeFit,
  drillingNeeded,
  estimateBaselineCost,
  evaluateDrive,
  hubById,
  spindleRangeForShellMm,
  swgToMm,
  validateLacing,
  type FitRequestInput,
} from '@/lib/wheel';

const THREE_INCH = { rimWidthMm: 80, tireWidthMm: 76.2 }; // "3 inch" and "80 mm" name the same wheel (common practice, no source)
const FOUR_INCH = { rimWidthMm: 100, tireWidthMm: 101.6 };
const FIVE_INCH = { rimWidthMm: 120, tireWidthMm: 127 };
const SIZES = [20, 24, 26, 29] as const;

const rear = (over: FitRequestInput) => computeFit({ position: 'rear', hubId: 'rear-igh3-coaster-120', frameRearSpacingMm: 120, ...over });

describe('3-inch-wide wheels on a 3-speed internal-gear hub', () => {
  it('run on a 116 to 120 mm OLD 3-speed hub with the standard flat cog', () => {
    // common practice, no source
    for (const tire of [THREE_INCH, { rimWidthMm: 80, tireWidthMm: 80 }]) {
      const r = rear({ ...tire, cog: 'standard', bbShellWidthMm: 68 });
      expect(r.verdict).toBe('fits');
      expect(r.fitment.needs.hubKind).toBe('igh3');
      expect(r.fitment.needs.oldRangeMm).toEqual([116, 120]);
      expect(r.fitment.needs.cog).toBe('standard');
      expect(r.fitment.chainToTireClearanceMm!).toBeGreaterThanOrEqual(2);
    }
    expect(rear({ ...THREE_INCH, frameRearSpacingMm: 116 }).verdict).toBe('fits'); // 116 mm frames too (common practice, no source)
  });

  it('an offset cog also works there', () => {
    // common practice, no source
    const r = rear({ ...THREE_INCH, cog: 'offset', bbShellWidthMm: 68 });
    expect(r.verdict).toBe('fits');
    expect(r.fitment.drive!.rearChainlineMm).toBeGreaterThan(hubById('rear-igh3-coaster-120').chainlineMm!);
  });

  it.each(SIZES)('holds on %s-inch rims', (nominalDiameterIn) => {
    // common practice, no source
    const r = rear({ ...THREE_INCH, nominalDiameterIn });
    expect(r.fitment.verdict).toBe('fits');
    expect(r.fitment.needs.cog).toBe('standard');
  });
});

describe('4-inch-wide wheels need the offset cog on the 120 mm 3-speed hub', () => {
  const frameFor4in = { ...FOUR_INCH, bbShellWidthMm: 100 };

  it('with the standard cog the chain rubs or runs skewed, whatever the spindle: not "fits"', () => {
    // common practice, no source
    const hub = hubById('rear-igh3-coaster-120');
    const { minMm, maxMm } = spindleRangeForShellMm(100);
    const section = { bsdMm: 559, ...FOUR_INCH };
    for (const s of SPINDLES.filter((x) => x.lengthMm >= minMm && x.lengthMm <= maxMm)) {
      const d = evaluateDrive(section, { hub, cog: 'standard', bbShellWidthMm: 100, spindleLengthMm: s.lengthMm, chainstayLengthMm: 460, cogTeeth: 18, chainringTeeth: 36 });
      expect(d.ok).toBe(false);
      expect((d.clearanceMm ?? Infinity) < 2 || d.skewDeg > 2).toBe(true);
    }
    const r = rear({ ...frameFor4in, cog: 'standard' });
    expect(r.verdict).not.toBe('fits');
    expect(r.fitment.needs.cog).toBe('offset');
    expect(r.changes.join(' ')).toMatch(/offset/);
    expect(r.reasons.join(' ')).toMatch(/rub|off line/);
  });

  it('with the offset cog it fits, because the cog moves the chainline outward', () => {
    // common practice, no source
    const r = rear({ ...frameFor4in, cog: 'offset' });
    expect(r.verdict).toBe('fits');
    expect(r.fitment.needs.oldMm).toBe(120);
    expect(r.fitment.drive!.clearanceMm!).toBeGreaterThanOrEqual(2);
    expect(r.fitment.drive!.rearChainlineMm - 42).toBeCloseTo(12.7, 9); // the offset cog's dish (from memory, about ½ inch)
  });

  it.each(SIZES)('holds on %s-inch rims', (nominalDiameterIn) => {
    // common practice, no source
    const n = rear({ ...frameFor4in, nominalDiameterIn }).fitment.needs;
    expect(n.hubKind).toBe('igh3');
    expect(n.cog).toBe('offset');
  });

  it('shows the hub-torque caution with an offset cog', () => {
    // common practice, no source: some builders report internal damage through torque
    const r = rear({ ...frameFor4in, cog: 'offset' });
    expect(r.cautions).toContain(CAUTIONS.offsetCogTorque);
    expect(CAUTIONS.offsetCogTorque).toMatch(/some builders report/i);
  });
});

describe('Bottom-bracket shells by wheel width', () => {
  it.each(SIZES)('%s-inch: 2¾ in (68–70 mm) for 3-inch, 100 mm for 4-inch, 120 mm for 5-inch', (nominalDiameterIn) => {
    // common practice, no source
    const three = rear({ ...THREE_INCH, nominalDiameterIn }).fitment.needs.bbShellWidthMm!;
    expect(three).toBeGreaterThanOrEqual(68);
    expect(three).toBeLessThanOrEqual(70);
    expect(rear({ ...FOUR_INCH, nominalDiameterIn }).fitment.needs.bbShellWidthMm).toBe(100);
    expect(rear({ ...FIVE_INCH, nominalDiameterIn }).fitment.needs.bbShellWidthMm).toBe(120);
  });

  it('each calls for a spindle the shell can carry', () => {
    for (const w of [THREE_INCH, FOUR_INCH, FIVE_INCH]) {
      const n = rear(w).fitment.needs;
      const range = spindleRangeForShellMm(n.bbShellWidthMm!);
      expect(n.spindleLengthMm!).toBeGreaterThanOrEqual(range.minMm);
      expect(n.spindleLengthMm!).toBeLessThanOrEqual(range.maxMm);
    }
  });

  it('a 4-inch wheel does not fit a frame with a standard shell, and the widest frames are custom', () => {
    // common practice, no source
    const r = rear({ ...FOUR_INCH, cog: 'offset', bbShellWidthMm: 68 });
    expect(r.verdict).toBe('does-not-fit');
    expect(r.reasons.join(' ')).toMatch(/100 mm shell/);
    expect(r.cautions).toContain(CAUTIONS.customFrame);
  });
});

describe('Front hubs', () => {
  it('100 mm OLD is standard and fits most forks', () => {
    // common practice, no source
    const r = computeFit({ position: 'front', ...THREE_INCH, hubId: 'front-100', forkSpacingMm: 100 });
    expect(r.verdict).toBe('fits');
    expect(r.fitment.needs.frontHubOldMm).toBe(100);
    expect(computeFit({ position: 'front', rimWidthMm: 50, tireWidthMm: 55 }).fitment.needs.frontHubOldMm).toBe(100);
  });

  it('a 4-inch-wide front wheel takes a 115 mm hub', () => {
    // common practice, no source
    expect(rear(FOUR_INCH).fitment.needs.frontHubOldMm).toBe(115);
    expect(computeFit({ position: 'front', ...FOUR_INCH, hubId: 'front-100', forkSpacingMm: 100 }).verdict).toBe('does-not-fit');
    expect(computeFit({ position: 'front', ...FOUR_INCH, hubId: 'front-115', forkSpacingMm: 115 }).verdict).toBe('fits');
    const swap = computeFit({ position: 'front', ...FOUR_INCH, hubId: 'front-100', forkSpacingMm: 115 });
    expect(swap.verdict).toBe('fits-with-changes');
    expect(swap.changes.join(' ')).toMatch(/115 mm/);
  });
});

describe('Spokes', () => {
  it('gauge number falls as the spoke gets thicker: 14 stock, 12 next, 8 heavy', () => {
    // common practice, no source (diameters from BS 3737 via Wikipedia "Standard wire gauge")
    expect(swgToMm(14)).toBeLessThan(swgToMm(12));
    expect(swgToMm(12)).toBeLessThan(swgToMm(8));
    for (let g = 9; g <= 15; g++) expect(swgToMm(g)).toBeLessThan(swgToMm(g - 1));
  });

  it('flanges drilled for stock spokes need drilling for thicker ones', () => {
    // common practice, no source
    const hub = hubById('rear-igh3-coaster-120');
    expect(drillingNeeded(14, hub.stockHoleDiameterMm)).toBe(false);
    expect(drillingNeeded(12, hub.stockHoleDiameterMm)).toBe(true);
    expect(drillingNeeded(8, hub.stockHoleDiameterMm)).toBe(true);
    const heavy = rear({ ...THREE_INCH, spokes: 72, spokeGauge: 8 });
    expect(heavy.spokes.drilling.needed).toBe(true);
    expect(heavy.cost.lines.find((l) => l.key === 'hub-drilling')!.cents).toBeGreaterThan(0);
    expect(heavy.cautions.join(' ')).toMatch(/Drilling the flange/);
    expect(rear(THREE_INCH).spokes.drilling.needed).toBe(false);
  });

  it('spoke counts double, 36, 72, 144, and 144 laces on a custom lowrider wheel', () => {
    // common practice, no source
    for (const hub of HUBS) {
      const counts = hub.drillings.map((d) => d.spokes);
      expect(counts).toEqual(expect.arrayContaining([36, 72, 144]));
    }
    const lowrider = rear({ nominalDiameterIn: 20, rimWidthMm: 72, tireWidthMm: 76, spokes: 144, crosses: 4, chainstayLengthMm: 400 });
    expect(lowrider.lacing.ok).toBe(true);
    expect(lowrider.verdict).toBe('fits');
  });

  it('drive and brake hubs are laced crossed, never radial', () => {
    // common practice, no source
    const check = validateLacing({ spokes: 36, crosses: 0, flangePcdMm: 68, erdMm: 543, gauge: 14, carriesTorque: true });
    expect(check.ok).toBe(false);
    expect(check.reason).toMatch(/torque/);
  });
});

describe('Bigger rims, hubs and spokes cost more', () => {
  const base = { nominalDiameterIn: 26, rimWidthMm: 80, spokes: 36, spokeGauge: 14, hubId: 'front-100', billableWeightLb: 30 } as const;
  const typical = (over: Partial<Parameters<typeof estimateBaselineCost>[0]>) => estimateBaselineCost({ ...base, ...over }).typicalCents;

  it('wider and larger rims cost more', () => {
    // common practice, no source (prices are DEMO DATA)
    expect(typical({ rimWidthMm: 100 })).toBeGreaterThan(typical({ rimWidthMm: 80 }));
    expect(typical({ nominalDiameterIn: 29 })).toBeGreaterThan(typical({ nominalDiameterIn: 20 }));
  });

  it('wider hubs of a kind cost more', () => {
    // common practice, no source (prices are DEMO DATA)
    expect(typical({ hubId: 'front-115' })).toBeGreaterThan(typical({ hubId: 'front-100' }));
    expect(typical({ hubId: 'front-135' })).toBeGreaterThan(typical({ hubId: 'front-115' }));
    expect(typical({ hubId: 'rear-ss-190' })).toBeGreaterThan(typical({ hubId: 'rear-ss-170' }));
    expect(typical({ hubId: 'rear-ss-170' })).toBeGreaterThan(typical({ hubId: 'rear-ss-135' }));
  });

  it('more and thicker spokes cost more', () => {
    // common practice, no source (prices are DEMO DATA)
    expect(typical({ spokes: 72 })).toBeGreaterThan(typical({ spokes: 36 }));
    expect(typical({ spokes: 144 })).toBeGreaterThan(typical({ spokes: 72 }));
    expect(typical({ spokeGauge: 12 })).toBeGreaterThan(typical({ spokeGauge: 14 }));
    expect(typical({ spokeGauge: 8 })).toBeGreaterThan(typical({ spokeGauge: 12 }));
  });

  it('says its prices are demo data', () => {
    expect(DEMO_PRICE_BOOK.label).toMatch(/DEMO DATA/);
    expect(estimateBaselineCost(base).priceBookLabel).toMatch(/DEMO DATA/);
  });
});

describe('Cautions that defer to qualified people', () => {
  it('frame spacing changes are for a qualified frame builder under local practice', () => {
    // common practice, no source
    const r = rear({ ...THREE_INCH, frameRearSpacingMm: 110 });
    expect(r.verdict).toBe('fits-with-changes');
    expect(r.changes.join(' ')).toMatch(/Cold-set the rear end from 110 mm to 116 mm/);
    expect(r.cautions).toContain(CAUTIONS.frameChange);
    expect(CAUTIONS.frameChange).toMatch(/qualified frame builder under local practice/);
  });

  it('heavy wheels get brake and hub cautions', () => {
    // common practice, no source
    const r = rear({ ...FOUR_INCH, cog: 'offset', bbShellWidthMm: 100, spokes: 144, spokeGauge: 14, crosses: 4 });
    expect(r.mass.wheelG).toBeGreaterThan(3000);
    expect(r.cautions.join(' ')).toMatch(/Heavy wheel/);
    expect(r.cautions.join(' ')).toMatch(/coaster brake/);
    expect(r.cautions.join(' ')).toMatch(/torque through a 3-speed hub/);
  });

  it('every result says it is an estimate', () => {
    expect(rear(THREE_INCH).cautions[0]).toBe(CAUTIONS.estimate);
  });
});
