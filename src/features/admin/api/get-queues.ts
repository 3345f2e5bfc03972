import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type QueuesOverview, queuesOverviewSchema, queuesRefreshMs } from '../lib/queues';

export function getQueues(signal?: AbortSignal): Promise<QueuesOverview> {
  return api.get(apiPaths.queues(), queuesOverviewSchema, { signal });
}

export const queuesQueryOptions = () =>
  queryOptions({
    queryKey: queryKeys.queues.overview(),
    queryFn: ({ signal }) => getQueues(signal),
    // TanStack Query skips interval refetches while the tab is hidden, so a forgotten tab costs nothing.
    refetchInterval: queuesRefreshMs,
    staleTime: 0,
  });

export function useQueues() {
  return useQuery(queuesQueryOptions());
}
