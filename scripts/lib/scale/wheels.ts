// Wheel and frame specs for the scale data: drawn from the shapes riders of wide wheels ask for, each one
// checked by the same schema the request form uses and priced by the engine, so the domain code reads them.
import type { Verdict } from '../../../lib/wheel';
import { requestInputSchema, type FrameSpec, type Lacing, type WheelSpec } from '../../../lib/market/schema';
import { assessSpec, boardColumns } from '../../../lib/market/spec';
import type { Rng } from './random';

export interface SpecTemplate {
  spec: { wheels: WheelSpec[]; frame: FrameSpec };
  columns: ReturnType<typeof boardColumns>;
  verdict: Verdict;
  baseline: { lowCents: number; typicalCents: number; highCents: number };
  title: string;
}

interface Family {
  label: string;
  rimWidthMm: number;
  tireWidthMm: number;
  diameters: WheelSpec['nominalDiameterIn'][];
  rearHubs: WheelSpec['hubId'][];
  frontHubs: WheelSpec['hubId'][];
  frame: FrameSpec;
  weight: number;
}

const FAMILIES: Family[] = [
  {
    label: '3-inch',
    rimWidthMm: 80,
    tireWidthMm: 76,
    diameters: [24, 26],
    rearHubs: ['rear-igh3-coaster-120', 'rear-igh3-120', 'rear-coaster-110'],
    frontHubs: ['front-100'],
    frame: { rearSpacingMm: 120, frontSpacingMm: 100, bbShellWidthMm: 68, bbShellType: 'threaded' },
    weight: 5,
  },
  {
    label: '4-inch',
    rimWidthMm: 100,
    tireWidthMm: 100,
    diameters: [24, 26, 27.5],
    rearHubs: ['rear-ss-170'],
    frontHubs: ['front-135', 'front-115'],
    frame: { rearSpacingMm: 170, frontSpacingMm: 135, bbShellWidthMm: 100, bbShellType: 'threaded' },
    weight: 4,
  },
  {
    label: '5-inch',
    rimWidthMm: 120,
    tireWidthMm: 120,
    diameters: [26, 27.5],
    rearHubs: ['rear-ss-190'],
    frontHubs: ['front-135'],
    frame: { rearSpacingMm: 190, frontSpacingMm: 135, bbShellWidthMm: 120, bbShellType: 'threaded' },
    weight: 2,
  },
  {
    label: '2.5-inch',
    rimWidthMm: 65,
    tireWidthMm: 64,
    diameters: [20, 24, 26, 29],
    rearHubs: ['rear-ss-135'],
    frontHubs: ['front-100'],
    frame: { rearSpacingMm: 135, frontSpacingMm: 100, bbShellWidthMm: 73, bbShellType: 'threaded' },
    weight: 2,
  },
];

const SPOKE_CHOICES = [
  [36, 14],
  [36, 13],
  [48, 13],
  [72, 12],
  [72, 14],
  [144, 10],
  [144, 12],
] as const;
const FINISHES: WheelSpec['finish'][] = ['bare', 'polished', 'painted', 'plated'];

function lacingFor(rng: Rng, position: WheelSpec['position'], spokes: number): Lacing {
  if (position === 'front' && spokes <= 48 && rng.chance(0.15)) return { kind: 'radial' };
  if (rng.chance(0.05)) return { kind: 'custom', description: 'Twisted pairs, laced 3 cross' };
  return { kind: 'cross', crosses: spokes >= 72 ? rng.pick([3, 4]) : rng.pick([2, 3]) };
}

function wheel(rng: Rng, family: Family, position: WheelSpec['position'], diameter: WheelSpec['nominalDiameterIn'], finish: WheelSpec['finish']): WheelSpec {
  const [spokes, spokeGauge] = rng.pick(SPOKE_CHOICES);
  return {
    position,
    nominalDiameterIn: diameter,
    rimWidthMm: family.rimWidthMm,
    tireWidthMm: family.tireWidthMm,
    spokes,
    spokeGauge,
    lacing: lacingFor(rng, position, spokes),
    hubId: rng.pick(position === 'rear' ? family.rearHubs : family.frontHubs),
    finish,
  };
}

/** `count` distinct, valid specs; combinations the schema or the engine refuse are skipped. */
export function specTemplates(rng: Rng, count: number): SpecTemplate[] {
  const neededBy = new Date(Date.now() + 60 * 86_400_000).toISOString().slice(0, 10);
  const out: SpecTemplate[] = [];
  const seen = new Set<string>();
  for (let tries = 0; out.length < count && tries < count * 20; tries++) {
    const family = rng.weighted(FAMILIES.map((f) => [f, f.weight] as const));
    const diameter = rng.pick(family.diameters);
    const finish = rng.pick(FINISHES);
    const shape = rng.weighted([
      ['pair', 5],
      ['rear', 4],
      ['front', 1],
    ] as const);
    const wheels = shape === 'pair' ? [wheel(rng, family, 'front', diameter, finish), wheel(rng, family, 'rear', diameter, finish)] : [wheel(rng, family, shape, diameter, finish)];
    const key = JSON.stringify(wheels);
    if (seen.has(key)) continue;
    const parsed = requestInputSchema.safeParse({ title: 'scale', wheels, frame: family.frame, zip: '87102', delivery: 'ship', neededBy, budgetCents: 50_000 });
    if (!parsed.success) continue;
    let assessment: ReturnType<typeof assessSpec>;
    try {
      assessment = assessSpec(parsed.data.wheels, parsed.data.frame);
    } catch {
      continue;
    }
    seen.add(key);
    const first = parsed.data.wheels[0];
    const what = shape === 'pair' ? 'pair' : shape;
    out.push({
      spec: { wheels: parsed.data.wheels, frame: parsed.data.frame },
      columns: boardColumns(parsed.data.wheels),
      verdict: assessment.verdict,
      baseline: assessment.baseline,
      title: `${first.nominalDiameterIn}-inch ${what}, ${family.label} rim${shape === 'pair' ? 's' : ''}, ${first.spokes} spokes`,
    });
  }
  if (out.length === 0) throw new Error('no valid wheel spec could be drawn');
  return out;
}
