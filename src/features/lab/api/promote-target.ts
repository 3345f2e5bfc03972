import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api, isApiError } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';

export interface PromoteTargetInput {
  campaignId: number;
  targetId: number;
  dipIds?: number[];
  notes?: string;
  /** The follow-up telescope's precision over the transit, for the priority score. */
  telescopePrecisionPpm?: number;
}

const promotedSchema = z.object({
  candidate: z.object({
    id: z.number().int(),
    campaignId: z.number().int(),
    targetId: z.number().int(),
    designation: z.string(),
    priority: z.number().nullable(),
    dipIds: z.array(z.number().int()),
    credits: z.object({ named: z.array(z.string()), others: z.number().int() }),
    caution: z.string(),
  }),
});

export type PromotedCandidate = z.infer<typeof promotedSchema>['candidate'];

export async function promoteTarget({ campaignId, ...body }: PromoteTargetInput): Promise<PromotedCandidate> {
  const { candidate } = await api.post(apiPaths.campaignCandidates(campaignId), promotedSchema, body);
  return candidate;
}

export function usePromoteTarget(targetId: number) {
  const queryClient = useQueryClient();
  const refresh = () =>
    Promise.all([
      queryClient.invalidateQueries({ queryKey: queryKeys.targets.detail(targetId) }),
      queryClient.invalidateQueries({ queryKey: queryKeys.candidates.all() }),
    ]);
  return useMutation({
    mutationFn: promoteTarget,
    onSuccess: refresh,
    onError: (error) => {
      // Promoted elsewhere meanwhile: the target's own answer then carries the candidate to link to.
      if (isApiError(error) && error.status === 409) return refresh();
      return undefined;
    },
  });
}
