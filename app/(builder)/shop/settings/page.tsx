import { notFound } from 'next/navigation';
import { ShopSettingsForm } from '@/components/market/builder/ShopSettingsForm';
import { QueryProvider } from '@/components/providers/QueryProvider';
import { PageHeading } from '@/components/ui/PageHeading';
import { requirePageUser } from '@/lib/auth/guard';
import { db } from '@/lib/db';
import { getShopSettings } from '@/lib/market/shopSettings';

export const metadata = { title: 'Shop settings' };

export default async function ShopSettingsPage() {
  const user = await requirePageUser(['builder'], '/shop/settings');
  if (!user.shopId) notFound();
  const settings = await getShopSettings(db, user);
  return (
    <>
      <PageHeading title="Shop settings" lead={`${settings.name}: what you build, where you are, and how much work you take on.`} />
      <QueryProvider>
        <ShopSettingsForm initial={settings} />
      </QueryProvider>
    </>
  );
}
