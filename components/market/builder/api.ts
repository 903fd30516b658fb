'use client';

// The builder pages' data hooks: one per resource, all over the JSON API with TanStack Query.
import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { BoardPage } from '@/lib/market/board';
import type { RequestDetail } from '@/lib/market/getRequestForViewer';
import type { ShopBidSummary } from '@/lib/market/listShopBids';
import type { BidView } from '@/lib/market/rows';
import type { BidInput, BoardSort, ShopSettingsInput } from '@/lib/market/schema';
import type { ShopSettings } from '@/lib/market/shopSettings';
import { fetchJson } from './fetchJson';

export { ApiError, fetchJson } from './fetchJson';

export interface BoardFilters {
  diameterIn?: number;
  rimWidthIn?: number;
  gauge?: number;
  spokes?: number;
  maxMiles?: number;
  budgetMinCents?: number;
  budgetMaxCents?: number;
  neededByFrom?: string;
  neededByTo?: string;
  sort: BoardSort;
  order?: 'asc' | 'desc';
  capabilityFilter: boolean;
  limit: number;
}

export function boardSearchParams(filters: BoardFilters, cursor: string | null): URLSearchParams {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) {
    if (value === undefined || value === '' || (typeof value === 'number' && Number.isNaN(value))) continue;
    if (key === 'capabilityFilter') params.set(key, value ? 'on' : 'off');
    else params.set(key, String(value));
  }
  if (cursor) params.set('cursor', cursor);
  return params;
}

export const builderKeys = {
  board: (filters: BoardFilters, cursor: string | null) => ['board', filters, cursor] as const,
  request: (id: string) => ['request', id] as const,
  shopBids: ['shop-bids'] as const,
  shopSettings: ['shop-settings'] as const,
};

export function useBoard(filters: BoardFilters, cursor: string | null) {
  return useQuery({
    queryKey: builderKeys.board(filters, cursor),
    queryFn: ({ signal }) => fetchJson<BoardPage>(`/api/board?${boardSearchParams(filters, cursor)}`, { signal }),
    placeholderData: keepPreviousData,
  });
}

export function useRequestDetail(id: string, initialData?: RequestDetail) {
  return useQuery({
    queryKey: builderKeys.request(id),
    queryFn: ({ signal }) => fetchJson<RequestDetail>(`/api/requests/${id}`, { signal }),
    initialData,
  });
}

export function useShopBids() {
  return useQuery({
    queryKey: builderKeys.shopBids,
    queryFn: async ({ signal }) => {
      const body = await fetchJson<ShopBidSummary[] | { bids: ShopBidSummary[] }>('/api/bids', { signal });
      return Array.isArray(body) ? body : body.bids;
    },
  });
}

export function useShopSettings(initialData?: ShopSettings) {
  return useQuery({
    queryKey: builderKeys.shopSettings,
    queryFn: ({ signal }) => fetchJson<ShopSettings>('/api/shop/settings', { signal }),
    initialData,
  });
}

/** After any change to a bid the request page, My bids and the board all show it. */
function useBidSettled(requestId: string) {
  const client = useQueryClient();
  return () =>
    Promise.all([
      client.invalidateQueries({ queryKey: builderKeys.request(requestId) }),
      client.invalidateQueries({ queryKey: builderKeys.shopBids }),
      client.invalidateQueries({ queryKey: ['board'] }),
    ]);
}

export function usePlaceBid(requestId: string) {
  const settled = useBidSettled(requestId);
  return useMutation({
    mutationFn: (input: BidInput) => fetchJson<BidView>(`/api/requests/${requestId}/bids`, { method: 'POST', json: input }),
    onSuccess: settled,
  });
}

export function useReviseBid(requestId: string) {
  const settled = useBidSettled(requestId);
  return useMutation({
    mutationFn: ({ bidId, input }: { bidId: string; input: BidInput }) => fetchJson<BidView>(`/api/bids/${bidId}`, { method: 'PATCH', json: input }),
    onSuccess: settled,
  });
}

export function useWithdrawBid(requestId: string) {
  const settled = useBidSettled(requestId);
  return useMutation({
    mutationFn: (bidId: string) => fetchJson<BidView>(`/api/bids/${bidId}/withdraw`, { method: 'POST' }),
    onSuccess: settled,
  });
}

export function useSaveShopSettings() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (input: ShopSettingsInput) => fetchJson<ShopSettings>('/api/shop/settings', { method: 'PATCH', json: input }),
    onSuccess: (saved) => {
      client.setQueryData(builderKeys.shopSettings, saved);
      return client.invalidateQueries({ queryKey: ['board'] });
    },
  });
}
