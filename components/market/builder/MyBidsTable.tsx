'use client';

// "My bids": every bid the shop has sent, with its state, the request it answers and what happens next.
import Link from 'next/link';
import { useState } from 'react';
import { Badge } from '@/components/ui/Badge';
import { ButtonLink } from '@/components/ui/Button';
import { Card } from '@/components/ui/Card';
import { Notice } from '@/components/ui/Notice';
import { Spinner } from '@/components/ui/Spinner';
import { formatCents } from '@/lib/format';
import { BID_STATUSES, type BidStatus } from '@/lib/market/states';
import { useShopBids } from './api';
import { BID_STATUS_LABEL, formatDay, REQUEST_STATUS_LABEL } from './display';

type Filter = BidStatus | 'all';

export function MyBidsTable() {
  const bids = useShopBids();
  const [filter, setFilter] = useState<Filter>('all');
  const all = bids.data ?? [];
  const counts = Object.fromEntries(BID_STATUSES.map((s) => [s, all.filter((b) => b.status === s).length])) as Record<BidStatus, number>;
  const shown = filter === 'all' ? all : all.filter((b) => b.status === filter);

  if (bids.isPending) return <Spinner label="Loading your bids…" />;
  if (bids.isError) {
    return (
      <Notice tone="danger" title="Your bids did not load">
        {bids.error.message}{' '}
        <button type="button" className="font-semibold underline" onClick={() => bids.refetch()}>
          Try again
        </button>
      </Notice>
    );
  }
  if (all.length === 0) {
    return (
      <Card className="text-center">
        <p className="text-lg font-semibold" data-testid="bids-empty">
          Your shop has not bid yet
        </p>
        <p className="mt-1 text-ink-500">Open a request on the board, price it, and your bid shows up here with its state.</p>
        <div className="mt-4">
          <ButtonLink href="/board">See open requests</ButtonLink>
        </div>
      </Card>
    );
  }

  return (
    <div className="space-y-4">
      <div role="group" aria-label="Show bids" className="flex flex-wrap gap-2">
        {(['all', ...BID_STATUSES] as Filter[]).map((f) => {
          const n = f === 'all' ? all.length : counts[f];
          if (f !== 'all' && n === 0) return null;
          return (
            <button
              key={f}
              type="button"
              aria-pressed={filter === f}
              onClick={() => setFilter(f)}
              className={`rounded-full px-3 py-1 text-sm font-semibold ${filter === f ? 'bg-petrol-600 text-white' : 'bg-chalk-100 text-ink-700 hover:bg-chalk-200'}`}
            >
              {f === 'all' ? 'All' : BID_STATUS_LABEL[f].label} ({n})
            </button>
          );
        })}
      </div>
      <div className="overflow-x-auto rounded-lg border border-chalk-200 bg-white shadow-card">
        <table className="w-full min-w-[52rem] text-left" data-testid="my-bids-table">
          <caption className="sr-only">Your shop&rsquo;s bids, newest first</caption>
          <thead className="bg-chalk-100 text-sm text-ink-700">
            <tr>
              <th scope="col" className="px-3 py-2 font-semibold">
                Request
              </th>
              <th scope="col" className="px-3 py-2 font-semibold">
                Your bid
              </th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">
                Total
              </th>
              <th scope="col" className="px-3 py-2 font-semibold">
                Lead time
              </th>
              <th scope="col" className="px-3 py-2 font-semibold">
                Valid until
              </th>
              <th scope="col" className="px-3 py-2 font-semibold">
                Messages
              </th>
            </tr>
          </thead>
          <tbody>
            {shown.map((bid) => {
              const status = BID_STATUS_LABEL[bid.status];
              return (
                <tr key={bid.id} className="border-t border-chalk-200 align-top" data-testid="my-bid-row">
                  <td className="px-3 py-3">
                    <Link href={`/board/${bid.request.id}`} className="font-semibold">
                      {bid.request.title}
                    </Link>
                    <div className="text-xs text-ink-500">
                      {bid.request.city}, {bid.request.region} · needed by {formatDay(bid.request.neededBy)} · request {REQUEST_STATUS_LABEL[bid.request.status].toLowerCase()}
                    </div>
                  </td>
                  <td className="px-3 py-3">
                    <Badge tone={status.tone}>{status.label}</Badge>
                    <p className="mt-1 max-w-xs text-xs text-ink-500">{bid.nextStep}</p>
                  </td>
                  <td className="px-3 py-3 text-right whitespace-nowrap">
                    <div className="font-semibold">{formatCents(bid.totalCents)}</div>
                    <div className="text-xs text-ink-500">budget {formatCents(bid.request.budgetCents, { whole: true })}</div>
                  </td>
                  <td className="px-3 py-3 text-sm whitespace-nowrap">{bid.leadTimeDays} days</td>
                  <td className="px-3 py-3 text-sm whitespace-nowrap">{formatDay(bid.validUntil)}</td>
                  <td className="px-3 py-3 text-sm">
                    {bid.unreadMessages > 0 ? (
                      <Link href={`/board/${bid.request.id}#messages`} className="no-underline">
                        <Badge tone="brass">{bid.unreadMessages === 1 ? '1 new' : `${bid.unreadMessages} new`}</Badge>
                      </Link>
                    ) : (
                      <span className="text-ink-500">—</span>
                    )}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
    </div>
  );
}
