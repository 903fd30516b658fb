import type { Knex } from 'knex';
import type { SessionUser } from '../../lib/auth/roles';
import { createRequest } from '../../lib/market/createRequest';
import { placeBid } from '../../lib/market/placeBid';
import { bidInputSchema, requestInputSchema, type RequestFormValues } from '../../lib/market/schema';

// DEMO DATA: invented wheel requests from the demo riders, with bids from the demo shops, so the board
// and the comparison have something on them right after the start command. Prices are invented: each
// bid is a fixed share of the engine's (demo) baseline. Idempotent: if the first demo request is there,
// nothing is added. Dates are counted from the day the seed runs.

const day = (offset: number) => new Date(Date.now() + offset * 86_400_000).toISOString().slice(0, 10);

const cruiserFrame = { rearSpacingMm: 120, frontSpacingMm: 100, bbShellWidthMm: 68, bbShellType: 'threaded' } as const;
const wideFrame = { rearSpacingMm: 170, frontSpacingMm: 135, bbShellWidthMm: 100, bbShellType: 'threaded' } as const;
const extraWideFrame = { rearSpacingMm: 190, frontSpacingMm: 135, bbShellWidthMm: 120, bbShellType: 'threaded' } as const;

type Rider = 'rider@demo.lacewright.test' | 'rider2@demo.lacewright.test';
type Builder = 'builder@demo.lacewright.test' | 'builder2@demo.lacewright.test' | 'builder3@demo.lacewright.test';

interface DemoBid {
  builder: Builder;
  /** Share of the baseline, in basis points (10000 = at the baseline). */
  priceBps: number;
  leadTimeDays: number;
  validForDays: number;
  message: string;
  proposedChange?: { description: string; wheels: { position: 'front' | 'rear'; [field: string]: unknown }[] };
}

interface DemoRequest {
  rider: Rider;
  publish: boolean;
  request: RequestFormValues;
  bids: DemoBid[];
}

const DEMO_REQUESTS: DemoRequest[] = [
  {
    rider: 'rider@demo.lacewright.test',
    publish: true,
    request: {
      title: '26-inch pair, 3-inch rims, 72 spokes',
      wheels: [
        { position: 'front', nominalDiameterIn: 26, rimWidthMm: 80, tireWidthMm: 76, spokes: 72, spokeGauge: 12, lacing: { kind: 'cross', crosses: 3 }, hubId: 'front-100', finish: 'polished' },
        { position: 'rear', nominalDiameterIn: 26, rimWidthMm: 80, tireWidthMm: 76, spokes: 72, spokeGauge: 12, lacing: { kind: 'cross', crosses: 3 }, hubId: 'rear-igh3-coaster-120', finish: 'polished' },
      ],
      frame: cruiserFrame,
      zip: '87110',
      delivery: 'pickup',
      neededBy: day(45),
      budgetCents: 110_000,
      notes: 'DEMO DATA. Beach cruiser with a 3-speed coaster hub; I would like the pair to match.',
    },
    bids: [
      { builder: 'builder@demo.lacewright.test', priceBps: 9_400, leadTimeDays: 18, validForDays: 21, message: 'DEMO DATA. We have both rims in stock and can start next week; pickup at the shop is fine.' },
      {
        builder: 'builder2@demo.lacewright.test',
        priceBps: 11_200,
        leadTimeDays: 30,
        validForDays: 14,
        message: 'DEMO DATA. Happy to build these; I suggest plated rims for a show finish.',
        proposedChange: { description: 'Plated finish on both wheels instead of polished.', wheels: [{ position: 'front', finish: 'plated' }, { position: 'rear', finish: 'plated' }] },
      },
      { builder: 'builder3@demo.lacewright.test', priceBps: 10_300, leadTimeDays: 12, validForDays: 10, message: 'DEMO DATA. Quick turnaround; we ship or you can collect.' },
    ],
  },
  {
    rider: 'rider@demo.lacewright.test',
    publish: true,
    request: {
      title: '24-inch lowrider rear, 4-inch rim, 144 spokes',
      wheels: [{ position: 'rear', nominalDiameterIn: 24, rimWidthMm: 100, tireWidthMm: 100, spokes: 144, spokeGauge: 10, lacing: { kind: 'cross', crosses: 4 }, hubId: 'rear-ss-170', finish: 'plated' }],
      frame: wideFrame,
      zip: '87110',
      delivery: 'ship',
      neededBy: day(75),
      budgetCents: 120_000,
      notes: 'DEMO DATA. Show bike; the frame has a 170 mm rear end.',
    },
    bids: [
      { builder: 'builder2@demo.lacewright.test', priceBps: 10_800, leadTimeDays: 35, validForDays: 20, message: 'DEMO DATA. 144-spoke wheels are most of what we do. Flange holes get drilled for 10 gauge.' },
      { builder: 'builder3@demo.lacewright.test', priceBps: 9_700, leadTimeDays: 28, validForDays: 20, message: 'DEMO DATA. We can do it; shipping in a double box.' },
    ],
  },
  {
    rider: 'rider2@demo.lacewright.test',
    publish: true,
    request: {
      title: '26-inch rear with a 5-inch rim',
      wheels: [{ position: 'rear', nominalDiameterIn: 26, rimWidthMm: 120, tireWidthMm: 120, spokes: 36, spokeGauge: 14, lacing: { kind: 'cross', crosses: 3 }, hubId: 'rear-ss-190', finish: 'painted' }],
      frame: extraWideFrame,
      zip: '77006',
      delivery: 'ship',
      neededBy: day(60),
      budgetCents: 60_000,
      notes: 'DEMO DATA. Custom frame with a 190 mm rear end and a 120 mm shell.',
    },
    bids: [{ builder: 'builder3@demo.lacewright.test', priceBps: 9_900, leadTimeDays: 21, validForDays: 25, message: 'DEMO DATA. Local to you; come by and we will check the frame spacing.' }],
  },
  {
    rider: 'rider2@demo.lacewright.test',
    publish: true,
    request: {
      title: '24-inch radial front, 3-inch rim',
      wheels: [{ position: 'front', nominalDiameterIn: 24, rimWidthMm: 80, tireWidthMm: 76, spokes: 36, spokeGauge: 14, lacing: { kind: 'radial' }, hubId: 'front-100', finish: 'polished' }],
      frame: cruiserFrame,
      zip: '77006',
      delivery: 'ship',
      neededBy: day(40),
      budgetCents: 35_000,
      notes: 'DEMO DATA. Radial front to match the old one.',
    },
    bids: [{ builder: 'builder2@demo.lacewright.test', priceBps: 10_500, leadTimeDays: 14, validForDays: 14, message: 'DEMO DATA. Radial is fine on a front hub without a brake.' }],
  },
  {
    rider: 'rider2@demo.lacewright.test',
    publish: true,
    request: {
      title: '27.5-inch fat front, 4-inch rim',
      wheels: [{ position: 'front', nominalDiameterIn: 27.5, rimWidthMm: 100, tireWidthMm: 100, spokes: 36, spokeGauge: 14, lacing: { kind: 'cross', crosses: 3 }, hubId: 'front-135', finish: 'bare' }],
      frame: { ...extraWideFrame, bbShellWidthMm: 100 },
      zip: '80205',
      delivery: 'ship',
      neededBy: day(90),
      budgetCents: 40_000,
      notes: 'DEMO DATA. For a snow bike; no rush.',
    },
    bids: [],
  },
  {
    rider: 'rider@demo.lacewright.test',
    publish: false,
    request: {
      title: 'Spare rear for the winter bike (draft)',
      wheels: [{ position: 'rear', nominalDiameterIn: 26, rimWidthMm: 80, tireWidthMm: 76, spokes: 72, spokeGauge: 12, lacing: { kind: 'custom', description: 'Twisted pairs, laced 3 cross' }, hubId: 'rear-igh3-coaster-120', finish: 'bare' }],
      frame: cruiserFrame,
      zip: '87110',
      delivery: 'pickup',
      neededBy: day(120),
      budgetCents: 50_000,
      notes: 'DEMO DATA. Still deciding on the finish.',
    },
    bids: [],
  },
];

async function sessionUser(trx: Knex, email: string): Promise<SessionUser> {
  const row = await trx('users as u').leftJoin('shop_members as m', 'm.user_id', 'u.id').where('u.email', email).first('u.id', 'u.email', 'u.name', 'u.role', 'm.shop_id');
  if (!row) throw new Error(`demo user ${email} is missing; run the first seed`);
  return { id: row.id, email: row.email, name: row.name, role: row.role, shopId: row.shop_id ?? null };
}

/** Splits a total into parts, labour, finish and shipping in fixed shares. */
function lineItems(totalCents: number) {
  const partsCents = Math.round(totalCents * 0.55);
  const labourCents = Math.round(totalCents * 0.3);
  const finishCents = Math.round(totalCents * 0.08);
  return { partsCents, labourCents, finishCents, shippingCents: totalCents - partsCents - labourCents - finishCents };
}

export async function seed(knex: Knex): Promise<void> {
  await knex.transaction(async (trx) => {
    const first = DEMO_REQUESTS[0];
    const firstRider = await sessionUser(trx, first.rider);
    if (await trx('wheel_requests').where({ rider_id: firstRider.id, title: first.request.title }).first('id')) return;
    for (const demo of DEMO_REQUESTS) {
      const rider = await sessionUser(trx, demo.rider);
      const request = await createRequest(trx, rider, requestInputSchema.parse(demo.request), { publish: demo.publish });
      for (const b of demo.bids) {
        const builder = await sessionUser(trx, b.builder);
        const total = Math.round((request.baseline.typicalCents * b.priceBps) / 10_000 / 100) * 100; // whole dollars
        const input = bidInputSchema.parse({
          ...lineItems(total),
          leadTimeDays: b.leadTimeDays,
          validUntil: day(b.validForDays),
          message: b.message,
          proposedChange: b.proposedChange ?? null,
        });
        await placeBid(trx, builder, request.id, input);
      }
    }
  });
}
