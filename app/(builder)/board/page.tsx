import { Card } from '@/components/ui/Card';
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
      <PageHeading title="Open requests" lead={shop ? `${shop.name}, ${shop.city}, ${shop.region}` : 'Your account is not linked to a shop yet.'} />
      <Card className="text-center">
        <p className="text-lg font-semibold">No open requests match your shop right now</p>
        <p className="mt-1 text-ink-500">When riders post wheel requests that your shop can build, they show up here.</p>
      </Card>
    </>
  );
}
