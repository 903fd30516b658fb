import Link from 'next/link';
import { notFound } from 'next/navigation';
import { ReviewList } from '@/components/reviews/ReviewList';
import { InviteToBid } from '@/components/shops/InviteToBid';
import { RatingSummary } from '@/components/shops/RatingSummary';
import { TrackRecord } from '@/components/shops/TrackRecord';
import { Badge } from '@/components/ui/Badge';
import { Card } from '@/components/ui/Card';
import { PageHeading } from '@/components/ui/PageHeading';
import { PhotoGallery } from '@/components/uploads/PhotoGallery';
import { PhotoUploader } from '@/components/uploads/PhotoUploader';
import { currentUser } from '@/lib/auth/guard';
import { db } from '@/lib/db';
import { NotFound } from '@/lib/errors';
import { invitableRequests } from '@/lib/matching/invitations';
import { getShopBySlug } from '@/lib/shops/directory';
import { getShopProfile } from '@/lib/shops/profile';

export const dynamic = 'force-dynamic';

export default async function ShopPage({ params }: { params: Promise<{ slug: string }> }) {
  const { slug } = await params;
  const viewer = await currentUser();
  const shop = await getShopProfile(db, slug, viewer).catch((err) => {
    if (err instanceof NotFound) notFound();
    throw err;
  });
  const c = shop.capabilities;
  const inviteChoices = viewer?.role === 'rider' ? await invitableRequests(db, viewer, shop.slug) : null;
  return (
    <>
      <PageHeading
        title={shop.name}
        lead={`${shop.city}, ${shop.region}${shop.summary ? ` · ${shop.summary}` : ''}`}
        actions={
          shop.rating.average !== null ? (
            <Badge tone="brass">
              {shop.rating.average.toFixed(1)} of 5 · {shop.rating.count} {shop.rating.count === 1 ? 'review' : 'reviews'}
            </Badge>
          ) : undefined
        }
      />
      <div className="grid gap-4 md:grid-cols-[2fr_1fr]">
        <div className="space-y-4">
          <Card>
            <h2 className="text-lg font-bold">About the shop</h2>
            <p className="mt-2 whitespace-pre-line text-ink-700">{shop.bio || 'This shop has not written about itself yet.'}</p>
          </Card>
          <Card>
            {shop.viewerIsMember ? (
              <PhotoUploader purpose="portfolio" subjectId={shop.id} title="Portfolio" description="Wheels your shop has built. Everyone who visits this page sees them." />
            ) : (
              <>
                <h2 className="mb-3 text-lg font-bold">Portfolio</h2>
                <PhotoGallery photos={shop.photos} label="Portfolio photo" emptyText="No photos of finished wheels yet." />
              </>
            )}
          </Card>
          <Card>
            <h2 className="mb-3 text-lg font-bold">What riders say</h2>
            <ReviewList reviews={shop.reviews} emptyText="No reviews yet." />
          </Card>
        </div>
        <div className="space-y-4">
          <Card>
            <h2 className="mb-3 text-lg font-bold">Rating</h2>
            <RatingSummary rating={shop.rating} />
          </Card>
          <Card>
            <h2 className="mb-3 text-lg font-bold">Track record</h2>
            <TrackRecord completedBuilds={shop.completedBuilds} leadTime={shop.leadTime} />
          </Card>
          <Card>
            <h2 className="text-lg font-bold">Invite to bid</h2>
            <div className="mt-3">
              {inviteChoices ? (
                <InviteToBid shopSlug={shop.slug} shopName={shop.name} requests={inviteChoices} />
              ) : viewer ? (
                <p className="text-sm text-ink-500">Riders can invite this shop to bid on their open requests.</p>
              ) : (
                <p className="text-sm text-ink-500">
                  <Link href={`/sign-in?callbackUrl=${encodeURIComponent(`/shops/${shop.slug}`)}`}>Sign in as a rider</Link> to invite this shop to bid on one of your requests.
                </p>
              )}
            </div>
          </Card>
          <Card>
            <h2 className="text-lg font-bold">Builds</h2>
            <dl className="mt-2 space-y-2 text-sm">
              <div>
                <dt className="text-ink-500">Rim widths</dt>
                <dd>{c.rimWidthsIn.map((w) => `${w} in`).join(', ') || '—'}</dd>
              </div>
              <div>
                <dt className="text-ink-500">Wheel sizes</dt>
                <dd>{c.diametersIn.map((d) => `${d} in`).join(', ') || '—'}</dd>
              </div>
              <div>
                <dt className="text-ink-500">Spoke counts</dt>
                <dd>{c.spokeCounts.join(', ') || '—'}</dd>
              </div>
              <div>
                <dt className="text-ink-500">Gauges</dt>
                <dd>{c.gauges.join(', ') || '—'}</dd>
              </div>
              <div>
                <dt className="text-ink-500">Finishes</dt>
                <dd className="flex flex-wrap gap-1">{c.finishes.length ? c.finishes.map((f) => <Badge key={f}>{f}</Badge>) : '—'}</dd>
              </div>
              {c.hubDrilling && (
                <div>
                  <dt className="sr-only">Hub drilling</dt>
                  <dd>
                    <Badge tone="brass">Drills hub flanges for thicker spokes</Badge>
                  </dd>
                </div>
              )}
            </dl>
            <p className="mt-3 text-xs text-ink-500">
              What a shop lists is its own word. Drilled flanges, heavy spokes and wide rims need a qualified builder to check your actual hub, frame and brakes before building.
            </p>
          </Card>
        </div>
      </div>
    </>
  );
}

export async function generateMetadata({ params }: { params: Promise<{ slug: string }> }) {
  const { slug } = await params;
  const shop = await getShopBySlug(db, slug).catch(() => null);
  return { title: shop ? shop.name : 'Shop not found' };
}
