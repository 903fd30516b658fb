import Link from 'next/link';
import { notFound } from 'next/navigation';
import { QueryProvider } from '@/components/providers/QueryProvider';
import { PhotoGallery } from '@/components/uploads/PhotoGallery';
import { PageHeading } from '@/components/ui/PageHeading';
import { requirePageUser } from '@/lib/auth/guard';
import { db } from '@/lib/db';
import { NotFound } from '@/lib/errors';
import { loadVisibleRequest } from '@/lib/market/access';
import { matchesCapabilities } from '@/lib/market/board';
import { milesBetween, roundMiles } from '@/lib/market/distance';
import { getRequestForViewer } from '@/lib/market/getRequestForViewer';
import { getShopSettings } from '@/lib/market/shopSettings';
import { listUploads } from '@/lib/storage/listUploads';
import { BuilderRequestClient } from './page-client';

export const metadata = { title: 'Wheel request' };

export default async function BuilderRequestPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const user = await requirePageUser(['builder'], `/board/${id}`);
  if (!user.shopId) notFound();
  const loaded = await Promise.all([getRequestForViewer(db, user, id), loadVisibleRequest(db, user, id), getShopSettings(db, user)]).catch((err: unknown) => {
    if (err instanceof NotFound) return null;
    throw err;
  });
  if (!loaded) notFound();
  const [detail, row, shop] = loaded;
  const { uploads: photos } = await listUploads(db, user, { purpose: 'request_photo', subjectId: id });
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href="/board">← Open requests</Link>
      </p>
      <PageHeading
        title={detail.title}
        lead={`${detail.wheels.length === 2 ? 'A front and rear pair' : `One ${detail.wheels[0].position} wheel`} for a rider in ${detail.city}, ${detail.region}.`}
      />
      <QueryProvider>
        <BuilderRequestClient
          initialDetail={detail}
          shopId={user.shopId}
          distanceMiles={roundMiles(milesBetween(row, shop))}
          matchesCapabilities={matchesCapabilities(detail.wheels, shop.capabilities)}
          labourRateCentsPerHour={shop.labourRateCentsPerHour}
        />
      </QueryProvider>
      <section className="mt-8" aria-labelledby="photos-heading">
        <h2 id="photos-heading" className="mb-3 text-xl font-bold">
          The rider&apos;s photos
        </h2>
        <PhotoGallery photos={photos} label="Rider's photo" emptyText="The rider has not added photos of the frame yet. Ask in the messages if you need them." />
      </section>
    </>
  );
}
