import Link from 'next/link';
import { StatusBadge } from '@/components/market/StatusBadge';
import { ButtonLink } from '@/components/ui/Button';
import { Card } from '@/components/ui/Card';
import { PageHeading } from '@/components/ui/PageHeading';
import { requirePageUser } from '@/lib/auth/guard';
import { db } from '@/lib/db';
import { formatCents } from '@/lib/format';
import { listRiderRequests } from '@/lib/market/listRiderRequests';

export const metadata = { title: 'My wheel requests' };

export default async function RiderRequestsPage() {
  const user = await requirePageUser(['rider'], '/requests');
  const requests = await listRiderRequests(db, user);
  return (
    <>
      <PageHeading title="My wheel requests" lead="Each request, its bids, and what happens next." actions={<ButtonLink href="/requests/new">Ask for a build</ButtonLink>} />
      {requests.length === 0 ? (
        <Card className="text-center">
          <p className="text-lg font-semibold">No requests yet</p>
          <p className="mt-1 text-ink-500">Describe the wheel you want and builders will bid on it. Not sure it fits? Try the fit check first.</p>
          <div className="mt-4 flex justify-center gap-3">
            <ButtonLink href="/requests/new">Ask for a build</ButtonLink>
            <ButtonLink href="/fit" tone="secondary">
              Check a fit
            </ButtonLink>
          </div>
        </Card>
      ) : (
        <ul className="space-y-3" data-testid="my-requests">
          {requests.map((r) => (
            <li key={r.id}>
              <Card>
                <div className="flex flex-wrap items-center justify-between gap-2">
                  <Link href={`/requests/${r.id}`} className="font-display text-lg font-bold">
                    {r.title}
                  </Link>
                  <StatusBadge status={r.status} />
                </div>
                <p className="mt-1 text-sm text-ink-500">
                  {r.wheels.map((w) => `${w.position} ${w.nominalDiameterIn}″ × ${w.rimWidthMm} mm, ${w.spokes} spokes`).join(' · ')} · needed by {r.neededBy} · budget{' '}
                  {formatCents(r.budgetCents, { whole: true })}
                </p>
                <p className="mt-2 text-sm">
                  {r.liveBidCount > 0 && (
                    <strong>
                      {r.liveBidCount} {r.liveBidCount === 1 ? 'bid' : 'bids'}
                      {r.lowestLiveBidCents !== null && `, lowest ${formatCents(r.lowestLiveBidCents, { whole: true })}`}.{' '}
                    </strong>
                  )}
                  {r.unreadMessages > 0 && <strong className="text-brass-700">{r.unreadMessages} new message(s). </strong>}
                  {r.nextStep}
                </p>
              </Card>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
