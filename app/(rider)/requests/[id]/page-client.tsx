'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { MessageThread } from '@/components/market/MessageThread';
import { StatusBadge } from '@/components/market/StatusBadge';
import { Button } from '@/components/ui/Button';
import { Card } from '@/components/ui/Card';
import { Notice } from '@/components/ui/Notice';
import { Spinner } from '@/components/ui/Spinner';
import { formatCents } from '@/lib/format';
import type { BidComparison } from '@/lib/market/compareBids';
import type { ThreadSummary } from '@/lib/market/threads';

async function getJson<T>(url: string): Promise<T> {
  const res = await fetch(url);
  const body = await res.json().catch(() => ({}));
  if (!res.ok) throw new Error(body.error ?? `Request failed (${res.status}).`);
  return body as T;
}

async function postJson(url: string, body?: unknown) {
  const res = await fetch(url, { method: 'POST', headers: { 'content-type': 'application/json' }, body: body === undefined ? undefined : JSON.stringify(body) });
  const answer = await res.json().catch(() => ({}));
  if (!res.ok) throw new Error(answer.error ?? `Request failed (${res.status}).`);
  return answer;
}

export function RequestActions({ requestId, canPublish, canCancel }: { requestId: string; canPublish: boolean; canCancel: boolean }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const act = useMutation({
    mutationFn: (what: 'publish' | 'cancel') => postJson(`/api/requests/${requestId}/${what}`),
    onSuccess: () => router.refresh(),
    onError: (e: Error) => setError(e.message),
  });
  return (
    <div className="flex flex-wrap items-center gap-2">
      {error && <Notice tone="danger">{error}</Notice>}
      {canPublish && (
        <Button onClick={() => act.mutate('publish')} disabled={act.isPending}>
          Publish to builders
        </Button>
      )}
      {canCancel && (
        <Button
          tone="quiet"
          disabled={act.isPending}
          onClick={() => {
            if (window.confirm('Cancel this request? Builders will no longer see it.')) act.mutate('cancel');
          }}
        >
          Cancel request
        </Button>
      )}
    </div>
  );
}

export function BidComparisonTable({ requestId }: { requestId: string }) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const [error, setError] = useState<string | null>(null);
  const compare = useQuery({ queryKey: ['compare', requestId], queryFn: () => getJson<BidComparison>(`/api/requests/${requestId}/compare`) });
  const accept = useMutation({
    mutationFn: (bidId: string) => postJson(`/api/requests/${requestId}/accept`, { bidId }),
    onSuccess: async (answer: { job?: { id: string } }) => {
      await queryClient.invalidateQueries({ queryKey: ['compare', requestId] });
      // Next comes paying into escrow, on the job's page.
      if (answer.job?.id) router.push(`/jobs/${answer.job.id}`);
      else router.refresh();
    },
    onError: (e: Error) => setError(e.message),
  });

  if (compare.isPending) return <Spinner label="Loading bids…" />;
  if (compare.isError) return <Notice tone="danger">{compare.error.message}</Notice>;
  const { rows, baseline } = compare.data;
  if (rows.length === 0) {
    return (
      <Card className="text-center text-ink-500" data-testid="no-bids">
        No bids yet. Builders whose shops fit this wheel have been told about it; bids usually arrive within a few days.
      </Card>
    );
  }
  return (
    <div className="space-y-2">
      {error && <Notice tone="danger">{error}</Notice>}
      <p className="text-sm text-ink-500">
        Baseline for this request: {formatCents(baseline.lowCents, { whole: true })} to {formatCents(baseline.highCents, { whole: true })}, typically{' '}
        {formatCents(baseline.typicalCents, { whole: true })} (demo price book).
      </p>
      <div className="overflow-x-auto rounded-lg border border-chalk-200 bg-white">
        <table className="w-full text-sm" data-testid="bid-comparison">
          <caption className="sr-only">Bids on this request</caption>
          <thead className="bg-chalk-100 text-left text-xs uppercase tracking-wide text-ink-500">
            <tr>
              <th className="px-3 py-2">Shop</th>
              <th className="px-3 py-2 text-right">Price</th>
              <th className="px-3 py-2 text-right">Against baseline</th>
              <th className="px-3 py-2">Lead time</th>
              <th className="px-3 py-2">Shop record</th>
              <th className="px-3 py-2">Notes</th>
              <th className="px-3 py-2" />
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.bidId} className="border-t border-chalk-100 align-top" data-testid="bid-row">
                <td className="px-3 py-2">
                  <p className="font-semibold">{r.shopName}</p>
                  <p className="text-xs text-ink-500">
                    {r.shopCity}, {r.shopRegion} · {Math.round(r.distanceMiles)} mi
                  </p>
                  <StatusBadge status={r.status} />
                </td>
                <td className="px-3 py-2 text-right tabular-nums">
                  <p className="font-semibold">{formatCents(r.totalCents)}</p>
                  <p className="text-xs text-ink-500">
                    parts {formatCents(r.partsCents, { whole: true })} · labour {formatCents(r.labourCents, { whole: true })} · finish {formatCents(r.finishCents, { whole: true })} · shipping{' '}
                    {formatCents(r.shippingCents, { whole: true })}
                  </p>
                </td>
                <td className={`px-3 py-2 text-right tabular-nums ${r.vsBaseline === 'above' ? 'text-rust-700' : r.vsBaseline === 'below' ? 'text-moss-700' : ''}`}>
                  {r.vsBaseline === 'at' ? 'at baseline' : `${formatCents(Math.abs(r.vsBaselineCents), { whole: true })} ${r.vsBaseline} (${Math.abs(r.vsBaselinePercent).toFixed(0)} %)`}
                </td>
                <td className="px-3 py-2">
                  {r.leadTimeDays} days
                  <p className={`text-xs ${r.meetsNeededBy ? 'text-ink-500' : 'font-semibold text-rust-700'}`}>
                    ready by {r.readyBy}
                    {r.meetsNeededBy ? '' : ' (after your date)'}
                  </p>
                </td>
                <td className="px-3 py-2 text-xs">
                  {r.rating === null ? 'No ratings yet' : `${r.rating.toFixed(1)} of 5 (${r.ratingCount})`}
                  <br />
                  {r.completedBuilds} completed builds
                </td>
                <td className="max-w-xs px-3 py-2 text-xs">
                  {r.message && <p className="whitespace-pre-line">{r.message}</p>}
                  {r.proposedChange && (
                    <p className="mt-1 rounded bg-brass-100 p-1.5 text-brass-700">
                      <strong>Proposes a change:</strong> {r.proposedChange.description}
                      {r.proposedChange.verdict && ` (fit: ${r.proposedChange.verdict.replace(/-/g, ' ')})`}
                    </p>
                  )}
                </td>
                <td className="px-3 py-2">
                  {r.canAccept && (
                    <Button
                      disabled={accept.isPending}
                      onClick={() => {
                        if (window.confirm(`Accept ${r.shopName}'s bid of ${formatCents(r.totalCents)}? The other bids will be declined.`)) accept.mutate(r.bidId);
                      }}
                    >
                      Accept
                    </Button>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}

export function RequestThreads({ requestId, viewerSide }: { requestId: string; viewerSide: 'rider' | 'admin' }) {
  const threads = useQuery({ queryKey: ['threads', requestId], queryFn: () => getJson<ThreadSummary[]>(`/api/requests/${requestId}/threads`), refetchInterval: 15_000 });
  const [open, setOpen] = useState<string | null>(null);
  if (threads.isPending) return <Spinner label="Loading messages…" />;
  if (threads.isError) return <Notice tone="danger">{threads.error.message}</Notice>;
  if (threads.data.length === 0) return <p className="text-sm text-ink-500">No conversations yet. When a builder writes or bids, you can talk here.</p>;
  return (
    <ul className="space-y-2">
      {threads.data.map((t) => (
        <li key={t.shopId}>
          <Card>
            <button type="button" className="flex w-full items-center justify-between text-left" onClick={() => setOpen(open === t.shopId ? null : t.shopId)} aria-expanded={open === t.shopId}>
              <span className="font-semibold">{t.shopName}</span>
              <span className="text-xs text-ink-500">
                {t.messageCount} messages{t.unreadCount > 0 && <strong className="ml-2 text-brass-700">{t.unreadCount} new</strong>}
              </span>
            </button>
            {open === t.shopId && (
              <div className="mt-3">
                <MessageThread requestId={requestId} shopId={t.shopId} viewerSide={viewerSide} title={`Messages with ${t.shopName}`} />
              </div>
            )}
          </Card>
        </li>
      ))}
    </ul>
  );
}
