'use client';

import { useQuery } from '@tanstack/react-query';
import { fetchJson } from '@/components/market/builder/fetchJson';
import type { UploadList, UploadPurpose } from '@/lib/storage/schema';

export const uploadsKey = (purpose: UploadPurpose, subjectId: string) => ['uploads', purpose, subjectId] as const;

/** The ready photos of one subject, with the limits and whether the viewer may add more. */
export function useUploads(purpose: UploadPurpose, subjectId: string) {
  return useQuery({
    queryKey: uploadsKey(purpose, subjectId),
    queryFn: ({ signal }) => fetchJson<UploadList>(`/api/uploads?${new URLSearchParams({ purpose, subjectId })}`, { signal }),
  });
}
