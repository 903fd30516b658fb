// What the benchmark asks for, picked from the scale data: builders of shops that build most things,
// riders with many requests, open requests each shop has not bid on yet, and typical fit inputs.
import type pg from 'pg';
import { scaleBuilderEmail, scaleRiderEmail } from '../scale/generate';

export const BENCH_BUILDERS = 32;
export const BENCH_RIDERS = 4;

export const builderEmails = () => Array.from({ length: BENCH_BUILDERS }, (_, i) => scaleBuilderEmail(i));
export const riderEmails = () => Array.from({ length: BENCH_RIDERS }, (_, i) => scaleRiderEmail(i));

/** The board as builders use it: capability filter on, within a radius, three common sorts. */
export const BOARD_QUERIES = [
  '/api/board?sort=distance&maxMiles=250',
  '/api/board?sort=newest&maxMiles=250&rimWidthIn=4',
  '/api/board?sort=neededBy&maxMiles=400&diameterIn=26',
];

/** Requests of these riders that have bids, for the request page. */
export async function riderRequestIds(db: pg.ClientBase, emails: string[]): Promise<Map<string, string[]>> {
  const { rows } = await db.query<{ email: string; id: string }>(
    `select u.email, r.id from wheel_requests r join users u on u.id = r.rider_id
      where u.email = any($1) and exists (select 1 from bids b where b.request_id = r.id)
      order by u.email, r.created_at desc`,
    [emails],
  );
  const out = new Map<string, string[]>();
  for (const r of rows) out.set(r.email, [...(out.get(r.email) ?? []), r.id]);
  return out;
}

/** For each builder, open requests their shop has no bid on, so each bid sent is a new one. */
export async function openRequestsWithoutBid(db: pg.ClientBase, emails: string[], perBuilder: number): Promise<Map<string, string[]>> {
  const { rows } = await db.query<{ email: string; id: string }>(
    `select u.email, pick.id
       from users u join shop_members m on m.user_id = u.id
       cross join lateral (
         select r.id from wheel_requests r
          where r.status = 'open' and r.expires_at > now() + interval '1 hour'
            and not exists (select 1 from bids b where b.request_id = r.id and b.shop_id = m.shop_id)
          order by md5(r.id::text || m.shop_id::text) limit $2) pick
      where u.email = any($1)`,
    [emails, perBuilder],
  );
  const out = new Map<string, string[]>();
  for (const r of rows) out.set(r.email, [...(out.get(r.email) ?? []), r.id]);
  return out;
}

export function bidBody(n: number) {
  const validUntil = new Date(Date.now() + 30 * 86_400_000).toISOString().slice(0, 10);
  const total = 60_000 + (n % 40) * 1_000;
  return {
    partsCents: Math.round(total * 0.55),
    labourCents: Math.round(total * 0.3),
    finishCents: Math.round(total * 0.07),
    shippingCents: total - Math.round(total * 0.55) - Math.round(total * 0.3) - Math.round(total * 0.07),
    leadTimeDays: 14 + (n % 30),
    validUntil,
    message: 'Rims and hubs in stock; we can start next week.',
  };
}

/** Fit inputs riders commonly send: a 3-inch cruiser rear, a 4-inch wide rear, a 4-inch front. */
export const FIT_BODIES = [
  { position: 'rear', nominalDiameterIn: 26, rimWidthMm: 80, tireWidthMm: 76, spokes: 72, spokeGauge: 12, crosses: 3, hubId: 'rear-igh3-coaster-120', frameRearSpacingMm: 120, forkSpacingMm: 100, bbShellWidthMm: 68 },
  { position: 'rear', nominalDiameterIn: 24, rimWidthMm: 100, tireWidthMm: 100, spokes: 144, spokeGauge: 10, crosses: 4, hubId: 'rear-ss-170', frameRearSpacingMm: 170, forkSpacingMm: 135, bbShellWidthMm: 100 },
  { position: 'front', nominalDiameterIn: 26, rimWidthMm: 100, tireWidthMm: 100, spokes: 36, spokeGauge: 14, crosses: 3, hubId: 'front-135', frameRearSpacingMm: 170, forkSpacingMm: 135, bbShellWidthMm: 100 },
];
