'use client';

// The shop's side of one request: the bid form, or the shop's bid with Revise and Withdraw.
import Link from 'next/link';
import { useState } from 'react';
import { Badge } from '@/components/ui/Badge';
import { Button } from '@/components/ui/Button';
import { Card } from '@/components/ui/Card';
import { Notice } from '@/components/ui/Notice';
import { VerdictBadge } from '@/components/wheel/FitResultPanel';
import { formatCents } from '@/lib/format';
import type { RequestDetail } from '@/lib/market/getRequestForViewer';
import type { BidView } from '@/lib/market/rows';
import { usePlaceBid, useReviseBid, useWithdrawBid } from './api';
import { BidForm, bidToFormValues } from './BidForm';
import { ApiError } from './fetchJson';
import { BID_STATUS_LABEL, addDaysIso, formatDay, lacingText, positionText } from './display';

type Bid = RequestDetail['bids'][number];

const BID_NEXT_STEP: Record<BidView['status'], string> = {
  live: 'The rider can accept it until its valid-until date. You can revise or withdraw it until then.',
  accepted: 'The rider accepted this bid. Next, the rider pays into escrow; then you build.',
  declined: 'The rider went with another bid or closed the request.',
  withdrawn: 'You withdrew this bid.',
  expired: 'This bid passed its valid-until date, or the request closed.',
};

function changeLine(change: NonNullable<BidView['proposedChange']>['wheels'][number]): string {
  const parts: string[] = [];
  if (change.rimWidthMm !== undefined) parts.push(`${change.rimWidthMm} mm rim`);
  if (change.tireWidthMm !== undefined) parts.push(`${change.tireWidthMm} mm tire`);
  if (change.spokes !== undefined) parts.push(`${change.spokes} spokes`);
  if (change.spokeGauge !== undefined) parts.push(`${change.spokeGauge} gauge`);
  if (change.lacing) parts.push(lacingText(change.lacing));
  if (change.hubId) parts.push(`hub ${change.hubId}`);
  if (change.finish) parts.push(`${change.finish} finish`);
  return `${positionText(change.position)}: ${parts.join(', ') || 'no field changes'}`;
}

function BidSummary({ bid }: { bid: Bid }) {
  const status = BID_STATUS_LABEL[bid.status];
  const lines: [string, number][] = [
    ['Parts', bid.partsCents],
    ['Labour', bid.labourCents],
    ['Finish', bid.finishCents],
    ['Shipping', bid.shippingCents],
  ];
  const acceptedFrom = bid.status === 'accepted' && bid.closedAt ? bid.closedAt.slice(0, 10) : null;
  return (
    <div className="space-y-4" data-testid="my-bid">
      <div className="flex flex-wrap items-center gap-2">
        <Badge tone={status.tone}>{status.label}</Badge>
        {bid.revision > 1 && <span className="text-xs text-ink-500">Revised {bid.revision === 2 ? 'once' : `${bid.revision - 1} times`}</span>}
        <span className="ml-auto text-xs text-ink-500">Sent {formatDay(bid.createdAt)}</span>
      </div>
      <table className="w-full text-sm">
        <caption className="sr-only">Your price, line by line</caption>
        <tbody>
          {lines.map(([label, cents]) => (
            <tr key={label} className="border-b border-chalk-200">
              <th scope="row" className="py-1.5 text-left font-normal text-ink-700">
                {label}
              </th>
              <td className="py-1.5 text-right">{formatCents(cents)}</td>
            </tr>
          ))}
          <tr>
            <th scope="row" className="py-2 text-left font-semibold">
              Total
            </th>
            <td className="py-2 text-right font-display text-xl font-bold" data-testid="my-bid-total">
              {formatCents(bid.totalCents)}
            </td>
          </tr>
        </tbody>
      </table>
      <dl className="grid gap-3 text-sm sm:grid-cols-2">
        <div>
          <dt className="text-xs font-semibold tracking-wide text-ink-500 uppercase">Lead time</dt>
          <dd>
            {bid.leadTimeDays} days
            <span className="block text-xs text-ink-500">
              {acceptedFrom ? `Ready by ${formatDay(addDaysIso(acceptedFrom, bid.leadTimeDays))}` : 'Counted from the day the rider accepts'}
            </span>
          </dd>
        </div>
        <div>
          <dt className="text-xs font-semibold tracking-wide text-ink-500 uppercase">Valid until</dt>
          <dd>{formatDay(bid.validUntil)}</dd>
        </div>
      </dl>
      {bid.message && (
        <div>
          <p className="text-xs font-semibold tracking-wide text-ink-500 uppercase">Your message</p>
          <p className="mt-1 whitespace-pre-wrap text-sm">{bid.message}</p>
        </div>
      )}
      {bid.proposedChange && (
        <div className="rounded border border-chalk-200 bg-chalk-50 px-4 py-3 text-sm">
          <div className="flex flex-wrap items-center gap-2">
            <p className="mr-auto font-semibold">Your proposed change</p>
            {bid.proposedChange.verdict && <VerdictBadge verdict={bid.proposedChange.verdict} />}
          </div>
          <p className="mt-1 whitespace-pre-wrap">{bid.proposedChange.description}</p>
          {bid.proposedChange.wheels.length > 0 && (
            <ul className="mt-2 list-disc pl-5">
              {bid.proposedChange.wheels.map((w) => (
                <li key={w.position}>{changeLine(w)}</li>
              ))}
            </ul>
          )}
          {bid.proposedChange.baselineCents !== null && (
            <p className="mt-2 text-xs text-ink-500">Baseline with the change: {formatCents(bid.proposedChange.baselineCents, { whole: true })}</p>
          )}
          {bid.proposedChange.cautions.length > 0 && (
            <ul className="mt-2 list-disc pl-5 text-xs text-amber-700">
              {bid.proposedChange.cautions.map((c) => (
                <li key={c}>{c}</li>
              ))}
            </ul>
          )}
        </div>
      )}
      <p className="text-sm text-ink-500">{BID_NEXT_STEP[bid.status]}</p>
    </div>
  );
}

export function BidPanel({ request, labourRateCentsPerHour }: { request: RequestDetail; labourRateCentsPerHour: number | null }) {
  const [mode, setMode] = useState<'view' | 'revise' | 'confirm-withdraw'>('view');
  const [done, setDone] = useState<string | null>(null);
  const [withdrawError, setWithdrawError] = useState<string | null>(null);
  const place = usePlaceBid(request.id);
  const revise = useReviseBid(request.id);
  const withdraw = useWithdrawBid(request.id);

  const live = request.bids.find((b) => b.status === 'live') ?? null;
  const accepted = request.bids.find((b) => b.status === 'accepted') ?? null;
  const current = live ?? accepted;
  const earlier = request.bids.filter((b) => b !== current);

  let body: React.ReactNode;
  if (current && mode === 'revise' && current.status === 'live') {
    body = (
      <BidForm
        request={request}
        initial={bidToFormValues(current, request)}
        submitLabel="Save revised bid"
        labourRateCentsPerHour={labourRateCentsPerHour}
        onCancel={() => setMode('view')}
        onSubmit={async (input) => {
          await revise.mutateAsync({ bidId: current.id, input });
          setMode('view');
          setDone('Your revised bid is saved. The rider has been told.');
        }}
      />
    );
  } else if (current) {
    body = (
      <div className="space-y-4">
        <BidSummary bid={current} />
        {current.status === 'live' && mode !== 'confirm-withdraw' && (
          <div className="flex flex-wrap gap-3">
            <Button
              type="button"
              onClick={() => {
                setDone(null);
                setMode('revise');
              }}
            >
              Revise bid
            </Button>
            <Button
              type="button"
              tone="secondary"
              onClick={() => {
                setDone(null);
                setWithdrawError(null);
                setMode('confirm-withdraw');
              }}
            >
              Withdraw bid
            </Button>
          </div>
        )}
        {current.status === 'live' && mode === 'confirm-withdraw' && (
          <div className="space-y-3 rounded border border-rust-500 bg-rust-50 p-4" role="group" aria-label="Confirm withdrawal">
            <p className="text-sm font-semibold text-rust-700">Withdraw this bid? The rider can no longer accept it. You can bid again while the request is open.</p>
            {withdrawError && <Notice tone="danger">{withdrawError}</Notice>}
            <div className="flex flex-wrap gap-3">
              <Button
                type="button"
                tone="danger"
                disabled={withdraw.isPending}
                onClick={async () => {
                  setWithdrawError(null);
                  try {
                    await withdraw.mutateAsync(current.id);
                    setMode('view');
                    setDone('Your bid is withdrawn.');
                  } catch (err) {
                    setWithdrawError(err instanceof ApiError ? err.message : 'The bid was not withdrawn. Try again.');
                  }
                }}
              >
                {withdraw.isPending ? 'Withdrawing…' : 'Yes, withdraw it'}
              </Button>
              <Button type="button" tone="quiet" onClick={() => setMode('view')}>
                Keep the bid
              </Button>
            </div>
          </div>
        )}
      </div>
    );
  } else if (request.canBid) {
    body = (
      <BidForm
        request={request}
        submitLabel="Send bid"
        labourRateCentsPerHour={labourRateCentsPerHour}
        onSubmit={async (input) => {
          await place.mutateAsync(input);
          setDone('Your bid is sent. The rider has been told, and it is listed under My bids.');
        }}
      />
    );
  } else {
    body = <p className="text-ink-500">This request is {request.status === 'open' ? 'not taking your bid right now' : 'closed'}, so it takes no new bids.</p>;
  }

  return (
    <Card>
      <div className="mb-4 flex flex-wrap items-center gap-2">
        <h2 className="mr-auto text-xl font-bold">{current ? (mode === 'revise' ? 'Revise your bid' : 'Your bid') : 'Your bid'}</h2>
        <Link href="/bids" className="text-sm">
          All my bids
        </Link>
      </div>
      {done && (
        <div className="mb-4">
          <Notice tone="success">{done}</Notice>
        </div>
      )}
      {body}
      {earlier.length > 0 && (
        <details className="mt-5 border-t border-chalk-200 pt-3 text-sm">
          <summary className="cursor-pointer font-semibold text-ink-700">Earlier bids from your shop ({earlier.length})</summary>
          <ul className="mt-2 space-y-1">
            {earlier.map((b) => (
              <li key={b.id} className="flex flex-wrap items-center gap-2">
                <Badge tone={BID_STATUS_LABEL[b.status].tone}>{BID_STATUS_LABEL[b.status].label}</Badge>
                {formatCents(b.totalCents)} · {b.leadTimeDays} days · sent {formatDay(b.createdAt)}
              </li>
            ))}
          </ul>
        </details>
      )}
    </Card>
  );
}
