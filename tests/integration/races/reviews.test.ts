// Both sides reviewing the same job at once, several times over: one review per side, and both open to
// view together once the second lands (never one left hidden while the other shows).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DomainError } from '@/lib/errors';
import { confirmReceipt, markShipped, startBuild } from '@/lib/payments/fulfilment';
import { createReview, editReview } from '@/lib/reviews/writeReview';
import { addShopMember } from '../market/fixtures';
import { fundedJob, startHarness, type Harness } from '../payments/harness';
import { recordProof } from '../../support/summary';

const ROUNDS = 4;

let h: Harness;
const tally = { raceRuns: 0, lostRecords: 0, duplicatedRecords: 0 };
beforeAll(async () => {
  h = await startHarness('races_reviews');
});
afterAll(async () => {
  recordProof('races/reviews', tally);
  await h?.close();
});

async function completedJob() {
  const world = await fundedJob(h);
  await startBuild(h.ctx, world.builder, world.jobId);
  await markShipped(h.ctx, world.builder, world.jobId, { handover: 'pickup' });
  await confirmReceipt(h.ctx, world.rider, world.jobId);
  return world;
}

describe('racing reviews', () => {
  it(`${ROUNDS} rounds of the rider three times and three shop members at once: one review per side, both visible`, async () => {
    for (let round = 0; round < ROUNDS; round++) {
      const { rider, builder, jobId } = await completedJob();
      const members = [builder, await addShopMember(h.db, builder.shopId!), await addShopMember(h.db, builder.shopId!)];
      const byRider = { jobId, side: 'rider' as const, overall: 5, aspects: { buildQuality: 5, communication: 4, onTime: 5 }, text: 'Straight and true.' };
      const byShop = { jobId, side: 'shop' as const, overall: 4, aspects: { clearSpec: 4, communication: 5, payment: 5 }, text: 'Clear spec.' };
      const results = await Promise.allSettled([
        ...[0, 1, 2].map(() => createReview(h.db, rider, byRider)),
        ...members.map((m) => createReview(h.db, m, byShop)),
      ]);
      tally.raceRuns += 1;
      for (const r of results) if (r.status === 'rejected' && !(r.reason instanceof DomainError && r.reason.status === 409)) throw r.reason;
      expect(results.filter((r) => r.status === 'fulfilled')).toHaveLength(2);
      const rows = await h.db('reviews').where({ job_id: jobId });
      for (const side of ['rider', 'shop']) {
        const n = rows.filter((r) => r.author_side === side).length;
        if (n === 0) tally.lostRecords += 1;
        if (n > 1) tally.duplicatedRecords += n - 1;
        expect(n, side).toBe(1);
      }
      // The second write opened both: neither is still hidden.
      expect(rows.every((r) => new Date(r.hidden_until).getTime() <= Date.now())).toBe(true);
      // And once open to the other side, neither can be changed, however many try.
      const edits = await Promise.allSettled(rows.map((r) => editReview(h.db, r.author_side === 'rider' ? rider : builder, r.id, { overall: 1 })));
      expect(edits.every((e) => e.status === 'rejected' && e.reason instanceof DomainError && e.reason.status === 409)).toBe(true);
      expect((await h.db('reviews').where({ job_id: jobId })).map((r) => r.overall).sort()).toEqual([4, 5]);
    }
  });
});
