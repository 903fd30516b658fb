'use client';

import { useEffect, useState } from 'react';
import { useMutation } from '@tanstack/react-query';
import { callApi, PaymentsApiError } from '@/components/payments/api';
import { useJob } from '@/components/payments/useJob';
import { Button, ButtonLink } from '@/components/ui/Button';
import { Card } from '@/components/ui/Card';
import { Notice } from '@/components/ui/Notice';
import { Spinner } from '@/components/ui/Spinner';
import { formatCents } from '@/lib/format';
import type { JobView } from '@/lib/payments/jobView';

const SLOW_AFTER_MS = 30_000;

/** Waits for the webhook to mark the job paid; shows a decline plainly with a way to try again. */
export function PaymentReturn({ initial, outcome }: { initial: JobView; outcome: 'succeeded' | 'failed' | 'unknown' }) {
  const [slow, setSlow] = useState(false);
  const [retryError, setRetryError] = useState<string | null>(null);
  const waiting = (j: JobView | undefined) => j?.status === 'awaiting_payment' && (outcome !== 'failed' || !j.payment?.lastError);
  const { data } = useJob(initial.id, initial, (j) => (waiting(j) ? 1_500 : false));
  const job = data ?? initial;
  useEffect(() => {
    const t = setTimeout(() => setSlow(true), SLOW_AFTER_MS);
    return () => clearTimeout(t);
  }, []);
  const retry = useMutation({
    mutationFn: () => callApi<{ redirectUrl: string }>(`/api/jobs/${job.id}/pay`, { method: 'POST' }),
    onSuccess: ({ redirectUrl }) => window.location.assign(redirectUrl),
    onError: (e) => setRetryError(e instanceof PaymentsApiError ? e.message : 'Something went wrong. Try again.'),
  });
  const back = <ButtonLink href={`/jobs/${job.id}`} tone="secondary">Back to the job</ButtonLink>;

  if (job.status !== 'awaiting_payment') {
    const paid = job.money.chargedCents > 0;
    return (
      <Card className="space-y-3">
        <Notice tone="success" title={paid ? 'Payment received' : 'This job has moved on'}>
          <span data-testid="payment-outcome">
            {paid ? `${formatCents(job.priceCents)} is held in escrow. ${job.shop.name} has been told they can start; they are paid only when you confirm you have the wheel.` : job.nextStep}
          </span>
        </Notice>
        <ButtonLink href={`/jobs/${job.id}`}>Open the job</ButtonLink>
      </Card>
    );
  }

  if (outcome === 'failed') {
    const reason = job.payment?.lastError;
    return (
      <Card className="space-y-3">
        <Notice tone="danger" title="Your payment did not go through">
          <span data-testid="payment-error">{reason ?? 'Your card was declined.'} No money was taken and the job is still waiting for payment.</span>
        </Notice>
        <p className="text-sm text-ink-700">Check the card details, or try another card. If your bank keeps declining, it can tell you why.</p>
        {retryError && <Notice tone="danger">{retryError}</Notice>}
        <div className="flex gap-2">
          <Button onClick={() => retry.mutate()} disabled={retry.isPending}>
            Try again
          </Button>
          {back}
        </div>
      </Card>
    );
  }

  return (
    <Card className="space-y-3">
      <Spinner label="Confirming your payment with the payment service…" />
      <p className="text-sm text-ink-700">This usually takes a few seconds. Please do not pay again: this page updates by itself.</p>
      {slow && (
        <Notice tone="caution" title="Still waiting">
          The payment service has not confirmed yet. Nothing is lost: if your card was charged, the job updates as soon as the confirmation arrives and we e-mail you. You can leave this page.
        </Notice>
      )}
      {back}
    </Card>
  );
}
