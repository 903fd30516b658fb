import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { bidInputSchema, createRequestBodySchema, requestInputSchema, shopSettingsPatchSchema } from '@/lib/market/schema';
import { bidValues, daysFromNow, frontWheel, rearWheel, requestValues } from './fixtures';

const fieldErrors = (r: { success: boolean; error?: z.ZodError }): Record<string, string[] | undefined> => (r.success ? {} : z.flattenError(r.error!).fieldErrors);
const issuesByPath = (r: { success: boolean; error?: z.ZodError }) =>
  Object.fromEntries((r.error?.issues ?? []).map((i) => [i.path.join('.'), i.message]));

describe('the request schema', () => {
  it('accepts a single wheel and a front-and-rear pair', () => {
    expect(requestInputSchema.safeParse(requestValues()).success).toBe(true);
    expect(requestInputSchema.safeParse(requestValues({ wheels: [frontWheel, rearWheel] })).success).toBe(true);
  });

  it('takes radial, 1 to 4 cross, or a custom pattern in words', () => {
    const withLacing = (lacing: unknown) => requestInputSchema.safeParse(requestValues({ wheels: [{ ...frontWheel, lacing } as never] }));
    expect(withLacing({ kind: 'radial' }).success).toBe(true);
    expect(withLacing({ kind: 'cross', crosses: 4 }).success).toBe(true);
    expect(withLacing({ kind: 'custom', description: 'Twisted pairs, 3 cross' }).success).toBe(true);
    expect(issuesByPath(withLacing({ kind: 'cross', crosses: 5 }))['wheels.0.lacing.crosses']).toBe('Crosses must be at most 4.');
    expect(issuesByPath(withLacing({ kind: 'custom', description: '' }))['wheels.0.lacing.description']).toBe('Describe the lacing pattern in a few words.');
    expect(issuesByPath(withLacing({ kind: 'braided' }))['wheels.0.lacing.kind']).toMatch(/radial, 1 to 4 cross/);
  });

  it('explains every bad field in plain words', () => {
    const r = requestInputSchema.safeParse({
      ...requestValues(),
      title: '',
      zip: '0000',
      delivery: 'drone',
      neededBy: daysFromNow(-3),
      budgetCents: -5,
      frame: { rearSpacingMm: 20, frontSpacingMm: 100, bbShellWidthMm: 68, bbShellType: 'glued' },
      wheels: [{ ...rearWheel, spokes: 1000, rimWidthMm: 'wide' }],
    });
    const issues = issuesByPath(r);
    expect(issues).toMatchObject({
      title: 'Give the request a title of at least 3 characters.',
      zip: 'Enter a 5-digit US ZIP code.',
      delivery: 'Choose shipping or local pickup.',
      budgetCents: 'Budget must be at least $1.',
      'frame.rearSpacingMm': 'Frame rear spacing must be at least 100 mm.',
      'frame.bbShellType': 'Bottom-bracket shell type must be threaded, one-piece or press-fit.',
      'wheels.0.spokes': 'Spoke count must be at most 144.',
      'wheels.0.rimWidthMm': 'Rim width must be a number of millimetres.',
    });
  });

  it('wants a needed-by date in the future, and a pair to be one front and one rear', () => {
    expect(issuesByPath(requestInputSchema.safeParse(requestValues({ neededBy: daysFromNow(0) }))).neededBy).toBe('The needed-by date must be in the future.');
    expect(issuesByPath(requestInputSchema.safeParse(requestValues({ wheels: [rearWheel, rearWheel] }))).wheels).toBe('A pair is one front and one rear wheel.');
    expect(fieldErrors(requestInputSchema.safeParse(requestValues({ wheels: [] }))).wheels).toEqual(['Describe at least one wheel.']);
  });

  it('runs the engine’s own checks per wheel: hub position and drilling', () => {
    const r = requestInputSchema.safeParse(requestValues({ wheels: [{ ...rearWheel, hubId: 'front-100', spokes: 60 }] }));
    const issues = issuesByPath(r);
    expect(issues['wheels.0.hubId']).toMatch(/front hub; choose a rear hub/);
    expect(issues['wheels.0.spokes']).toMatch(/comes drilled for 36, 48, 72, 144 spokes/);
  });

  it('lets the create body say whether to publish', () => {
    expect(createRequestBodySchema.parse({ ...requestValues(), publish: true }).publish).toBe(true);
    expect(createRequestBodySchema.parse(requestValues()).publish).toBe(false);
  });
});

describe('the bid schema', () => {
  it('takes whole, non-negative cents with a sane maximum, and a lead time of 1 to 365 days', () => {
    expect(bidInputSchema.safeParse(bidValues()).success).toBe(true);
    const issues = issuesByPath(bidInputSchema.safeParse(bidValues({ partsCents: 12.5, labourCents: -1, finishCents: 3_000_000, leadTimeDays: 0 })));
    expect(issues).toMatchObject({
      partsCents: 'Parts must be whole cents.',
      labourCents: 'Labour cannot be negative.',
      finishCents: 'Finish must be at most $20,000.',
      leadTimeDays: 'Lead time (days) must be at least 1.',
    });
  });

  it('wants valid-until in the future', () => {
    expect(issuesByPath(bidInputSchema.safeParse(bidValues({ validUntil: daysFromNow(-1) }))).validUntil).toBe('The valid-until date must be in the future.');
    expect(bidInputSchema.safeParse(bidValues({ validUntil: new Date(Date.now() + 3_600_000).toISOString() })).success).toBe(true);
  });

  it('takes an optional proposed change with only the fields that change', () => {
    const r = bidInputSchema.safeParse(bidValues({ proposedChange: { description: 'Thicker spokes', wheels: [{ position: 'rear', spokeGauge: 10 }] } }));
    expect(r.success).toBe(true);
    expect(issuesByPath(bidInputSchema.safeParse(bidValues({ proposedChange: { description: '', wheels: [] } })))['proposedChange.description']).toBe(
      'Describe the change you propose.',
    );
  });
});

describe('the shop settings schema', () => {
  it('checks the lists and the numbers', () => {
    const issues = issuesByPath(shopSettingsPatchSchema.safeParse({ capabilities: { diametersIn: [23], gauges: [20] }, buildsAtOnce: 0, zip: 'abc' }));
    expect(issues['capabilities.diametersIn.0']).toMatch(/Wheel sizes are/);
    expect(issues['capabilities.gauges.0']).toMatch(/Spoke gauges are 8 to 15/);
    expect(issues.buildsAtOnce).toBe('Builds at once must be at least 1.');
    expect(issues.zip).toBe('Enter a 5-digit US ZIP code.');
  });
});
