import Link from 'next/link';
import { Badge } from '@/components/ui/Badge';
import { Card } from '@/components/ui/Card';
import { Notice } from '@/components/ui/Notice';
import { PageHeading } from '@/components/ui/PageHeading';
import { requirePageUser } from '@/lib/auth/guard';
import { db } from '@/lib/db';
import { formatCents } from '@/lib/format';
import { ledgerByJob, ledgerByMonth } from '@/lib/payments/ledgerReports';

export const metadata = { title: 'Ledger' };
export const dynamic = 'force-dynamic';

const th = 'px-3 py-2 text-right';
const td = 'px-3 py-2 text-right tabular-nums';

export default async function LedgerPage() {
  await requirePageUser(['admin'], '/admin/ledger');
  const [jobs, months] = await Promise.all([ledgerByJob(db), ledgerByMonth(db)]);
  const unbalanced = jobs.filter((j) => !j.balanced);
  return (
    <>
      <PageHeading
        title="Ledger"
        lead="Every charge, hold, fee, transfer and refund as balanced double entries. For each job: charged = transferred + fees + refunded + still held."
        actions={
          <a href="/api/admin/ledger/export" className="text-sm font-semibold" download>
            Download all entries (CSV)
          </a>
        }
      />
      {unbalanced.length > 0 ? (
        <Notice tone="danger" title="Some books do not balance">
          {unbalanced.length} job(s) need a look: {unbalanced.map((j) => j.problems.join('; ')).join(' | ')}
        </Notice>
      ) : (
        <Notice tone="success">
          <span data-testid="ledger-balanced">Every job&apos;s books balance.</span>
        </Notice>
      )}

      <h2 className="mb-2 mt-6 text-xl font-bold">By month (UTC)</h2>
      <Card className="overflow-x-auto p-0">
        <table className="w-full text-sm" data-testid="ledger-months">
          <thead className="border-b border-chalk-200 bg-chalk-50 text-xs uppercase tracking-wide text-ink-500">
            <tr>
              <th className="px-3 py-2 text-left">Month</th>
              <th className={th}>Charged</th>
              <th className={th}>Fees</th>
              <th className={th}>Transferred</th>
              <th className={th}>Refunded</th>
              <th className={th}>Change in held</th>
              <th className="px-3 py-2 text-left">Export</th>
            </tr>
          </thead>
          <tbody>
            {months.length === 0 && (
              <tr>
                <td colSpan={7} className="px-3 py-4 text-center text-ink-500">
                  No money has moved yet.
                </td>
              </tr>
            )}
            {months.map((m) => (
              <tr key={m.month} className="border-b border-chalk-200 last:border-0">
                <td className="px-3 py-2 font-semibold">{m.month}</td>
                <td className={td}>{formatCents(m.chargedCents)}</td>
                <td className={td}>{formatCents(m.feesCents)}</td>
                <td className={td}>{formatCents(m.transferredCents)}</td>
                <td className={td}>{formatCents(m.refundedCents)}</td>
                <td className={td}>{formatCents(m.heldChangeCents)}</td>
                <td className="px-3 py-2">
                  <a href={`/api/admin/ledger/export?month=${m.month}`} download>
                    CSV
                  </a>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </Card>

      <h2 className="mb-2 mt-6 text-xl font-bold">By job</h2>
      <Card className="overflow-x-auto p-0">
        <table className="w-full text-sm" data-testid="ledger-jobs">
          <thead className="border-b border-chalk-200 bg-chalk-50 text-xs uppercase tracking-wide text-ink-500">
            <tr>
              <th className="px-3 py-2 text-left">Job</th>
              <th className="px-3 py-2 text-left">Status</th>
              <th className={th}>Charged</th>
              <th className={th}>Transferred</th>
              <th className={th}>Fees</th>
              <th className={th}>Refunded</th>
              <th className={th}>Still held</th>
              <th className="px-3 py-2 text-left">Books</th>
            </tr>
          </thead>
          <tbody>
            {jobs.map((j) => (
              <tr key={j.jobId} className="border-b border-chalk-200 last:border-0" data-job={j.jobId}>
                <td className="px-3 py-2">
                  <Link href={`/jobs/${j.jobId}`}>{j.title}</Link>
                  <span className="block text-xs text-ink-500">{j.shopName}</span>
                </td>
                <td className="px-3 py-2 text-ink-700">{j.statusLabel}</td>
                <td className={td}>{formatCents(j.chargedCents)}</td>
                <td className={td}>{formatCents(j.transferredCents)}</td>
                <td className={td}>{formatCents(j.feesCents)}</td>
                <td className={td}>{formatCents(j.refundedCents)}</td>
                <td className={td}>{formatCents(j.stillHeldCents)}</td>
                <td className="px-3 py-2">{j.balanced ? <Badge tone="moss">Balanced</Badge> : <Badge tone="rust">Check</Badge>}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </Card>
    </>
  );
}
