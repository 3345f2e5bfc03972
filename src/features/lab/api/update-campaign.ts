import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import {
  type Campaign,
  type CampaignStatus,
  campaignResponseSchema,
  type SettingsPatch,
} from '../lib/campaigns';

export interface UpdateCampaignInput {
  id: number;
  changes: SettingsPatch & { status?: CampaignStatus };
}

export async function updateCampaign({ id, changes }: UpdateCampaignInput): Promise<Campaign> {
  const { campaign } = await api.patch(apiPaths.campaign(id), campaignResponseSchema, changes);
  return campaign;
}

export function useUpdateCampaign() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateCampaign,
    onSuccess: (campaign) => queryClient.setQueryData(queryKeys.campaigns.detail(campaign.id), campaign),
    // A refused change (closed elsewhere meanwhile) means what is shown is out of date too.
    onSettled: () => queryClient.invalidateQueries({ queryKey: queryKeys.campaigns.all() }),
  });
}
