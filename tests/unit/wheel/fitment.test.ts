import { describe, expect, it } from 'vitest';
import {
  CAUTIONS,
  MAX_CHAIN_SKEW_DEG,
  MIN_CHAIN_TIRE_CLEARANCE_MM,
  checkFitment,
  chainToTireClearance,
  computeFit,
  frontChainlineNeededMm,
  hubById,
  sectionHalfWidthAt,
  tireSectionWidthMm,
  WheelInputError,
  type FitmentInput,
} from '@/lib/wheel';

const base: FitmentInput = {
  position: 'rear',
  bsdMm: 559,
  rimWidthMm: 80,
  tireWidthMm: 76.2,
  hub: hubById('rear-igh3-coaster-120'),
  cog: 'standard',
  cogTeeth: 18,
  chainringTeeth: 36,
  frameRearSpacingMm: 120,
  forkSpacingMm: 100,
  bbShellWidthMm: 68,
  chainstayLengthMm: 460,
};

describe('tire section', () => {
  it('is widest at mid-section and never narrower than the rim it sits on', () => {
    const s = { bsdMm: 559, rimWidthMm: 80, tireWidthMm: 76.2 };
    expect(tireSectionWidthMm(s)).toBe(80);
    const mid = sectionHalfWidthAt(s, 279.5 + 38.1);
    expect(mid.halfWidthMm).toBeCloseTo(40, 9);
    expect(sectionHalfWidthAt(s, 279.5 + 76.2 + 1).part).toBeNull();
    expect(sectionHalfWidthAt(s, 275).part).toBe('rim');
  });
});

describe('chain run', () => {
  const section = { bsdMm: 559, rimWidthMm: 100, tireWidthMm: 101.6 };
  const run = { rearChainlineMm: 42, chainstayLengthMm: 460, cogTeeth: 18, chainringTeeth: 36 };

  it('gains clearance as the front chainline moves out', () => {
    let last = -Infinity;
    for (let cf = 30; cf <= 90; cf += 5) {
      const c = chainToTireClearance(section, { ...run, frontChainlineMm: cf })!;
      expect(c.clearanceMm).toBeGreaterThan(last);
      last = c.clearanceMm;
    }
  });

  it('finds the front chainline that gives just the minimum clearance', () => {
    const cf = frontChainlineNeededMm(section, run)!;
    expect(chainToTireClearance(section, { ...run, frontChainlineMm: cf })!.clearanceMm).toBeCloseTo(MIN_CHAIN_TIRE_CLEARANCE_MM, 2);
  });

  it('a wider tire needs a chainline further out', () => {
    const narrow = frontChainlineNeededMm({ bsdMm: 559, rimWidthMm: 80, tireWidthMm: 76.2 }, run)!;
    const wide = frontChainlineNeededMm(section, run)!;
    expect(wide).toBeGreaterThan(narrow);
  });
});

describe('checkFitment on a rear frame', () => {
  it('picks a spindle when none is given and reports the geometry it used', () => {
    const r = checkFitment(base);
    expect(r.verdict).toBe('fits');
    expect(r.drive!.spindleLengthMm).toBe(r.needs.spindleLengthMm);
    expect(r.drive!.skewDeg).toBeLessThanOrEqual(MAX_CHAIN_SKEW_DEG);
    expect(r.chainToTireClearanceMm).toBe(r.drive!.clearanceMm);
  });

  it('asks for a spindle change when the one given leaves the chain on the tire', () => {
    const r = checkFitment({ ...base, spindleLengthMm: 107 });
    expect(r.verdict).toBe('fits-with-changes');
    expect(r.changes.join(' ')).toMatch(/Change the spindle to \d+ mm/);
  });

  it('flags a spindle the shell cannot carry', () => {
    const r = checkFitment({ ...base, spindleLengthMm: 175 });
    expect(r.reasons.join(' ')).toMatch(/does not suit a 68 mm shell/);
    expect(r.verdict).toBe('fits-with-changes');
  });

  it('fills a wider rear end with axle spacers', () => {
    const r = checkFitment({ ...base, frameRearSpacingMm: 124 });
    expect(r.verdict).toBe('fits-with-changes');
    expect(r.changes.join(' ')).toMatch(/axle spacers/);
  });

  it('will not force a hub into a rear end far from its width', () => {
    const r = checkFitment({ ...base, frameRearSpacingMm: 135 });
    expect(r.verdict).toBe('does-not-fit');
    expect(checkFitment({ ...base, frameRearSpacingMm: 100 }).verdict).toBe('does-not-fit');
  });

  it('refuses a chainstay too short for the tire', () => {
    const r = checkFitment({ ...base, chainstayLengthMm: 360 });
    expect(r.verdict).toBe('does-not-fit');
    expect(r.reasons.join(' ')).toMatch(/chainstay is too short/);
    expect(r.needs.chainstayMinMm!).toBeGreaterThan(360);
  });

  it('names the hub a 5-inch wheel needs when the chosen one cannot carry it', () => {
    const r = checkFitment({ ...base, rimWidthMm: 120, tireWidthMm: 127, bbShellWidthMm: 120, frameRearSpacingMm: 120 });
    expect(r.verdict).toBe('does-not-fit');
    expect(r.needs.hubId).toBe('rear-ss-170');
  });

  it('rejects a front hub in a rear wheel with a typed error', () => {
    expect(() => checkFitment({ ...base, hub: hubById('front-100') })).toThrow(WheelInputError);
  });
});

describe('checkFitment on a fork', () => {
  const front: FitmentInput = { ...base, position: 'front', hub: hubById('front-100') };

  it('respaces a fork a little, with the frame-builder caution', () => {
    const r = checkFitment({ ...front, forkSpacingMm: 97 });
    expect(r.verdict).toBe('fits-with-changes');
    expect(r.cautions).toContain(CAUTIONS.frameChange);
  });

  it('has no chain or shell figures', () => {
    const r = checkFitment(front);
    expect(r.drive).toBeNull();
    expect(r.chainToTireClearanceMm).toBeNull();
    expect(r.needs.bbShellWidthMm).toBeNull();
    expect(r.forkBladeClearanceMm).toBeCloseTo(10, 9);
  });
});

describe('computeFit result for the page', () => {
  it('carries what the two diagrams need', () => {
    const r = computeFit({});
    const tv = r.geometry.topView!;
    expect(tv.cogXMm).toBe(r.fitment.drive!.rearChainlineMm);
    expect(tv.clearanceMm).toBe(r.fitment.chainToTireClearanceMm);
    expect(tv.chainXAtClosestMm! - tv.chainHalfWidthMm - tv.obstacleHalfWidthAtClosestMm!).toBeCloseTo(tv.clearanceMm!, 9);
    expect(tv.wheelOutline.length).toBeGreaterThan(10);
    expect(tv.chainProfile.length).toBeGreaterThan(5);
    const lacing = r.geometry.lacing;
    expect(lacing.pattern).toHaveLength(36);
    expect(lacing.flangePcdMm).toBe(68);
    expect(lacing.erdMm).toBe(r.dimensions.erdMm);
    expect(r.geometry.fork).toBeNull();
    expect(computeFit({ position: 'front' }).geometry.fork!.bladeClearanceMm).toBeCloseTo(10, 9);
  });

  it('gives gearing for the 3-speed hub and none for a front wheel', () => {
    const r = computeFit({ chainringTeeth: 36, cogTeeth: 18 });
    expect(r.gearing!.gears.map((g) => g.label)).toEqual(['low', 'direct', 'high']);
    expect(r.gearing!.gears[1]!.gearInches).toBeCloseTo((r.dimensions.tireOuterDiameterMm / 25.4) * 2, 9);
    expect(computeFit({ position: 'front' }).gearing).toBeNull();
    expect(computeFit({ hubId: 'rear-coaster-110', frameRearSpacingMm: 110 }).gearing!.gears).toHaveLength(1);
  });

  it('uses a measured ERD when given', () => {
    const measured = computeFit({ erdMm: 535 });
    expect(measured.dimensions.erdMeasured).toBe(true);
    expect(measured.spokes.leftExactMm).toBeLessThan(computeFit({}).spokes.leftExactMm);
  });

  it('asks for fewer crosses when the flange cannot take them', () => {
    const r = computeFit({ crosses: 6 });
    expect(r.lacing.ok).toBe(false);
    expect(r.verdict).toBe('fits-with-changes');
    expect(r.changes.join(' ')).toMatch(/Lace \d cross instead of 6/);
  });

  it('refuses radial lacing on a coaster-brake hub but offers the crossed pattern', () => {
    const r = computeFit({ crosses: 0 });
    expect(r.lacing.ok).toBe(false);
    expect(r.changes.join(' ')).toMatch(/crossed/);
  });
});
