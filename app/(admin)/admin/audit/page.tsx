import Link from 'next/link';
import { Card } from '@/components/ui/Card';
import { PageHeading } from '@/components/ui/PageHeading';
import { requirePageUser } from '@/lib/auth/guard';
import { db } from '@/lib/db';
import { listAudit } from '@/lib/payments/audit';

export const metadata = { title: 'Audit log' };
export const dynamic = 'force-dynamic';

const ACTIONS: Record<string, string> = {
  'dispute.resolved': 'Settled a dispute',
  'dispute.note': 'Wrote in a dispute',
  'ledger.exported': 'Exported the ledger',
};

export default async function AuditPage() {
  await requirePageUser(['admin'], '/admin/audit');
  const entries = await listAudit(db, { limit: 300 });
  return (
    <>
      <PageHeading title="Audit log" lead="Every admin action on money: who, when (UTC), what and why. Entries cannot be changed." />
      {entries.length === 0 ? (
        <Card className="text-center text-ink-500">No admin actions yet.</Card>
      ) : (
        <Card className="overflow-x-auto p-0">
          <table className="w-full text-left text-sm" data-testid="audit-table">
            <thead className="border-b border-chalk-200 bg-chalk-50 text-xs uppercase tracking-wide text-ink-500">
              <tr>
                <th className="px-3 py-2">When</th>
                <th className="px-3 py-2">Admin</th>
                <th className="px-3 py-2">Action</th>
                <th className="px-3 py-2">Reason and details</th>
              </tr>
            </thead>
            <tbody>
              {entries.map((e) => (
                <tr key={e.id} className="border-b border-chalk-200 align-top last:border-0">
                  <td className="whitespace-nowrap px-3 py-2 tabular-nums">{e.at.slice(0, 16).replace('T', ' ')}</td>
                  <td className="px-3 py-2">{e.adminEmail}</td>
                  <td className="px-3 py-2">
                    {ACTIONS[e.action] ?? e.action}
                    {e.targetType === 'dispute' && e.targetId && (
                      <Link href={`/admin/disputes/${e.targetId}`} className="block text-xs">
                        the dispute
                      </Link>
                    )}
                    {e.targetType === 'ledger' && <span className="block text-xs text-ink-500">{e.targetId === 'all' ? 'all months' : e.targetId}</span>}
                  </td>
                  <td className="px-3 py-2">
                    {e.reason && <p className="whitespace-pre-wrap">{e.reason}</p>}
                    <p className="break-words text-xs text-ink-500">
                      {Object.entries(e.details)
                        .map(([k, v]) => `${k}: ${typeof v === 'object' ? JSON.stringify(v) : String(v)}`)
                        .join(' · ')}
                    </p>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </Card>
      )}
    </>
  );
}
