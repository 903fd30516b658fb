import { MyBidsTable } from '@/components/market/builder/MyBidsTable';
import { QueryProvider } from '@/components/providers/QueryProvider';
import { PageHeading } from '@/components/ui/PageHeading';
import { requirePageUser } from '@/lib/auth/guard';

export const metadata = { title: 'My bids' };

export default async function MyBidsPage() {
  await requirePageUser(['builder'], '/bids');
  return (
    <>
      <PageHeading title="My bids" lead="Every bid your shop has sent, newest first, with where it stands and any messages you have not read." />
      <QueryProvider>
        <MyBidsTable />
      </QueryProvider>
    </>
  );
}
