import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys, type TargetListParams } from '@/lib/query-keys';
import { targetSchema } from '../lib/targets';

const targetPageSchema = z.object({
  targets: z.array(targetSchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});

export type TargetPage = z.infer<typeof targetPageSchema>;

export function getTargets(params: TargetListParams, signal?: AbortSignal): Promise<TargetPage> {
  return api.get(apiPaths.campaignTargets(params.campaignId), targetPageSchema, {
    query: { q: params.q.trim(), page: params.page, pageSize: params.pageSize },
    signal,
  });
}

export const targetsQueryOptions = (params: TargetListParams) =>
  queryOptions({
    queryKey: queryKeys.targets.list(params),
    queryFn: ({ signal }) => getTargets(params, signal),
    placeholderData: keepPreviousData,
  });

export function useTargets(params: TargetListParams) {
  return useQuery(targetsQueryOptions(params));
}
