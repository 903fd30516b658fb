'use client';

import { useMutation } from '@tanstack/react-query';
import { useState } from 'react';
import { callApi, formatWhen, PaymentsApiError } from '@/components/payments/api';
import { DisputeThread } from '@/components/payments/DisputeThread';
import { Button } from '@/components/ui/Button';
import { Card } from '@/components/ui/Card';
import { TextField } from '@/components/ui/Field';
import { Notice } from '@/components/ui/Notice';
import { formatCents } from '@/lib/format';
import type { AdminDisputeView } from '@/lib/payments/disputes';
import { referralFeeCents } from '@/lib/payments/policy';
import { resolveInputSchema, type Resolution } from '@/lib/payments/schema';

const dollarsToCents = (text: string): number | undefined => {
  const t = text.trim().replace(/^\$/, '');
  if (!/^\d+(\.\d{1,2})?$/.test(t)) return undefined;
  const [whole, frac = ''] = t.split('.');
  return Number(whole) * 100 + Number(frac.padEnd(2, '0'));
};

/** The admin's view of one dispute: both sides, the money held, and the decision form. */
export function DisputeReview({ initial }: { initial: AdminDisputeView }) {
  const [dispute, setDispute] = useState(initial);
  const [resolution, setResolution] = useState<Resolution | ''>('');
  const [refundText, setRefundText] = useState('');
  const [reason, setReason] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [failure, setFailure] = useState<string | null>(null);
  const job = dispute.job;

  const refundCents =
    resolution === 'refund' ? job.priceCents : resolution === 'release' ? 0 : resolution === 'split' ? dollarsToCents(refundText) : undefined;
  const share = refundCents === undefined ? undefined : job.priceCents - refundCents;
  const fee = share === undefined || share < 0 ? undefined : referralFeeCents(share, job.feeBps);

  const resolve = useMutation({
    mutationFn: (body: unknown) => callApi<AdminDisputeView>(`/api/admin/disputes/${dispute.id}/resolve`, { method: 'POST', json: body }),
    onMutate: () => setFailure(null),
    onSuccess: setDispute,
    onError: (e) => {
      if (e instanceof PaymentsApiError) {
        setFailure(e.message);
        setErrors(Object.fromEntries(Object.entries(e.fieldErrors).map(([k, v]) => [k, v[0]])));
      } else setFailure('Something went wrong. Try again.');
    },
  });
  const note = useMutation({
    mutationFn: async (body: string) => {
      await callApi(`/api/jobs/${job.id}/dispute/notes`, { method: 'POST', json: { body } });
      return callApi<AdminDisputeView>(`/api/admin/disputes/${dispute.id}`);
    },
    onSuccess: setDispute,
    onError: (e) => setFailure(e instanceof PaymentsApiError ? e.message : 'Something went wrong.'),
  });

  return (
    <div className="grid gap-6 lg:grid-cols-3">
      <div className="space-y-4 lg:col-span-2">
        {failure && <Notice tone="danger">{failure}</Notice>}
        <Card className="space-y-3">
          <h2 className="text-lg font-bold">What each side says</h2>
          <DisputeThread dispute={dispute} busy={note.isPending} onAdd={(body) => note.mutate(body)} />
        </Card>
        {dispute.messages.length > 0 && (
          <Card className="space-y-2">
            <h2 className="text-lg font-bold">Their messages before the dispute</h2>
            <ol className="space-y-2">
              {dispute.messages.map((m) => (
                <li key={m.id} className={`rounded p-2 text-sm ${m.fromShop ? 'bg-petrol-50' : 'bg-chalk-100'}`}>
                  <p className="text-xs text-ink-500">
                    {m.fromShop ? job.shopName : 'Rider'}
                    {m.authorName ? ` · ${m.authorName}` : ''} · {formatWhen(m.at)}
                  </p>
                  <p className="whitespace-pre-wrap">{m.body}</p>
                </li>
              ))}
            </ol>
          </Card>
        )}
        <p className="text-xs text-ink-500">Photos attached to a dispute will show here once photo evidence is supported; ask both sides to describe what they see meanwhile.</p>
      </div>

      <div className="space-y-4">
        <Card className="space-y-2">
          <h2 className="text-lg font-bold">Money</h2>
          <dl className="space-y-1 text-sm">
            <div className="flex justify-between">
              <dt className="text-ink-500">Price paid</dt>
              <dd className="tabular-nums">{formatCents(job.priceCents)}</dd>
            </div>
            <div className="flex justify-between">
              <dt className="text-ink-500">Held in escrow now</dt>
              <dd className="tabular-nums font-semibold" data-testid="held">
                {formatCents(dispute.money.heldInEscrowCents)}
              </dd>
            </div>
            {dispute.money.refundedCents + dispute.money.owedToRiderCents > 0 && (
              <div className="flex justify-between">
                <dt className="text-ink-500">To the rider</dt>
                <dd className="tabular-nums" data-testid="to-rider">
                  {formatCents(dispute.money.refundedCents + dispute.money.owedToRiderCents)}
                </dd>
              </div>
            )}
            {dispute.money.transferredCents + dispute.money.owedToBuilderCents > 0 && (
              <div className="flex justify-between">
                <dt className="text-ink-500">To the builder</dt>
                <dd className="tabular-nums" data-testid="to-builder">
                  {formatCents(dispute.money.transferredCents + dispute.money.owedToBuilderCents)}
                </dd>
              </div>
            )}
          </dl>
          <p className="text-xs text-ink-500">
            Hand-over: {job.handover === 'pickup' ? 'ready for pickup' : job.handover === 'carrier' ? `${job.carrier}, ${job.trackingNumber}` : 'not yet shipped'}
          </p>
        </Card>

        {dispute.status === 'open' ? (
          <Card>
            <form
              className="space-y-3"
              aria-label="Decide the dispute"
              onSubmit={(e) => {
                e.preventDefault();
                const parsed = resolveInputSchema.safeParse({ resolution, refundCents: resolution === 'split' ? refundCents : undefined, reason });
                if (!parsed.success) {
                  const fe: Record<string, string> = {};
                  for (const issue of parsed.error.issues) fe[String(issue.path[0])] ??= issue.message;
                  if (resolution === 'split' && refundText && refundCents === undefined) fe.refundCents = 'Enter dollars and cents, like 120.50.';
                  setErrors(fe);
                  return;
                }
                setErrors({});
                resolve.mutate(parsed.data);
              }}
            >
              <h2 className="text-lg font-bold">Decide</h2>
              <Notice tone="caution">This moves real money and cannot be undone. Read both sides first; your reason is sent to both of them and kept in the audit log.</Notice>
              <fieldset className="space-y-1">
                <legend className="text-sm font-semibold text-ink-700">Decision</legend>
                {(
                  [
                    ['release', 'Release it all to the builder'],
                    ['refund', 'Refund it all to the rider'],
                    ['split', 'Split it'],
                  ] as const
                ).map(([value, label]) => (
                  <label key={value} className="flex items-center gap-2 text-sm">
                    <input type="radio" name="resolution" value={value} checked={resolution === value} onChange={() => setResolution(value)} /> {label}
                  </label>
                ))}
                {errors.resolution && (
                  <p role="alert" className="text-xs font-semibold text-rust-700">
                    {errors.resolution}
                  </p>
                )}
              </fieldset>
              {resolution === 'split' && (
                <TextField label="Refund to the rider (dollars)" inputMode="decimal" value={refundText} onChange={(e) => setRefundText(e.target.value)} error={errors.refundCents} hint="The rest goes to the builder, less the referral fee." />
              )}
              {refundCents !== undefined && share !== undefined && share >= 0 && fee !== undefined && (
                <p className="rounded bg-chalk-100 p-2 text-sm" data-testid="decision-preview">
                  Rider gets {formatCents(refundCents)} back. Builder is paid {formatCents(share - fee)} ({formatCents(share)} less a {formatCents(fee)} fee).
                </p>
              )}
              <div className="space-y-1">
                <label htmlFor="resolution-reason" className="block text-sm font-semibold text-ink-700">
                  Reason (both sides read it)
                </label>
                <textarea
                  id="resolution-reason"
                  rows={4}
                  value={reason}
                  onChange={(e) => setReason(e.target.value)}
                  aria-invalid={errors.reason ? true : undefined}
                  className="block w-full rounded border border-chalk-300 bg-white px-3 py-2 text-base text-ink-900 focus:border-petrol-500 aria-[invalid=true]:border-rust-500"
                />
                {errors.reason && (
                  <p role="alert" className="text-xs font-semibold text-rust-700">
                    {errors.reason}
                  </p>
                )}
              </div>
              <Button type="submit" tone="danger" disabled={resolve.isPending}>
                {resolve.isPending ? 'Settling…' : 'Settle the dispute'}
              </Button>
            </form>
          </Card>
        ) : (
          <Notice tone="success" title="Settled">
            <span data-testid="settled">
              {dispute.resolution === 'split'
                ? `Split: ${formatCents(dispute.refundCents ?? 0)} refunded to the rider, ${formatCents(dispute.releaseCents ?? 0)} released to the builder before the fee.`
                : dispute.resolution === 'refund'
                  ? `Refunded ${formatCents(dispute.refundCents ?? 0)} to the rider.`
                  : `Released ${formatCents(dispute.releaseCents ?? 0)} to the builder before the fee.`}{' '}
              {formatWhen(dispute.resolvedAt)}
            </span>
          </Notice>
        )}
      </div>
    </div>
  );
}
