import type { Knex } from 'knex';
import type { SessionUser } from '../../lib/auth/roles';
import { acceptBid } from '../../lib/market/acceptBid';
import { createRequest } from '../../lib/market/createRequest';
import { placeBid } from '../../lib/market/placeBid';
import { bidInputSchema, requestInputSchema, type RequestFormValues } from '../../lib/market/schema';

// DEMO DATA: two invented wheel requests from the demo rider, each with an accepted bid from the demo
// builder's shop, so the money path can be walked in the browser right after the start command: each is a
// job awaiting payment. No money is seeded: the demo shops have no payout account yet (the builder sets one
// up on the payments stand-in's page, from /payouts), and every payment happens through the stand-in, so
// the ledger starts empty and balanced. Idempotent: if the first demo job's request exists, nothing is added.

const day = (offset: number) => new Date(Date.now() + offset * 86_400_000).toISOString().slice(0, 10);
const cruiserFrame = { rearSpacingMm: 120, frontSpacingMm: 100, bbShellWidthMm: 68, bbShellType: 'threaded' } as const;

const DEMO_JOBS: { request: RequestFormValues; totalCents: number; leadTimeDays: number }[] = [
  {
    request: {
      title: 'Escrow demo: 26-inch rear, 3-inch rim',
      wheels: [{ position: 'rear', nominalDiameterIn: 26, rimWidthMm: 80, tireWidthMm: 76, spokes: 72, spokeGauge: 12, lacing: { kind: 'cross', crosses: 3 }, hubId: 'rear-igh3-coaster-120', finish: 'polished' }],
      frame: cruiserFrame,
      zip: '87110',
      delivery: 'ship',
      neededBy: day(50),
      budgetCents: 60_000,
      notes: 'DEMO DATA. A bid already accepted, waiting for payment into escrow.',
    },
    totalCents: 48_500,
    leadTimeDays: 21,
  },
  {
    request: {
      title: 'Escrow demo: 24-inch front, 3-inch rim',
      wheels: [{ position: 'front', nominalDiameterIn: 24, rimWidthMm: 80, tireWidthMm: 76, spokes: 36, spokeGauge: 14, lacing: { kind: 'cross', crosses: 3 }, hubId: 'front-100', finish: 'polished' }],
      frame: cruiserFrame,
      zip: '87110',
      delivery: 'pickup',
      neededBy: day(40),
      budgetCents: 35_000,
      notes: 'DEMO DATA. A second accepted bid, for trying a declined card, a cancellation or a dispute.',
    },
    totalCents: 27_000,
    leadTimeDays: 14,
  },
];

async function sessionUser(trx: Knex, email: string): Promise<SessionUser> {
  const row = await trx('users as u').leftJoin('shop_members as m', 'm.user_id', 'u.id').where('u.email', email).first('u.id', 'u.email', 'u.name', 'u.role', 'm.shop_id');
  if (!row) throw new Error(`demo user ${email} is missing; run the first seed`);
  return { id: row.id, email: row.email, name: row.name, role: row.role, shopId: row.shop_id ?? null };
}

export async function seed(knex: Knex): Promise<void> {
  await knex.transaction(async (trx) => {
    const rider = await sessionUser(trx, 'rider@demo.lacewright.test');
    const builder = await sessionUser(trx, 'builder@demo.lacewright.test');
    if (await trx('wheel_requests').where({ rider_id: rider.id, title: DEMO_JOBS[0].request.title }).first('id')) return;
    for (const demo of DEMO_JOBS) {
      const request = await createRequest(trx, rider, requestInputSchema.parse(demo.request), { publish: true });
      const partsCents = Math.round(demo.totalCents * 0.55);
      const labourCents = Math.round(demo.totalCents * 0.3);
      const finishCents = Math.round(demo.totalCents * 0.08);
      const bid = await placeBid(
        trx,
        builder,
        request.id,
        bidInputSchema.parse({
          partsCents,
          labourCents,
          finishCents,
          shippingCents: demo.totalCents - partsCents - labourCents - finishCents,
          leadTimeDays: demo.leadTimeDays,
          validUntil: day(14),
          message: 'DEMO DATA. Parts on the shelf; we start as soon as the payment is in escrow.',
          proposedChange: null,
        }),
      );
      await acceptBid(trx, rider, request.id, bid.id);
    }
  });
}
