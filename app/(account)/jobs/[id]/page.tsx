import { notFound } from 'next/navigation';
import { QueryProvider } from '@/components/providers/QueryProvider';
import { ReviewForm } from '@/components/reviews/ReviewForm';
import { Card } from '@/components/ui/Card';
import { PageHeading } from '@/components/ui/PageHeading';
import { requirePageUser } from '@/lib/auth/guard';
import { NotFound } from '@/lib/errors';
import { paymentsContext } from '@/lib/payments/defaultContext';
import { getJobForViewer } from '@/lib/payments/jobView';
import { JobPanel, LiveJobStatus } from './page-client';

export const metadata = { title: 'Job' };
export const dynamic = 'force-dynamic';

export default async function JobPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const user = await requirePageUser(undefined, `/jobs/${id}`);
  const job = await getJobForViewer(paymentsContext(), user, id).catch((err) => {
    if (err instanceof NotFound) notFound();
    throw err;
  });
  const who = job.viewer === 'rider' ? `Built by ${job.shop.name}` : job.viewer === 'builder' ? `For ${job.riderName}` : `${job.riderName} with ${job.shop.name}`;
  return (
    <QueryProvider>
      <PageHeading title={job.title} lead={`${who} · ${job.delivery === 'pickup' ? 'local pickup' : 'shipped'}`} actions={<LiveJobStatus initial={job} />} />
      <JobPanel initial={job} />
      {job.status === 'completed' && job.viewer !== 'admin' && (
        <Card className="mt-6">
          <ReviewForm jobId={job.id} side={job.viewer === 'rider' ? 'rider' : 'shop'} />
        </Card>
      )}
    </QueryProvider>
  );
}
