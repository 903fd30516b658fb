import { formatCents } from '@/lib/format';
import type { JobView } from '@/lib/payments/jobView';

function Row({ label, value, strong = false, testId }: { label: string; value: string; strong?: boolean; testId?: string }) {
  return (
    <div className="flex items-baseline justify-between gap-4 py-1">
      <dt className="text-sm text-ink-500">{label}</dt>
      <dd className={`tabular-nums ${strong ? 'font-semibold text-ink-900' : 'text-ink-700'}`} data-testid={testId}>
        {value}
      </dd>
    </div>
  );
}

/** Price and fee, then where the money is now, straight from the job's ledger. */
export function MoneySummary({ job }: { job: JobView }) {
  const m = job.money;
  const pct = (job.feeBps / 100).toLocaleString('en-US', { maximumFractionDigits: 2 });
  return (
    <div className="space-y-4">
      <dl className="divide-y divide-chalk-200">
        <Row label="Price (paid by the rider)" value={formatCents(job.priceCents)} strong testId="job-price" />
        <Row label={job.moneyDecided ? 'Referral fee' : `Referral fee (${pct}%)`} value={formatCents(job.feeCents)} testId="job-fee" />
        <Row label={job.moneyDecided ? 'Builder receives' : 'Builder receives on completion'} value={formatCents(job.builderReceivesCents)} testId="job-builder-receives" />
      </dl>
      {m.chargedCents > 0 && (
        <div>
          <h3 className="text-sm font-semibold text-ink-700">Where the money is</h3>
          <dl className="divide-y divide-chalk-200" data-testid="money-now">
            <Row label="Paid in" value={formatCents(m.chargedCents)} />
            {m.heldInEscrowCents > 0 && <Row label="Held in escrow" value={formatCents(m.heldInEscrowCents)} strong testId="held-in-escrow" />}
            {m.owedToRiderCents > 0 && <Row label="Refund on its way to the rider" value={formatCents(m.owedToRiderCents)} />}
            {m.owedToBuilderCents > 0 && <Row label="Payout on its way to the builder" value={formatCents(m.owedToBuilderCents)} />}
            {m.refundedCents > 0 && <Row label="Refunded to the rider" value={formatCents(m.refundedCents)} testId="refunded" />}
            {m.transferredCents > 0 && <Row label="Paid to the builder" value={formatCents(m.transferredCents)} testId="paid-to-builder" />}
            {m.feesCents > 0 && <Row label="Referral fee kept" value={formatCents(m.feesCents)} />}
          </dl>
        </div>
      )}
    </div>
  );
}
