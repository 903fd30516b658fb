// Money under simultaneous clicks: every round ends with one release and one transfer (or one refund), a
// dispute opened once and settled once, and books that balance. Uses the payments suite's harness: its own
// database, the payments stand-in on a free port and the app's webhook handler.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DomainError } from '@/lib/errors';
import { cancelJob } from '@/lib/payments/cancel';
import { openDispute, resolveDispute } from '@/lib/payments/disputes';
import { autoConfirmDueJobs, confirmReceipt, markShipped, startBuild } from '@/lib/payments/fulfilment';
import { ledgerProblems } from '@/lib/payments/ledger';
import { fundedJob, jobRow, makeAdmin, startHarness, type Harness } from '../payments/harness';
import { recordProof } from '../../support/summary';

// Rounds per race; each needs a job paid through the stand-in, so fewer than the market races.
const ROUNDS = 4;

let h: Harness;
const tally = { raceRuns: 0, lostRecords: 0, duplicatedRecords: 0 };
beforeAll(async () => {
  h = await startHarness('races');
});
afterAll(async () => {
  recordProof('races/money', tally);
  await h?.close();
});

async function settle(calls: (() => Promise<unknown>)[]): Promise<{ won: number; refused: DomainError[] }> {
  const results = await Promise.allSettled(calls.map((c) => c()));
  let won = 0;
  const refused: DomainError[] = [];
  for (const r of results) {
    if (r.status === 'fulfilled') won += 1;
    else if (r.reason instanceof DomainError && r.reason.status < 500) refused.push(r.reason);
    else throw r.reason;
  }
  return { won, refused };
}

function count(n: number, expected: number): void {
  if (n < expected) tally.lostRecords += expected - n;
  if (n > expected) tally.duplicatedRecords += n - expected;
  expect(n).toBe(expected);
}

async function shippedJob() {
  const world = await fundedJob(h);
  await startBuild(h.ctx, world.builder, world.jobId);
  await markShipped(h.ctx, world.builder, world.jobId, { handover: 'pickup' });
  return world;
}

async function booksBalance(jobId: string) {
  expect(await ledgerProblems(h.db, await jobRow(h.db, jobId))).toEqual([]);
}

describe('racing on one job', () => {
  it(`${ROUNDS} rounds of six confirmations and two worker passes at once: one release, one payout, one transfer`, async () => {
    for (let round = 0; round < ROUNDS; round++) {
      const { rider, jobId } = await shippedJob();
      await h.db('jobs').where({ id: jobId }).update({ auto_confirm_at: new Date(Date.now() - 1000) });
      const { won, refused } = await settle([
        ...Array.from({ length: 6 }, () => () => confirmReceipt(h.ctx, rider, jobId)),
        () => autoConfirmDueJobs(h.ctx),
        () => autoConfirmDueJobs(h.ctx),
      ]);
      tally.raceRuns += 1;
      expect(won).toBeGreaterThanOrEqual(2); // the worker passes always return, with 0 or 1 job
      expect(refused.every((e) => e.status === 409)).toBe(true);
      expect((await jobRow(h.db, jobId)).status).toBe('completed');
      count((await h.db('ledger_transactions').where({ job_id: jobId, kind: 'release' })).length, 1);
      count((await h.db('payouts').where({ job_id: jobId })).length, 1);
      count((await h.ctx.stripe.transfers.list({ transfer_group: jobId })).data.length, 1);
      await booksBalance(jobId);
    }
  });

  it(`${ROUNDS} rounds of cancelling from both sides, disputing and starting the build at once: one outcome, at most one refund`, async () => {
    for (let round = 0; round < ROUNDS; round++) {
      const { rider, builder, jobId } = await fundedJob(h);
      const dispute = { reason: 'no_response' as const, details: 'Nobody has answered my messages for a week now.' };
      await settle([
        () => cancelJob(h.ctx, rider, jobId, { reason: 'changed my mind' }),
        () => cancelJob(h.ctx, builder, jobId, { reason: 'cannot source the rim' }),
        () => openDispute(h.ctx, rider, jobId, dispute),
        () => startBuild(h.ctx, builder, jobId),
      ]);
      tally.raceRuns += 1;
      const job = await jobRow(h.db, jobId);
      expect(['refunded', 'disputed', 'building']).toContain(job.status);
      const refunds = await h.db('refunds').where({ job_id: jobId });
      const disputes = await h.db('disputes').where({ job_id: jobId });
      if (job.status === 'refunded') count(refunds.length, 1);
      else expect(refunds).toHaveLength(0);
      if (job.status === 'disputed') count(disputes.length, 1);
      else if (job.status === 'refunded') expect(disputes).toHaveLength(0);
      count((await h.db('ledger_transactions').where({ job_id: jobId, kind: 'charge' })).length, 1);
      await booksBalance(jobId);
    }
  });

  it(`${ROUNDS} rounds of both sides opening a dispute and two admins settling it at once: one dispute, one decision`, async () => {
    const admins = [await makeAdmin(h.db), await makeAdmin(h.db)];
    const why = { reason: 'not_as_described' as const, details: 'The rim is narrower than the one agreed in the bid.' };
    for (let round = 0; round < ROUNDS; round++) {
      const { rider, builder, jobId } = await shippedJob();
      await settle([() => openDispute(h.ctx, rider, jobId, why), () => openDispute(h.ctx, builder, jobId, why), () => openDispute(h.ctx, rider, jobId, why)]);
      const disputes = await h.db('disputes').where({ job_id: jobId });
      count(disputes.length, 1);
      const decision = { resolution: 'split' as const, refundCents: 10_000, reason: 'Both sides share the cost of the narrower rim fairly.' };
      const { won } = await settle([
        () => resolveDispute(h.ctx, admins[0], disputes[0].id, decision),
        () => resolveDispute(h.ctx, admins[1], disputes[0].id, { ...decision, resolution: 'release' }),
        () => resolveDispute(h.ctx, admins[0], disputes[0].id, { ...decision, resolution: 'refund' }),
      ]);
      tally.raceRuns += 1;
      expect(won).toBe(1);
      expect((await jobRow(h.db, jobId)).status).toBe('resolved');
      const settled = await h.db('disputes').where({ id: disputes[0].id }).first();
      expect(settled.status).toBe('resolved');
      count((await h.db('admin_audit_log').where({ action: 'dispute.resolved', target_id: disputes[0].id })).length, 1);
      expect((await h.db('refunds').where({ job_id: jobId })).length).toBeLessThanOrEqual(1);
      expect((await h.db('payouts').where({ job_id: jobId })).length).toBeLessThanOrEqual(1);
      await booksBalance(jobId);
    }
  });
});
