// The ledger itself: Postgres refuses unbalanced or edited entries, the invariant holds for every job,
// the reports add up, the CSV export is audited, and the worker confirms receipt after the waiting period.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listAudit } from '@/lib/payments/audit';
import { confirmReceipt, markShipped, startBuild } from '@/lib/payments/fulfilment';
import { getJobForViewer } from '@/lib/payments/jobView';
import { jobMoney, ledgerProblems, LedgerImbalance, post } from '@/lib/payments/ledger';
import { exportLedgerCsv, ledgerByJob, ledgerByMonth, ledgerCsv } from '@/lib/payments/ledgerReports';
import { cancellationTerms, referralFeeCents, splitFor } from '@/lib/payments/policy';
import { runPaymentsTick } from '@/lib/payments/worker';
import { Forbidden } from '@/lib/errors';
import { acceptedJob, fundedJob, jobRow, makeAdmin, startHarness, type Harness } from './harness';

let h: Harness;
/** A job given a stray booking on purpose; the reports must flag it and only it. */
let oddJobId = '';
beforeAll(async () => {
  h = await startHarness('ledger');
});
afterAll(() => h?.close());

describe('the books are guarded by the database', () => {
  it('refuses an entry set that does not sum to zero, at commit', async () => {
    const { jobId } = await acceptedJob(h.db);
    const err = await h.db
      .transaction(async (trx) => {
        const [t] = await trx('ledger_transactions').insert({ job_id: jobId, kind: 'charge', external_ref: 'ch_unbalanced', memo: 'test' }).returning('id');
        await trx('ledger_entries').insert([
          { transaction_id: t.id, job_id: jobId, account: 'processor', amount_cents: 100 },
          { transaction_id: t.id, job_id: jobId, account: 'rider_funds_held', amount_cents: -99 },
        ]);
      })
      .catch((e) => e);
    expect(String(err.message)).toMatch(/does not balance/);
    await expect(h.db.transaction((trx) => post(trx, { jobId, kind: 'charge', externalRef: 'x', memo: 'm', entries: [{ account: 'processor', amountCents: 5 }] }))).rejects.toThrow(LedgerImbalance);
  });

  it('is append-only', async () => {
    const { jobId } = await fundedJob(h);
    await expect(h.db('ledger_entries').where({ job_id: jobId }).update({ amount_cents: 1 })).rejects.toThrow(/append-only/);
    await expect(h.db('ledger_transactions').where({ job_id: jobId }).del()).rejects.toThrow(/append-only/);
  });

  it('a booking with the same reference is made once', async () => {
    const { jobId } = await acceptedJob(h.db);
    oddJobId = jobId;
    const entries = [
      { account: 'processor' as const, amountCents: 10 },
      { account: 'rider_funds_held' as const, amountCents: -10 },
    ];
    const first = await h.db.transaction((trx) => post(trx, { jobId, kind: 'charge', externalRef: `ch_once_${jobId}`, memo: 'm', entries }));
    const second = await h.db.transaction((trx) => post(trx, { jobId, kind: 'charge', externalRef: `ch_once_${jobId}`, memo: 'm', entries }));
    expect([first, second]).toEqual([true, false]);
    // The job is awaiting payment, so 10 cents in escrow is flagged.
    expect(await ledgerProblems(h.db, await jobRow(h.db, jobId))).toEqual([expect.stringMatching(/escrow holds 10/)]);
  });
});

describe('money rules', () => {
  it('rounds the fee half up in whole cents, and a split always adds back to the price', () => {
    expect(referralFeeCents(10_005, 1000)).toBe(1001); // 1000.5 → 1001
    expect(referralFeeCents(10_004, 1000)).toBe(1000);
    expect(referralFeeCents(0, 1000)).toBe(0);
    expect(() => referralFeeCents(1.5, 1000)).toThrow();
    for (const [price, refund, bps] of [
      [54_000, 0, 1000],
      [54_000, 54_000, 1000],
      [99_999, 33_333, 1250],
      [1, 0, 10_000],
    ]) {
      const s = splitFor(price, refund, bps);
      expect(s.refundCents + s.payoutCents + s.feeCents).toBe(price);
    }
    expect(cancellationTerms('building', 'rider', 10_000, 1000).split).toMatchObject({ refundCents: 7_500, shareCents: 2_500, feeCents: 250, payoutCents: 2_250 });
    expect(cancellationTerms('shipped', 'rider', 10_000, 1000).allowed).toBe(false);
  });
});

describe('automatic confirmation', () => {
  it('the worker confirms a shipped job after the waiting period, not before, and pays the builder', async () => {
    const { rider, builder, jobId, priceCents } = await fundedJob(h);
    await startBuild(h.ctx, builder, jobId);
    const shippedAt = new Date();
    await markShipped(h.ctx, builder, jobId, { handover: 'carrier', carrier: 'Parcel Co', trackingNumber: 'AUTO12345' }, shippedAt);
    const day = 86_400_000;
    await runPaymentsTick(h.db, { now: new Date(shippedAt.getTime() + 13 * day), context: h.ctx });
    expect((await jobRow(h.db, jobId)).status).toBe('shipped');
    await runPaymentsTick(h.db, { now: new Date(shippedAt.getTime() + 14 * day + 1000), context: h.ctx });
    const job = await jobRow(h.db, jobId);
    expect(job).toMatchObject({ status: 'completed', completed_by: 'auto' });
    expect((await getJobForViewer(h.ctx, rider, jobId)).payout).toMatchObject({ status: 'paid', amountCents: priceCents - referralFeeCents(priceCents, 1000) });
    expect(await h.db('outbox').where({ kind: 'payment.released', to_email: rider.email }).first('text_body')).toMatchObject({ text_body: expect.stringContaining('confirmed automatically') });
  });
});

describe('reports', () => {
  it('by job and by month add up to the same money, flag nothing, and export to CSV with an audit entry', async () => {
    const done = await fundedJob(h);
    await startBuild(h.ctx, done.builder, done.jobId);
    await markShipped(h.ctx, done.builder, done.jobId, { handover: 'pickup' });
    await confirmReceipt(h.ctx, done.rider, done.jobId);

    const lines = await ledgerByJob(h.db, { limit: 1000 });
    expect(lines.filter((l) => !l.balanced).map((l) => l.jobId)).toEqual([oddJobId]);
    const line = lines.find((l) => l.jobId === done.jobId)!;
    const money = await jobMoney(h.db, done.jobId);
    expect(line).toMatchObject({ chargedCents: money.chargedCents, feesCents: money.feesCents, transferredCents: money.transferredCents, refundedCents: 0, stillHeldCents: 0 });

    const months = await ledgerByMonth(h.db);
    const sum = (k: 'chargedCents' | 'feesCents' | 'transferredCents' | 'refundedCents') => lines.reduce((s, l) => s + l[k], 0);
    const monthSum = (k: 'chargedCents' | 'feesCents' | 'transferredCents' | 'refundedCents') => months.reduce((s, m) => s + m[k], 0);
    for (const k of ['chargedCents', 'feesCents', 'transferredCents', 'refundedCents'] as const) expect(monthSum(k)).toBe(sum(k));
    expect(months[0].month).toMatch(/^\d{4}-\d{2}$/);

    const csv = await ledgerCsv(h.db);
    const rows = csv.trim().split('\r\n');
    expect(rows[0]).toBe('booked_at_utc,job_id,transaction_id,kind,account,debit_cents,credit_cents,reference,memo');
    const mine = rows.filter((r) => r.includes(done.jobId));
    const debit = mine.reduce((s, r) => s + Number(r.split(',')[5] || 0), 0);
    const credit = mine.reduce((s, r) => s + Number(r.split(',')[6] || 0), 0);
    expect(debit).toBe(credit);

    const admin = await makeAdmin(h.db);
    await expect(exportLedgerCsv(h.db, done.rider, {})).rejects.toThrow(Forbidden);
    const exported = await exportLedgerCsv(h.db, admin, { month: months[0].month });
    expect(exported.filename).toBe(`lacewright-ledger-${months[0].month}.csv`);
    const audit = await listAudit(h.db);
    expect(audit[0]).toMatchObject({ adminEmail: admin.email, action: 'ledger.exported', targetId: months[0].month });
  });
});
