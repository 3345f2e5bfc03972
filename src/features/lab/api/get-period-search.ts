import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { periodSearchPollInterval } from '../lib/period-search';

/** What BLS measured at one trial period (the best, its half or its double); null where it could not. */
const foldDiagnosticsSchema = z.object({
  depthPpm: z.number().nullable(),
  depthErrPpm: z.number().nullable(),
  oddEvenDifferenceSigma: z.number().nullable(),
  depthSecondaryPpm: z.number().nullable(),
  depthSecondaryErrPpm: z.number().nullable(),
  harmonicDeltaLogLikelihood: z.number().nullable(),
  transitsWithData: z.number().int(),
});

export type FoldDiagnostics = z.infer<typeof foldDiagnosticsSchema>;

const periodSearchResultSchema = z.object({
  pointCount: z.number().int(),
  baselineDays: z.number(),
  /** Add to t0Days for BJD_TDB; null when the light curve did not say. */
  bjdRefDays: z.number().nullable(),
  grid: z.object({ periods: z.number().int(), durationsHours: z.array(z.number()) }),
  best: z
    .object({
      periodDays: z.number(),
      t0Days: z.number(),
      durationHours: z.number(),
      depthPpm: z.number(),
      depthErrPpm: z.number().nullable(),
      snr: z.number(),
      logLikelihood: z.number(),
    })
    .nullable(),
  diagnostics: z
    .object({
      atBest: foldDiagnosticsSchema.nullable(),
      atHalf: foldDiagnosticsSchema.nullable(),
      atDouble: foldDiagnosticsSchema.nullable(),
    })
    .nullable(),
  periodogram: z.object({ periodsDays: z.array(z.number()), power: z.array(z.number()) }),
});

export type PeriodSearchResult = z.infer<typeof periodSearchResultSchema>;

export const periodSearchSchema = z.object({
  id: z.number().int(),
  targetId: z.number().int(),
  status: z.enum(['queued', 'running', 'done', 'failed']),
  job: z.string().nullable(),
  settings: z
    .object({
      minPeriodDays: z.number(),
      maxPeriodDays: z.number().nullable(),
      oversample: z.number(),
    })
    .partial()
    .nullable(),
  result: periodSearchResultSchema.nullable(),
  error: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
  /** The worker's progress while queued or running; null otherwise or when the job has not said. */
  progress: z.object({ percent: z.number(), stage: z.string() }).nullable().optional(),
});

export type PeriodSearch = z.infer<typeof periodSearchSchema>;

const responseSchema = z.object({ periodSearch: periodSearchSchema.nullable() });

/** The target's latest period search, or null when none was ever started. */
export async function getPeriodSearch(targetId: number, signal?: AbortSignal): Promise<PeriodSearch | null> {
  const { periodSearch } = await api.get(apiPaths.targetPeriodSearch(targetId), responseSchema, { signal });
  return periodSearch;
}

export const periodSearchQueryOptions = (targetId: number) =>
  queryOptions({
    queryKey: queryKeys.targets.periodSearch(targetId),
    queryFn: ({ signal }) => getPeriodSearch(targetId, signal),
    // Ask again only while the worker is still at it; a finished search never changes.
    refetchInterval: (query) => periodSearchPollInterval(query.state.data?.status),
  });

export function usePeriodSearch(targetId: number) {
  return useQuery(periodSearchQueryOptions(targetId));
}
