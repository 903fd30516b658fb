'use client';

import { useMutation } from '@tanstack/react-query';
import { useState } from 'react';
import { callApi, PaymentsApiError } from '@/components/payments/api';
import { Button } from '@/components/ui/Button';
import { Notice } from '@/components/ui/Notice';

/** Asks for a fresh single-use setup link and goes to the payment service's page. */
export function PayoutSetupButton({ label, tone = 'primary' }: { label: string; tone?: 'primary' | 'secondary' }) {
  const [error, setError] = useState<string | null>(null);
  const go = useMutation({
    mutationFn: () => callApi<{ url: string }>('/api/shop/payouts', { method: 'POST' }),
    onSuccess: ({ url }) => window.location.assign(url),
    onError: (e) => setError(e instanceof PaymentsApiError ? e.message : 'Something went wrong. Try again.'),
  });
  return (
    <div className="space-y-2">
      {error && <Notice tone="danger">{error}</Notice>}
      <Button tone={tone} onClick={() => go.mutate()} disabled={go.isPending}>
        {go.isPending ? 'Opening the payment service…' : label}
      </Button>
    </div>
  );
}
