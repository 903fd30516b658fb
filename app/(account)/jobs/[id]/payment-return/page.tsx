import { notFound } from 'next/navigation';
import { QueryProvider } from '@/components/providers/QueryProvider';
import { PageHeading } from '@/components/ui/PageHeading';
import { requirePageUser } from '@/lib/auth/guard';
import { NotFound } from '@/lib/errors';
import { paymentsContext } from '@/lib/payments/defaultContext';
import { getJobForViewer } from '@/lib/payments/jobView';
import { PaymentReturn } from './page-client';

export const metadata = { title: 'Confirming your payment' };
export const dynamic = 'force-dynamic';

// Where the payment page sends the rider back. The redirect says how the card went; only the payment
// service's webhook marks the job paid, so this page waits for that and says what it sees.
export default async function PaymentReturnPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { id } = await params;
  const query = await searchParams;
  const user = await requirePageUser(undefined, `/jobs/${id}`);
  const job = await getJobForViewer(paymentsContext(), user, id).catch((err) => {
    if (err instanceof NotFound) notFound();
    throw err;
  });
  const outcome = query.redirect_status === 'failed' ? 'failed' : query.redirect_status === 'succeeded' ? 'succeeded' : 'unknown';
  return (
    <QueryProvider>
      <PageHeading title="Your payment" lead={job.title} />
      <PaymentReturn initial={job} outcome={outcome} />
    </QueryProvider>
  );
}
