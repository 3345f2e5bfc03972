import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type Campaign, campaignResponseSchema } from '../lib/campaigns';

export function getCampaign(id: number, signal?: AbortSignal): Promise<Campaign> {
  return api.get(apiPaths.campaign(id), campaignResponseSchema, { signal }).then(({ campaign }) => campaign);
}

export const campaignQueryOptions = (id: number) =>
  queryOptions({
    queryKey: queryKeys.campaigns.detail(id),
    queryFn: ({ signal }) => getCampaign(id, signal),
  });

export function useCampaign(id: number) {
  return useQuery(campaignQueryOptions(id));
}
