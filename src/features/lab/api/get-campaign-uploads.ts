import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { isUploadFinished, type Upload, uploadSchema } from '../lib/uploads';

const campaignUploadsSchema = z.object({ uploads: z.array(uploadSchema) });

/** How often the recent uploads refresh while one of them is still being read. */
const recentUploadsPollMs = 3_000;

export function getCampaignUploads(campaignId: number, signal?: AbortSignal): Promise<Upload[]> {
  return api
    .get(apiPaths.campaignUploads(campaignId), campaignUploadsSchema, { signal })
    .then(({ uploads }) => uploads);
}

export const campaignUploadsQueryOptions = (campaignId: number) =>
  queryOptions({
    queryKey: queryKeys.uploads.ofCampaign(campaignId),
    queryFn: ({ signal }) => getCampaignUploads(campaignId, signal),
    refetchInterval: (query) =>
      query.state.data?.some((upload) => !isUploadFinished(upload.status)) ? recentUploadsPollMs : false,
  });

export function useCampaignUploads(campaignId: number) {
  return useQuery(campaignUploadsQueryOptions(campaignId));
}
