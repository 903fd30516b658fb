'use client';

import { MessageThread } from '@/components/market/MessageThread';
import { useRequestDetail } from '@/components/market/builder/api';
import { BidPanel } from '@/components/market/builder/BidPanel';
import { FitSummary, RiderTerms, SpecSheet } from '@/components/market/builder/RequestSpec';
import { Notice } from '@/components/ui/Notice';
import type { RequestDetail } from '@/lib/market/getRequestForViewer';

export function BuilderRequestClient({
  initialDetail,
  shopId,
  distanceMiles,
  matchesCapabilities,
  labourRateCentsPerHour,
}: {
  initialDetail: RequestDetail;
  shopId: string;
  distanceMiles: number;
  matchesCapabilities: boolean;
  labourRateCentsPerHour: number | null;
}) {
  const query = useRequestDetail(initialDetail.id, initialDetail);
  const request = query.data ?? initialDetail;
  return (
    <div className="space-y-6">
      {query.isError && <Notice tone="caution">We could not refresh this request just now; what you see may be a little out of date.</Notice>}
      <Notice tone="caution" title="Before you price it">
        The fit check works from typical part dimensions. Confirm fit with the actual rim, hub and spokes before you build. Drilling hub flanges, very
        heavy wheels and any change to frame spacing follow qualified local practice.
      </Notice>
      <div className="grid gap-6 lg:grid-cols-[minmax(0,6fr)_minmax(0,5fr)]">
        <div className="space-y-6">
          <RiderTerms request={request} distanceMiles={distanceMiles} matchesCapabilities={matchesCapabilities} />
          <FitSummary request={request} />
          <SpecSheet request={request} />
        </div>
        <div className="space-y-6">
          <BidPanel request={request} labourRateCentsPerHour={labourRateCentsPerHour} />
          <MessageThread requestId={request.id} shopId={shopId} viewerSide="shop" title="Messages with the rider" id="messages" />
        </div>
      </div>
    </div>
  );
}
