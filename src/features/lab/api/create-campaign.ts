import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type Campaign, campaignResponseSchema, type SettingsPatch } from '../lib/campaigns';

export type CreateCampaignInput = SettingsPatch & { name: string };

export async function createCampaign(input: CreateCampaignInput): Promise<Campaign> {
  const { campaign } = await api.post(apiPaths.campaigns(), campaignResponseSchema, input);
  return campaign;
}

export function useCreateCampaign() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createCampaign,
    onSuccess: (campaign) => {
      // The campaign page opens next: give it the answer rather than asking again.
      queryClient.setQueryData(queryKeys.campaigns.detail(campaign.id), campaign);
      return queryClient.invalidateQueries({ queryKey: queryKeys.campaigns.list() });
    },
  });
}
