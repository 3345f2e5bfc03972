import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type AcceptedUpload, acceptedUploadSchema } from '../lib/uploads';

const uploadAnswerSchema = z.object({ uploads: z.array(acceptedUploadSchema) });

export interface UploadLightCurvesInput {
  campaignId: number;
  files: readonly File[];
  /** A designation, or '' to take the target from each file (the FITS OBJECT keyword). */
  target: string;
  quietReference: boolean;
}

export async function uploadLightCurves(input: UploadLightCurvesInput): Promise<AcceptedUpload[]> {
  const form = new FormData();
  for (const file of input.files) form.append('files', file);
  if (input.target.trim()) form.append('target', input.target.trim());
  form.append('quietReference', input.quietReference ? 'true' : 'false');
  const { uploads } = await api.upload(
    apiPaths.campaignLightCurves(input.campaignId),
    uploadAnswerSchema,
    form,
  );
  return uploads;
}

export function useUploadLightCurves() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: uploadLightCurves,
    onSuccess: (_uploads, input) =>
      queryClient.invalidateQueries({ queryKey: queryKeys.uploads.ofCampaign(input.campaignId) }),
  });
}
