import { RequestForm } from '@/components/market/rider/RequestForm';
import { QueryProvider } from '@/components/providers/QueryProvider';
import { PageHeading } from '@/components/ui/PageHeading';
import { requirePageUser } from '@/lib/auth/guard';

export const metadata = { title: 'Ask for a build' };

export default async function NewRequestPage() {
  await requirePageUser(['rider'], '/requests/new');
  return (
    <>
      <PageHeading title="Ask for a build" lead="Describe the wheel and your frame. Save a draft any time; publish when you are ready for bids." />
      <QueryProvider>
        <RequestForm />
      </QueryProvider>
    </>
  );
}
