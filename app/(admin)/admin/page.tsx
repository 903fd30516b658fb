import Link from 'next/link';
import { Card } from '@/components/ui/Card';
import { PageHeading } from '@/components/ui/PageHeading';
import { marketplaceCounts } from '@/lib/admin/overview';
import { requirePageUser } from '@/lib/auth/guard';
import { db } from '@/lib/db';

export const metadata = { title: 'Admin' };

export default async function AdminHomePage() {
  await requirePageUser(['admin'], '/admin');
  const counts = await marketplaceCounts(db);
  const tiles = [
    { label: 'Riders', value: counts.riders },
    { label: 'Builders', value: counts.builders },
    { label: 'Shops', value: counts.shops },
    { label: 'Admins', value: counts.admins },
  ];
  return (
    <>
      <PageHeading title="Overview" lead="The state of the marketplace at a glance." />
      <div className="grid gap-4 sm:grid-cols-4">
        {tiles.map((t) => (
          <Card key={t.label}>
            <p className="text-sm text-ink-500">{t.label}</p>
            <p className="font-display text-3xl font-bold">{t.value}</p>
          </Card>
        ))}
      </div>
      <p className="mt-6">
        <Link href="/admin/mailbox">Open the demo mailbox</Link>
      </p>
    </>
  );
}
