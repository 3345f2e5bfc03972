import { queryOptions, useQuery, useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { isUploadFinished, type Upload, uploadPollMs, uploadSchema } from '../lib/uploads';

export function getUpload(id: number, signal?: AbortSignal): Promise<Upload> {
  return api.get(apiPaths.upload(id), uploadSchema, { signal });
}

export const uploadQueryOptions = (id: number) =>
  queryOptions({
    queryKey: queryKeys.uploads.detail(id),
    queryFn: ({ signal }) => getUpload(id, signal),
    // Asks every second while the worker reads the file, and stops once it is done or failed.
    refetchInterval: (query) => {
      const status = query.state.data?.status;
      return status && isUploadFinished(status) ? false : uploadPollMs;
    },
    staleTime: 0,
  });

export function useUpload(id: number) {
  return useQuery(uploadQueryOptions(id));
}

/**
 * Polls one upload and, when the worker finishes it, refreshes what it changed: the campaign's counts,
 * its targets, snippets and recent uploads.
 */
export function useUploadProgress(id: number, campaignId: number) {
  const queryClient = useQueryClient();
  const upload = useUpload(id);
  const status = upload.data?.status;
  useEffect(() => {
    if (!status || !isUploadFinished(status)) return;
    void Promise.all([
      queryClient.invalidateQueries({ queryKey: queryKeys.campaigns.all() }),
      queryClient.invalidateQueries({ queryKey: queryKeys.targets.all() }),
      queryClient.invalidateQueries({ queryKey: queryKeys.snippets.all() }),
      queryClient.invalidateQueries({ queryKey: queryKeys.uploads.ofCampaign(campaignId) }),
    ]);
  }, [status, campaignId, queryClient]);
  return upload;
}
