import { notFound } from 'next/navigation';
import { Badge } from '@/components/ui/Badge';
import { Card } from '@/components/ui/Card';
import { PageHeading } from '@/components/ui/PageHeading';
import { db } from '@/lib/db';
import { NotFound } from '@/lib/errors';
import { getShopBySlug } from '@/lib/shops/directory';

export default async function ShopPage({ params }: { params: Promise<{ slug: string }> }) {
  const { slug } = await params;
  const shop = await getShopBySlug(db, slug).catch((err) => {
    if (err instanceof NotFound) notFound();
    throw err;
  });
  const c = shop.capabilities;
  return (
    <>
      <PageHeading title={shop.name} lead={`${shop.city}, ${shop.region}`} />
      <div className="grid gap-4 md:grid-cols-[2fr_1fr]">
        <Card>
          <h2 className="text-lg font-bold">About the shop</h2>
          <p className="mt-2 whitespace-pre-line text-ink-700">{shop.bio || 'This shop has not written about itself yet.'}</p>
        </Card>
        <Card>
          <h2 className="text-lg font-bold">Builds</h2>
          <dl className="mt-2 space-y-2 text-sm">
            <div>
              <dt className="text-ink-500">Rim widths</dt>
              <dd>{c.rimWidthsIn?.map((w) => `${w} in`).join(', ') || '—'}</dd>
            </div>
            <div>
              <dt className="text-ink-500">Wheel sizes</dt>
              <dd>{c.diametersIn?.map((d) => `${d} in`).join(', ') || '—'}</dd>
            </div>
            <div>
              <dt className="text-ink-500">Spoke counts</dt>
              <dd>{c.spokeCounts?.join(', ') || '—'}</dd>
            </div>
            <div>
              <dt className="text-ink-500">Gauges</dt>
              <dd>{c.gauges?.join(', ') || '—'}</dd>
            </div>
            <div>
              <dt className="text-ink-500">Finishes</dt>
              <dd className="flex flex-wrap gap-1">{c.finishes?.map((f) => <Badge key={f}>{f}</Badge>) ?? '—'}</dd>
            </div>
            {c.hubDrilling && (
              <div>
                <Badge tone="brass">Drills hub flanges for thicker spokes</Badge>
              </div>
            )}
          </dl>
        </Card>
      </div>
    </>
  );
}

export async function generateMetadata({ params }: { params: Promise<{ slug: string }> }) {
  const { slug } = await params;
  const shop = await getShopBySlug(db, slug).catch(() => null);
  return { title: shop ? shop.name : 'Shop not found' };
}
