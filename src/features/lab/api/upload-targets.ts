import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type CatalogueReport, catalogueReportSchema } from '../lib/targets';

export interface UploadTargetsInput {
  campaignId: number;
  file: File;
}

export function uploadTargets({ campaignId, file }: UploadTargetsInput): Promise<CatalogueReport> {
  const form = new FormData();
  form.append('file', file);
  return api.upload(apiPaths.campaignTargets(campaignId), catalogueReportSchema, form);
}

export function useUploadTargets() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: uploadTargets,
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: queryKeys.targets.all() }),
        queryClient.invalidateQueries({ queryKey: queryKeys.campaigns.all() }),
      ]),
  });
}
