'use client';

// The builders' board: open requests with filters, sortable columns and page-by-page paging.
import Link from 'next/link';
import { useEffect, useId, useState } from 'react';
import { Badge } from '@/components/ui/Badge';
import { Button } from '@/components/ui/Button';
import { Card } from '@/components/ui/Card';
import { SelectField, TextField } from '@/components/ui/Field';
import { Notice } from '@/components/ui/Notice';
import { Spinner } from '@/components/ui/Spinner';
import { VerdictBadge } from '@/components/wheel/FitResultPanel';
import { formatCents } from '@/lib/format';
import type { BoardItem } from '@/lib/market/board';
import { RIM_WIDTH_CLASSES_IN, type BoardSort } from '@/lib/market/schema';
import { NOMINAL_DIAMETERS_IN, SPOKE_GAUGES } from '@/lib/wheel';
import { useBoard, type BoardFilters } from './api';
import { BID_STATUS_LABEL, formatDay, wheelLine } from './display';

const SPOKE_COUNT_CHOICES = [28, 32, 36, 48, 72, 144];
const DISTANCE_CHOICES = [50, 100, 250, 500, 1000, 2500];
const PAGE_SIZES = [10, 25, 50];

/** What the filter form holds: text as typed, so nothing the builder enters is lost or reformatted. */
interface FilterDraft {
  diameterIn: string;
  rimWidthIn: string;
  gauge: string;
  spokes: string;
  maxMiles: string;
  budgetMinDollars: string;
  budgetMaxDollars: string;
  neededByFrom: string;
  neededByTo: string;
  capabilityFilter: boolean;
}

const EMPTY_DRAFT: FilterDraft = {
  diameterIn: '',
  rimWidthIn: '',
  gauge: '',
  spokes: '',
  maxMiles: '',
  budgetMinDollars: '',
  budgetMaxDollars: '',
  neededByFrom: '',
  neededByTo: '',
  capabilityFilter: true,
};

const num = (s: string): number | undefined => (s.trim() === '' || Number.isNaN(Number(s)) ? undefined : Number(s));
const dollarsToCents = (s: string): number | undefined => {
  const n = num(s);
  return n === undefined ? undefined : Math.round(n * 100);
};

function toFilters(d: FilterDraft, sort: BoardSort, order: 'asc' | 'desc' | undefined, limit: number): BoardFilters {
  return {
    diameterIn: num(d.diameterIn),
    rimWidthIn: num(d.rimWidthIn),
    gauge: num(d.gauge),
    spokes: num(d.spokes),
    maxMiles: num(d.maxMiles),
    budgetMinCents: dollarsToCents(d.budgetMinDollars),
    budgetMaxCents: dollarsToCents(d.budgetMaxDollars),
    neededByFrom: d.neededByFrom || undefined,
    neededByTo: d.neededByTo || undefined,
    capabilityFilter: d.capabilityFilter,
    sort,
    order,
    limit,
  };
}

function useDebounced<T>(value: T, ms: number): T {
  const [debounced, setDebounced] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setDebounced(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return debounced;
}

const SORT_DEFAULT_ORDER: Record<BoardSort, 'asc' | 'desc'> = { newest: 'desc', neededBy: 'asc', budget: 'desc', distance: 'asc' };

function SortHeader({
  label,
  column,
  sort,
  order,
  onSort,
  className = '',
}: {
  label: string;
  column: BoardSort;
  sort: BoardSort;
  order: 'asc' | 'desc';
  onSort: (column: BoardSort) => void;
  className?: string;
}) {
  const active = sort === column;
  return (
    <th scope="col" aria-sort={active ? (order === 'asc' ? 'ascending' : 'descending') : 'none'} className={`px-3 py-2 ${className}`}>
      <button type="button" onClick={() => onSort(column)} className="inline-flex items-center gap-1 font-semibold text-ink-700 hover:text-petrol-700">
        {label}
        <span aria-hidden="true" className={active ? 'text-petrol-600' : 'text-ink-300'}>
          {active ? (order === 'asc' ? '▲' : '▼') : '↕'}
        </span>
        <span className="sr-only">{active ? `, sorted ${order === 'asc' ? 'ascending' : 'descending'}; change order` : ', sort by this column'}</span>
      </button>
    </th>
  );
}

function BoardRow({ item }: { item: BoardItem }) {
  const mine = item.myBid;
  return (
    <tr className="border-t border-chalk-200 align-top hover:bg-chalk-50" data-testid="board-row">
      <td className="px-3 py-3">
        <Link href={`/board/${item.id}`} className="font-semibold">
          {item.title}
        </Link>
        <ul className="mt-1 space-y-0.5 text-xs text-ink-500">
          {item.wheels.map((w) => (
            <li key={w.position}>{wheelLine(w)}</li>
          ))}
        </ul>
        {!item.matchesCapabilities && (
          <div className="mt-1">
            <Badge tone="amber">Outside your listed capabilities</Badge>
          </div>
        )}
      </td>
      <td className="px-3 py-3 text-sm">
        <div>
          {item.city}, {item.region}
        </div>
        <div className="text-xs text-ink-500">
          {item.distanceMiles.toLocaleString('en-US')} mi · {item.delivery === 'ship' ? 'ship' : 'local pickup'}
        </div>
      </td>
      <td className="px-3 py-3 text-sm whitespace-nowrap">{formatDay(item.neededBy)}</td>
      <td className="px-3 py-3 text-right text-sm whitespace-nowrap">
        <div className="font-semibold">{formatCents(item.budgetCents, { whole: true })}</div>
        <div className="text-xs text-ink-500">baseline {formatCents(item.baseline.typicalCents, { whole: true })}</div>
      </td>
      <td className="px-3 py-3">
        <VerdictBadge verdict={item.fitVerdict} />
      </td>
      <td className="px-3 py-3 text-sm">
        <div>{item.liveBidCount === 1 ? '1 live bid' : `${item.liveBidCount} live bids`}</div>
        {mine && (
          <div className="mt-1 flex flex-wrap items-center gap-1 text-xs">
            <Badge tone={BID_STATUS_LABEL[mine.status].tone}>Yours: {BID_STATUS_LABEL[mine.status].label}</Badge>
            <span className="text-ink-500">{formatCents(mine.totalCents)}</span>
          </div>
        )}
      </td>
      <td className="px-3 py-3 text-sm whitespace-nowrap text-ink-500">{formatDay(item.publishedAt)}</td>
    </tr>
  );
}

export function BoardTable() {
  const formId = useId();
  const [draft, setDraft] = useState<FilterDraft>(EMPTY_DRAFT);
  const [sort, setSort] = useState<BoardSort>('newest');
  const [order, setOrder] = useState<'asc' | 'desc'>(SORT_DEFAULT_ORDER.newest);
  const [limit, setLimit] = useState(25);
  const applied = useDebounced(draft, 350);
  const filters = toFilters(applied, sort, order, limit);
  const filterKey = JSON.stringify(filters);
  // Cursors of the pages visited so far; a change of filters or sort starts again at page 1.
  const [paging, setPaging] = useState<{ key: string; cursors: (string | null)[] }>({ key: filterKey, cursors: [null] });
  const cursors = paging.key === filterKey ? paging.cursors : [null];
  const cursor = cursors[cursors.length - 1];
  const board = useBoard(filters, cursor);

  const set = <K extends keyof FilterDraft>(key: K, value: FilterDraft[K]) => setDraft((d) => ({ ...d, [key]: value }));
  const onSort = (column: BoardSort) => {
    if (column === sort) setOrder((o) => (o === 'asc' ? 'desc' : 'asc'));
    else {
      setSort(column);
      setOrder(SORT_DEFAULT_ORDER[column]);
    }
  };

  const items = board.data?.items ?? [];
  const fieldErrors = board.error && 'fieldErrors' in board.error ? (board.error.fieldErrors as Record<string, string[]>) : {};
  const caps = board.data?.capabilities;
  const capsText = caps
    ? [
        caps.diametersIn.length ? `${caps.diametersIn.join(', ')}″ wheels` : null,
        caps.rimWidthsIn.length ? `${caps.rimWidthsIn.join(', ')}″ rims` : null,
        caps.gauges.length ? `${caps.gauges.join(', ')} gauge` : null,
        caps.spokeCounts.length ? `${caps.spokeCounts.join(', ')} spokes` : null,
      ]
        .filter(Boolean)
        .join(' · ')
    : '';
  const pageNumber = cursors.length;

  return (
    <div className="space-y-5">
      <form
        id={formId}
        aria-label="Filter open requests"
        className="space-y-4 rounded-lg border border-chalk-200 bg-white p-4 shadow-card"
        onSubmit={(e) => e.preventDefault()}
        noValidate
      >
        <div className="flex flex-wrap items-start justify-between gap-3">
          <label className="flex items-start gap-3">
            <input
              type="checkbox"
              checked={draft.capabilityFilter}
              onChange={(e) => set('capabilityFilter', e.target.checked)}
              className="mt-1 h-4 w-4 accent-petrol-600"
            />
            <span>
              <span className="block font-semibold">My capabilities only</span>
              <span className="block text-xs text-ink-500">
                {capsText ? `Shows requests your shop builds: ${capsText}.` : 'Shows requests inside what your shop lists in Shop settings.'}
              </span>
            </span>
          </label>
          <Button type="button" tone="quiet" onClick={() => setDraft(EMPTY_DRAFT)}>
            Clear filters
          </Button>
        </div>
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-5">
          <SelectField label="Wheel size" value={draft.diameterIn} onChange={(e) => set('diameterIn', e.target.value)} error={fieldErrors.diameterIn?.[0]}>
            <option value="">Any size</option>
            {NOMINAL_DIAMETERS_IN.map((d) => (
              <option key={d} value={d}>
                {d} inch
              </option>
            ))}
          </SelectField>
          <SelectField label="Rim width" value={draft.rimWidthIn} onChange={(e) => set('rimWidthIn', e.target.value)} error={fieldErrors.rimWidthIn?.[0]}>
            <option value="">Any width</option>
            {RIM_WIDTH_CLASSES_IN.map((w) => (
              <option key={w} value={w}>
                {w} inch
              </option>
            ))}
          </SelectField>
          <SelectField label="Spoke gauge" value={draft.gauge} onChange={(e) => set('gauge', e.target.value)} error={fieldErrors.gauge?.[0]}>
            <option value="">Any gauge</option>
            {SPOKE_GAUGES.map((g) => (
              <option key={g} value={g}>
                {g} gauge
              </option>
            ))}
          </SelectField>
          <SelectField label="Spoke count" value={draft.spokes} onChange={(e) => set('spokes', e.target.value)} error={fieldErrors.spokes?.[0]}>
            <option value="">Any count</option>
            {SPOKE_COUNT_CHOICES.map((s) => (
              <option key={s} value={s}>
                {s} spokes
              </option>
            ))}
          </SelectField>
          <SelectField label="Distance from your shop" value={draft.maxMiles} onChange={(e) => set('maxMiles', e.target.value)} error={fieldErrors.maxMiles?.[0]}>
            <option value="">Any distance</option>
            {DISTANCE_CHOICES.map((m) => (
              <option key={m} value={m}>
                Within {m.toLocaleString('en-US')} mi
              </option>
            ))}
          </SelectField>
          <TextField
            label="Budget from ($)"
            type="number"
            min={0}
            step={1}
            inputMode="numeric"
            value={draft.budgetMinDollars}
            onChange={(e) => set('budgetMinDollars', e.target.value)}
            error={fieldErrors.budgetMinCents?.[0]}
          />
          <TextField
            label="Budget up to ($)"
            type="number"
            min={0}
            step={1}
            inputMode="numeric"
            value={draft.budgetMaxDollars}
            onChange={(e) => set('budgetMaxDollars', e.target.value)}
            error={fieldErrors.budgetMaxCents?.[0]}
          />
          <TextField
            label="Needed by, from"
            type="date"
            value={draft.neededByFrom}
            onChange={(e) => set('neededByFrom', e.target.value)}
            error={fieldErrors.neededByFrom?.[0]}
          />
          <TextField
            label="Needed by, up to"
            type="date"
            value={draft.neededByTo}
            onChange={(e) => set('neededByTo', e.target.value)}
            error={fieldErrors.neededByTo?.[0]}
          />
          <SelectField label="Rows per page" value={limit} onChange={(e) => setLimit(Number(e.target.value))}>
            {PAGE_SIZES.map((n) => (
              <option key={n} value={n}>
                {n}
              </option>
            ))}
          </SelectField>
        </div>
      </form>

      {board.isError && (
        <Notice tone="danger" title="The board did not load">
          {board.error.message}{' '}
          <button type="button" className="font-semibold underline" onClick={() => board.refetch()}>
            Try again
          </button>
        </Notice>
      )}

      {board.isPending && <Spinner label="Loading open requests…" />}

      {board.isSuccess && items.length === 0 && (
        <Card className="text-center">
          <p className="text-lg font-semibold" data-testid="board-empty">
            No open requests match these filters
          </p>
          <p className="mt-1 text-ink-500">
            {applied.capabilityFilter
              ? 'Try clearing a filter, or turn off “My capabilities only” to see requests outside what your shop lists.'
              : 'Try clearing a filter. New requests show up here as riders publish them.'}
          </p>
        </Card>
      )}

      {items.length > 0 && (
        <div className={`overflow-x-auto rounded-lg border border-chalk-200 bg-white shadow-card ${board.isPlaceholderData ? 'opacity-60' : ''}`}>
          <table className="w-full min-w-[56rem] text-left" aria-busy={board.isFetching} data-testid="board-table">
            <caption className="sr-only">Open wheel requests, page {pageNumber}</caption>
            <thead className="bg-chalk-100 text-sm">
              <tr>
                <th scope="col" className="px-3 py-2 font-semibold text-ink-700">
                  Request
                </th>
                <SortHeader label="Where" column="distance" sort={sort} order={order} onSort={onSort} />
                <SortHeader label="Needed by" column="neededBy" sort={sort} order={order} onSort={onSort} />
                <SortHeader label="Budget" column="budget" sort={sort} order={order} onSort={onSort} className="text-right" />
                <th scope="col" className="px-3 py-2 font-semibold text-ink-700">
                  Fit
                </th>
                <th scope="col" className="px-3 py-2 font-semibold text-ink-700">
                  Bids
                </th>
                <SortHeader label="Posted" column="newest" sort={sort} order={order} onSort={onSort} />
              </tr>
            </thead>
            <tbody>
              {items.map((item) => (
                <BoardRow key={item.id} item={item} />
              ))}
            </tbody>
          </table>
        </div>
      )}

      {(items.length > 0 || pageNumber > 1) && (
        <nav aria-label="Pages" className="flex items-center justify-between gap-3">
          <Button
            type="button"
            tone="secondary"
            disabled={pageNumber === 1}
            onClick={() => setPaging({ key: filterKey, cursors: cursors.slice(0, -1) })}
          >
            ← Previous page
          </Button>
          <span className="text-sm text-ink-500" aria-live="polite">
            Page {pageNumber}
            {board.isFetching ? ' · loading…' : ''}
          </span>
          <Button
            type="button"
            tone="secondary"
            disabled={!board.data?.nextCursor || board.isPlaceholderData}
            onClick={() => board.data?.nextCursor && setPaging({ key: filterKey, cursors: [...cursors, board.data.nextCursor] })}
          >
            Next page →
          </Button>
        </nav>
      )}
    </div>
  );
}
