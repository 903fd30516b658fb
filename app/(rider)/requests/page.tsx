import { ButtonLink } from '@/components/ui/Button';
import { Card } from '@/components/ui/Card';
import { PageHeading } from '@/components/ui/PageHeading';
import { requirePageUser } from '@/lib/auth/guard';

export const metadata = { title: 'My wheel requests' };

export default async function RiderRequestsPage() {
  const user = await requirePageUser(['rider'], '/requests');
  return (
    <>
      <PageHeading title="My wheel requests" lead={`Signed in as ${user.name}. Requests you post appear here with their bids.`} />
      <Card className="text-center">
        <p className="text-lg font-semibold">No requests yet</p>
        <p className="mt-1 text-ink-500">Start with a fit check: describe the wheel and the frame, and see what it takes.</p>
        <div className="mt-4">
          <ButtonLink href="/fit">Check a fit</ButtonLink>
        </div>
      </Card>
    </>
  );
}
