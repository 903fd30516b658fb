'use client';

import { useQuery, useQueryClient } from '@tanstack/react-query';
import type { JobView } from '@/lib/payments/jobView';
import { callApi } from './api';

export const jobKey = (id: string) => ['job', id] as const;

/** One job for the signed-in viewer; `pollMs` keeps asking while something is expected to change. */
export function useJob(id: string, initial?: JobView, pollMs?: (job: JobView | undefined) => number | false) {
  return useQuery({
    queryKey: jobKey(id),
    queryFn: () => callApi<JobView>(`/api/jobs/${id}`),
    initialData: initial,
    refetchInterval: pollMs ? (q) => pollMs(q.state.data) : false,
  });
}

export function useSetJob(id: string) {
  const client = useQueryClient();
  return (job: JobView) => client.setQueryData(jobKey(id), job);
}
