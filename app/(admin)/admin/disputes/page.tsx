import Link from 'next/link';
import { Badge } from '@/components/ui/Badge';
import { Card } from '@/components/ui/Card';
import { PageHeading } from '@/components/ui/PageHeading';
import { requirePageUser } from '@/lib/auth/guard';
import { db } from '@/lib/db';
import { formatCents } from '@/lib/format';
import { listDisputes } from '@/lib/payments/disputes';

export const metadata = { title: 'Disputes' };
export const dynamic = 'force-dynamic';

const day = (iso: string) => new Date(iso).toISOString().slice(0, 10);

export default async function DisputesPage() {
  await requirePageUser(['admin'], '/admin/disputes');
  const disputes = await listDisputes(db);
  const open = disputes.filter((d) => d.status === 'open').length;
  return (
    <>
      <PageHeading title="Disputes" lead={`${open} open. While a dispute is open the job's money stays frozen in escrow until you decide.`} />
      {disputes.length === 0 ? (
        <Card className="text-center text-ink-500">No disputes. Good.</Card>
      ) : (
        <Card className="overflow-x-auto p-0">
          <table className="w-full text-left text-sm" data-testid="disputes-table">
            <thead className="border-b border-chalk-200 bg-chalk-50 text-xs uppercase tracking-wide text-ink-500">
              <tr>
                <th className="px-4 py-2">Opened (UTC)</th>
                <th className="px-4 py-2">Job</th>
                <th className="px-4 py-2">Rider · shop</th>
                <th className="px-4 py-2">Reason</th>
                <th className="px-4 py-2 text-right">Held</th>
                <th className="px-4 py-2">Status</th>
              </tr>
            </thead>
            <tbody>
              {disputes.map((d) => (
                <tr key={d.id} className="border-b border-chalk-200 last:border-0">
                  <td className="px-4 py-2 tabular-nums">{day(d.openedAt)}</td>
                  <td className="px-4 py-2">
                    <Link href={`/admin/disputes/${d.id}`} className="font-semibold">
                      {d.title}
                    </Link>
                  </td>
                  <td className="px-4 py-2 text-ink-700">
                    {d.riderName} · {d.shopName}
                  </td>
                  <td className="px-4 py-2 text-ink-700">
                    {d.reasonLabel} <span className="text-xs text-ink-500">(by the {d.openedByRole})</span>
                  </td>
                  <td className="px-4 py-2 text-right tabular-nums">{formatCents(d.priceCents)}</td>
                  <td className="px-4 py-2">{d.status === 'open' ? <Badge tone="rust">Open</Badge> : <Badge tone="moss">Settled: {d.resolution}</Badge>}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </Card>
      )}
    </>
  );
}
