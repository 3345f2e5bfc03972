import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type PeriodSearch, periodSearchSchema } from './get-period-search';

export interface StartPeriodSearchInput {
  targetId: number;
  /** Left out for the server's defaults (0.5 d to half the light curve's span). */
  minPeriodDays?: number;
  maxPeriodDays?: number;
}

const responseSchema = z.object({ periodSearch: periodSearchSchema.omit({ progress: true }) });

export async function startPeriodSearch({
  targetId,
  ...range
}: StartPeriodSearchInput): Promise<PeriodSearch> {
  const { periodSearch } = await api.post(apiPaths.targetPeriodSearch(targetId), responseSchema, range);
  return { ...periodSearch, progress: null };
}

export function useStartPeriodSearch(targetId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (range: Omit<StartPeriodSearchInput, 'targetId'>) =>
      startPeriodSearch({ targetId, ...range }),
    onSuccess: (periodSearch) => {
      // The queued search is the latest now: showing it at once starts the polling.
      queryClient.setQueryData(queryKeys.targets.periodSearch(targetId), periodSearch);
      // Vetting reads the latest search only once it is done, so until then it falls back to the dips.
      return queryClient.invalidateQueries({ queryKey: queryKeys.targets.vetting(targetId) });
    },
  });
}
