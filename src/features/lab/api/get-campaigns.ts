import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type Campaign, campaignSchema } from '../lib/campaigns';

const campaignListSchema = z.object({ campaigns: z.array(campaignSchema) });

export function getCampaigns(signal?: AbortSignal): Promise<Campaign[]> {
  return api.get(apiPaths.campaigns(), campaignListSchema, { signal }).then(({ campaigns }) => campaigns);
}

export const campaignsQueryOptions = () =>
  queryOptions({
    queryKey: queryKeys.campaigns.list(),
    queryFn: ({ signal }) => getCampaigns(signal),
  });

export function useCampaigns() {
  return useQuery(campaignsQueryOptions());
}
