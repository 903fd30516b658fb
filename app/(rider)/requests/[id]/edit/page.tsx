import { notFound, redirect } from 'next/navigation';
import { RequestForm } from '@/components/market/rider/RequestForm';
import { QueryProvider } from '@/components/providers/QueryProvider';
import { PageHeading } from '@/components/ui/PageHeading';
import { requirePageUser } from '@/lib/auth/guard';
import { db } from '@/lib/db';
import { NotFound } from '@/lib/errors';
import { getRequestForViewer } from '@/lib/market/getRequestForViewer';

export const metadata = { title: 'Edit request' };

export default async function EditRequestPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const user = await requirePageUser(['rider'], `/requests/${id}/edit`);
  const request = await getRequestForViewer(db, user, id).catch((err) => {
    if (err instanceof NotFound) notFound();
    throw err;
  });
  if (!request.editable) redirect(`/requests/${id}`);
  const initial = {
    title: request.title,
    wheels: request.wheels,
    frame: request.frame,
    zip: request.zip,
    delivery: request.delivery,
    neededBy: request.neededBy,
    budgetCents: request.budgetCents,
    notes: request.notes,
  };
  return (
    <>
      <PageHeading title="Edit request" lead="You can change the details until the first bid arrives." />
      <QueryProvider>
        <RequestForm initial={initial} mode={{ kind: 'edit', requestId: id }} />
      </QueryProvider>
    </>
  );
}
