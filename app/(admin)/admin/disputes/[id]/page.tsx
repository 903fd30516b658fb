import Link from 'next/link';
import { notFound } from 'next/navigation';
import { QueryProvider } from '@/components/providers/QueryProvider';
import { PageHeading } from '@/components/ui/PageHeading';
import { requirePageUser } from '@/lib/auth/guard';
import { NotFound } from '@/lib/errors';
import { paymentsContext } from '@/lib/payments/defaultContext';
import { getDisputeForAdmin } from '@/lib/payments/disputes';
import { DisputeReview } from './page-client';

export const metadata = { title: 'Dispute' };
export const dynamic = 'force-dynamic';

export default async function DisputePage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const admin = await requirePageUser(['admin'], `/admin/disputes/${id}`);
  const dispute = await getDisputeForAdmin(paymentsContext(), admin, id).catch((err) => {
    if (err instanceof NotFound) notFound();
    throw err;
  });
  return (
    <QueryProvider>
      <PageHeading
        title={`Dispute: ${dispute.job.title}`}
        lead={
          <>
            {dispute.job.riderName} with {dispute.job.shopName} · <Link href={`/jobs/${dispute.job.id}`}>open the job</Link> · <Link href="/admin/disputes">all disputes</Link>
          </>
        }
      />
      <DisputeReview initial={dispute} />
    </QueryProvider>
  );
}
