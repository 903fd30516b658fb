import { notFound } from 'next/navigation';
import { StatusBadge } from '@/components/market/StatusBadge';
import { QueryProvider } from '@/components/providers/QueryProvider';
import { ButtonLink } from '@/components/ui/Button';
import { Card } from '@/components/ui/Card';
import { Notice } from '@/components/ui/Notice';
import { PageHeading } from '@/components/ui/PageHeading';
import { PhotoUploader } from '@/components/uploads/PhotoUploader';
import { VerdictBadge } from '@/components/wheel/FitResultPanel';
import { requirePageUser } from '@/lib/auth/guard';
import { db } from '@/lib/db';
import { NotFound } from '@/lib/errors';
import { formatCents } from '@/lib/format';
import { getRequestForViewer } from '@/lib/market/getRequestForViewer';
import { jobIdForRequest } from '@/lib/market/jobs';
import { lacingLabel } from '@/lib/market/spec';
import { hubById } from '@/lib/wheel';
import { BidComparisonTable, RequestActions, RequestThreads } from './page-client';

export const metadata = { title: 'Wheel request' };

export default async function RequestPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const user = await requirePageUser(['rider', 'admin'], `/requests/${id}`);
  const request = await getRequestForViewer(db, user, id).catch((err) => {
    if (err instanceof NotFound) notFound();
    throw err;
  });
  const jobId = request.status === 'awarded' ? await jobIdForRequest(db, request.id) : null;
  return (
    <QueryProvider>
      <PageHeading
        title={request.title}
        lead={
          <>
            {request.city}, {request.region} · {request.delivery === 'pickup' ? 'local pickup' : 'shipped'} · needed by {request.neededBy} · budget{' '}
            {formatCents(request.budgetCents, { whole: true })}
          </>
        }
        actions={
          <div className="flex items-center gap-2">
            <StatusBadge status={request.status} />
            {request.editable && (
              <ButtonLink href={`/requests/${request.id}/edit`} tone="secondary">
                Edit
              </ButtonLink>
            )}
          </div>
        }
      />
      {request.nextStep && (
        <Notice tone="info">
          {request.nextStep}
          {jobId && (
            <>
              {' '}
              <a href={`/jobs/${jobId}`} data-testid="job-link">
                Go to the job
              </a>
            </>
          )}
        </Notice>
      )}
      <div className="mt-4">
        <RequestActions requestId={request.id} canPublish={request.canPublish} canCancel={request.canCancel} />
      </div>

      <section className="mt-6 grid gap-4 md:grid-cols-2" aria-label="The wheels">
        {request.wheels.map((w, i) => {
          const fit = request.fit[i];
          return (
            <Card key={w.position}>
              <div className="flex items-center justify-between">
                <h2 className="text-lg font-bold">{w.position === 'front' ? 'Front wheel' : 'Rear wheel'}</h2>
                {fit && <VerdictBadge verdict={fit.verdict} />}
              </div>
              <p className="mt-1 text-sm">
                {w.nominalDiameterIn}-inch, {w.rimWidthMm} mm rim, {w.tireWidthMm} mm tire · {w.spokes} spokes, {w.spokeGauge} gauge, {lacingLabel(w.lacing)} · {w.finish}
              </p>
              <p className="text-sm text-ink-500">{hubById(w.hubId).label}</p>
              {fit && (
                <p className="mt-2 text-sm">
                  Spokes {fit.spokeLengthsMm.left} / {fit.spokeLengthsMm.right} mm · baseline {formatCents(fit.baseline.typicalCents, { whole: true })}
                </p>
              )}
              {fit && fit.changes.length > 0 && (
                <ul className="mt-2 list-disc pl-5 text-sm text-amber-700">
                  {fit.changes.map((c) => (
                    <li key={c}>{c}</li>
                  ))}
                </ul>
              )}
            </Card>
          );
        })}
      </section>

      <section className="mt-8" aria-label="Photos">
        <PhotoUploader
          purpose="request_photo"
          subjectId={request.id}
          title="Frame and dropout photos"
          description="Photos of the dropouts, the chainstays near the tire and the bottom-bracket shell help builders check the fit."
        />
      </section>

      <section className="mt-8" aria-labelledby="bids-heading">
        <h2 id="bids-heading" className="mb-3 text-2xl font-bold">
          Bids
        </h2>
        {request.status === 'draft' ? <p className="text-ink-500">Builders cannot see a draft. Publish it to start receiving bids.</p> : <BidComparisonTable requestId={request.id} />}
      </section>

      <section className="mt-8" aria-labelledby="messages-heading">
        <h2 id="messages-heading" className="mb-3 text-2xl font-bold">
          Messages
        </h2>
        <RequestThreads requestId={request.id} viewerSide={user.role === 'admin' ? 'admin' : 'rider'} />
      </section>
    </QueryProvider>
  );
}
