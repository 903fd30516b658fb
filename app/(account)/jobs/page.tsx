import Link from 'next/link';
import { JobStatusBadge } from '@/components/payments/JobStatusBadge';
import { Card } from '@/components/ui/Card';
import { PageHeading } from '@/components/ui/PageHeading';
import { requirePageUser } from '@/lib/auth/guard';
import { formatCents } from '@/lib/format';
import { paymentsContext } from '@/lib/payments/defaultContext';
import { listJobsForViewer } from '@/lib/payments/jobView';

export const metadata = { title: 'My jobs' };
export const dynamic = 'force-dynamic';

export default async function JobsPage() {
  const user = await requirePageUser(undefined, '/jobs');
  const jobs = await listJobsForViewer(paymentsContext(), user);
  const lead =
    user.role === 'rider'
      ? 'Wheels you have accepted a bid for: pay into escrow, follow the build, confirm when it arrives.'
      : user.role === 'builder'
        ? 'Accepted bids for your shop: start when paid, ship, and get paid when the rider confirms.'
        : 'Every job on the marketplace, newest activity first.';
  return (
    <>
      <PageHeading title={user.role === 'admin' ? 'All jobs' : 'My jobs'} lead={lead} />
      {jobs.length === 0 ? (
        <Card className="text-center text-ink-500">No jobs yet. A job starts when a rider accepts a bid.</Card>
      ) : (
        <Card className="overflow-x-auto p-0">
          <table className="w-full text-left text-sm" data-testid="jobs-table">
            <thead className="border-b border-chalk-200 bg-chalk-50 text-xs uppercase tracking-wide text-ink-500">
              <tr>
                <th className="px-4 py-2">Job</th>
                <th className="px-4 py-2">{user.role === 'rider' ? 'Shop' : user.role === 'builder' ? 'Rider' : 'Rider · shop'}</th>
                <th className="px-4 py-2 text-right">Price</th>
                <th className="px-4 py-2">Status</th>
              </tr>
            </thead>
            <tbody>
              {jobs.map((j) => (
                <tr key={j.id} className="border-b border-chalk-200 last:border-0">
                  <td className="px-4 py-2">
                    <Link href={`/jobs/${j.id}`} className="font-semibold">
                      {j.title}
                    </Link>
                    {j.needsYou && <span className="ml-2 text-xs font-semibold text-brass-700">needs you</span>}
                  </td>
                  <td className="px-4 py-2 text-ink-700">{j.otherParty}</td>
                  <td className="px-4 py-2 text-right tabular-nums">{formatCents(j.priceCents)}</td>
                  <td className="px-4 py-2">
                    <JobStatusBadge status={j.status} label={j.statusLabel} />
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
