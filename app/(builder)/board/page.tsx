import { BoardTable } from '@/components/market/builder/BoardTable';
import { QueryProvider } from '@/components/providers/QueryProvider';
import { ButtonLink } from '@/components/ui/Button';
import { PageHeading } from '@/components/ui/PageHeading';
import { requirePageUser } from '@/lib/auth/guard';
import { db } from '@/lib/db';
import { getShop } from '@/lib/shops/shops';

export const metadata = { title: 'Open requests' };

export default async function BuilderBoardPage() {
  const user = await requirePageUser(['builder'], '/board');
  const shop = user.shopId ? await getShop(db, user.shopId) : null;
  return (
    <>
      <PageHeading
        title="Open requests"
        lead={
          shop
            ? `Wheel requests riders have published, seen from ${shop.name} in ${shop.city}, ${shop.region}. Open one to read the full spec and bid.`
            : 'Your account is not linked to a shop yet.'
        }
        actions={shop ? <ButtonLink href="/shop/settings" tone="secondary">What your shop builds</ButtonLink> : undefined}
      />
      {shop && (
        <QueryProvider>
          <BoardTable />
        </QueryProvider>
      )}
    </>
  );
}
