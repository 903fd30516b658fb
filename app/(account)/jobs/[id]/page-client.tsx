'use client';

import Link from 'next/link';
import { useMutation } from '@tanstack/react-query';
import { useState } from 'react';
import { callApi, formatDay, PaymentsApiError } from '@/components/payments/api';
import { DisputeForm } from '@/components/payments/DisputeForm';
import { DisputeThread } from '@/components/payments/DisputeThread';
import { JobStatusBadge } from '@/components/payments/JobStatusBadge';
import { MoneySummary } from '@/components/payments/MoneySummary';
import { RefundPolicy } from '@/components/payments/RefundPolicy';
import { ShipForm } from '@/components/payments/ShipForm';
import { Timeline } from '@/components/payments/Timeline';
import { useJob, useSetJob } from '@/components/payments/useJob';
import { Button, ButtonLink } from '@/components/ui/Button';
import { Card } from '@/components/ui/Card';
import { Notice } from '@/components/ui/Notice';
import { formatCents } from '@/lib/format';
import type { JobView } from '@/lib/payments/jobView';
import type { DisputeInput, ShipInput } from '@/lib/payments/schema';

type Act =
  | { kind: 'pay' }
  | { kind: 'start' }
  | { kind: 'ship'; input: ShipInput }
  | { kind: 'confirm' }
  | { kind: 'cancel' }
  | { kind: 'dispute'; input: DisputeInput }
  | { kind: 'note'; body: string };

function ErrorNotice({ error }: { error: PaymentsApiError }) {
  const title = error.status === 503 ? 'The payment service is not answering' : error.status === 409 ? 'That step is not possible right now' : 'That did not work';
  return (
    <Notice tone="danger" title={title}>
      <span data-testid="action-error">{error.message}</span>
    </Notice>
  );
}

/** The status in the page heading, kept in step with the panel below. */
export function LiveJobStatus({ initial }: { initial: JobView }) {
  const { data } = useJob(initial.id, initial);
  const job = data ?? initial;
  return <JobStatusBadge status={job.status} label={job.statusLabel} />;
}

/** The job page's live part: the status, what happens next, and the buttons this viewer may press. */
export function JobPanel({ initial }: { initial: JobView }) {
  // While a payment is in and the webhook has not landed yet, keep looking.
  const query = useJob(initial.id, initial, (j) => (j?.status === 'awaiting_payment' && j.payment?.status === 'succeeded' ? 2_000 : false));
  const setJob = useSetJob(initial.id);
  const job = query.data ?? initial;
  const [error, setError] = useState<PaymentsApiError | null>(null);
  const [confirming, setConfirming] = useState<'cancel' | 'confirm' | null>(null);
  const [disputing, setDisputing] = useState(false);

  const act = useMutation({
    mutationFn: async (a: Act): Promise<JobView | { redirectUrl: string }> => {
      const base = `/api/jobs/${job.id}`;
      switch (a.kind) {
        case 'pay':
          return callApi<{ redirectUrl: string }>(`${base}/pay`, { method: 'POST' });
        case 'ship':
          return callApi<JobView>(`${base}/ship`, { method: 'POST', json: a.input });
        case 'dispute':
          return callApi<JobView>(`${base}/dispute`, { method: 'POST', json: a.input });
        case 'cancel':
          return callApi<JobView>(`${base}/cancel`, { method: 'POST', json: {} });
        case 'note':
          await callApi(`${base}/dispute/notes`, { method: 'POST', json: { body: a.body } });
          return callApi<JobView>(base);
        default:
          return callApi<JobView>(`${base}/${a.kind}`, { method: 'POST' });
      }
    },
    onMutate: () => setError(null),
    onSuccess: (result) => {
      if ('redirectUrl' in result) {
        window.location.assign(result.redirectUrl);
        return;
      }
      setJob(result);
      setConfirming(null);
      setDisputing(false);
    },
    onError: (e) => {
      setError(e instanceof PaymentsApiError ? e : new PaymentsApiError(0, 'Something went wrong. Try again.'));
      void query.refetch();
    },
  });
  const busy = act.isPending;
  const a = job.actions;
  const declined = job.status === 'awaiting_payment' && job.payment?.status === 'requires_payment_method' && job.payment.lastError;

  return (
    <div className="grid gap-6 lg:grid-cols-3">
      <div className="space-y-4 lg:col-span-2">
        <Notice tone={job.status === 'disputed' ? 'caution' : 'info'} title="What happens next">
          <span data-testid="next-step">{job.nextStep}</span>
        </Notice>
        {declined && (
          <Notice tone="danger" title="Your last payment did not go through">
            <span data-testid="payment-error">{job.payment!.lastError} No money was taken. Try again, with another card if it keeps happening.</span>
          </Notice>
        )}
        {error && <ErrorNotice error={error} />}

        <Card className="space-y-4">
          <h2 className="text-lg font-bold">Your part</h2>

          {job.viewer === 'rider' && job.status === 'awaiting_payment' && (
            <div className="space-y-3">
              <p className="text-sm text-ink-700">
                You pay {formatCents(job.priceCents)} into escrow on the payment service&apos;s own page. We hold it; {job.shop.name} is paid only when you confirm you have the wheel.
              </p>
              <Notice tone="caution">Pay only through Lacewright. Money sent to a builder directly, by transfer or in cash, is not protected by escrow and we cannot get it back.</Notice>
              <Button onClick={() => act.mutate({ kind: 'pay' })} disabled={!a.pay || busy} data-testid="pay">
                {busy ? 'Opening the payment page…' : declined ? `Try again: pay ${formatCents(job.priceCents)}` : `Pay ${formatCents(job.priceCents)} into escrow`}
              </Button>
              {!job.payoutsReady && <p className="text-sm text-ink-500">Paying opens once the builder has finished setting up payouts.</p>}
            </div>
          )}

          {a.setUpPayouts && (
            <div className="space-y-2">
              <p className="text-sm text-ink-700">The rider cannot pay until your shop can receive payouts. It takes a few minutes on the payment service&apos;s page.</p>
              <ButtonLink href="/payouts">Set up payouts first</ButtonLink>
            </div>
          )}

          {job.viewer === 'builder' && job.status === 'awaiting_payment' && job.payoutsReady && (
            <Notice tone="caution">Do not order parts or start work until this job shows as paid into escrow.</Notice>
          )}

          {a.startBuild && (
            <div className="space-y-2">
              <p className="text-sm text-ink-700">
                The money is in escrow. Once you start, a cancellation by the rider still pays you part of the price (see the policy below).
              </p>
              <Button onClick={() => act.mutate({ kind: 'start' })} disabled={busy}>
                Start the build
              </Button>
            </div>
          )}

          {a.ship && <ShipForm pickupRequested={job.delivery === 'pickup'} busy={busy} onSubmit={(input) => act.mutate({ kind: 'ship', input })} serverErrors={error?.fieldErrors} />}

          {job.handover && (
            <p className="text-sm text-ink-700" data-testid="handover">
              {job.handover.method === 'pickup' ? 'Ready for pickup at the shop.' : `Shipped with ${job.handover.carrier}, tracking number ${job.handover.trackingNumber}.`}
              {job.autoConfirmAt && ` Receipt is confirmed automatically on ${formatDay(job.autoConfirmAt)} unless a dispute is opened.`}
            </p>
          )}

          {a.confirm && confirming !== 'confirm' && (
            <Button onClick={() => setConfirming('confirm')} disabled={busy}>
              I have the wheel: confirm receipt
            </Button>
          )}
          {a.confirm && confirming === 'confirm' && (
            <div className="space-y-2 rounded border border-brass-300 bg-brass-100 p-3" role="group" aria-label="Confirm receipt">
              <p className="text-sm text-ink-900">
                Confirm only after you have checked the wheel: spokes evenly tight, rim true, hub turning freely, and it fits your frame. Confirming releases {formatCents(job.builderReceivesCents)} to the builder and cannot be undone.
                Have a qualified mechanic check the brakes and the fit before you ride.
              </p>
              <div className="flex gap-2">
                <Button onClick={() => act.mutate({ kind: 'confirm' })} disabled={busy}>
                  Yes, release the money
                </Button>
                <Button tone="quiet" onClick={() => setConfirming(null)}>
                  Not yet
                </Button>
              </div>
            </div>
          )}

          {a.cancel && confirming !== 'cancel' && (
            <Button tone="quiet" onClick={() => setConfirming('cancel')} disabled={busy}>
              Cancel this job
            </Button>
          )}
          {a.cancel && confirming === 'cancel' && (
            <div className="space-y-2 rounded border border-rust-500 bg-rust-50 p-3" role="group" aria-label="Cancel this job">
              <p className="text-sm text-rust-700" data-testid="cancel-terms">
                {a.cancel.summary}
              </p>
              <div className="flex gap-2">
                <Button tone="danger" onClick={() => act.mutate({ kind: 'cancel' })} disabled={busy}>
                  Cancel the job
                </Button>
                <Button tone="quiet" onClick={() => setConfirming(null)}>
                  Keep it
                </Button>
              </div>
            </div>
          )}

          {a.dispute && !disputing && (
            <Button tone="secondary" onClick={() => setDisputing(true)} disabled={busy}>
              Open a dispute
            </Button>
          )}
          {a.dispute && disputing && <DisputeForm busy={busy} onSubmit={(input) => act.mutate({ kind: 'dispute', input })} onCancel={() => setDisputing(false)} />}

          {job.viewer === 'admin' && job.dispute && (
            <p className="text-sm">
              <Link href={`/admin/disputes/${job.dispute.id}`}>Review this dispute</Link>
            </p>
          )}
          {!a.pay && !a.setUpPayouts && !a.startBuild && !a.ship && !a.confirm && !a.cancel && !a.dispute && job.viewer !== 'rider' && job.status !== 'awaiting_payment' && (
            <p className="text-sm text-ink-500">Nothing for you to do right now.</p>
          )}
        </Card>

        {job.dispute && (
          <Card className="space-y-3">
            <h2 className="text-lg font-bold">Dispute</h2>
            <DisputeThread dispute={job.dispute} busy={busy} onAdd={(body) => act.mutate({ kind: 'note', body })} />
          </Card>
        )}

        {(job.refunds.length > 0 || job.payout) && (
          <Card className="space-y-2">
            <h2 className="text-lg font-bold">Refunds and payouts</h2>
            <ul className="space-y-1 text-sm">
              {job.refunds.map((r, i) => (
                <li key={i}>
                  Refund of {formatCents(r.amountCents)} to the rider: {r.status === 'succeeded' ? `sent ${formatDay(r.at)}` : 'on its way (we retry automatically if the payment service is busy)'}
                </li>
              ))}
              {job.payout && (
                <li>
                  Payout of {formatCents(job.payout.amountCents)} to {job.shop.name} (after a {formatCents(job.payout.feeCents)} referral fee):{' '}
                  {job.payout.status === 'paid' ? `sent ${formatDay(job.payout.paidAt)}` : 'on its way (we retry automatically if the payment service is busy)'}
                  {job.payout.lastError && <span className="block text-xs text-rust-700">Last attempt: {job.payout.lastError}</span>}
                </li>
              )}
            </ul>
          </Card>
        )}

        <RefundPolicy />
      </div>

      <div className="space-y-4">
        <Card>
          <div className="mb-3 flex items-center justify-between">
            <h2 className="text-lg font-bold">Money</h2>
            <JobStatusBadge status={job.status} label={job.statusLabel} />
          </div>
          <MoneySummary job={job} />
        </Card>
        <Card>
          <h2 className="mb-3 text-lg font-bold">Progress</h2>
          <Timeline steps={job.timeline} />
        </Card>
        <p className="text-sm">
          <Link href="/jobs">All your jobs</Link>
        </p>
      </div>
    </div>
  );
}
