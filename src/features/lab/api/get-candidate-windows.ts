import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';

const windowObservatorySchema = z.object({
  observatoryId: z.number().int(),
  name: z.string(),
  observable: z.boolean(),
  reason: z.string().nullable(),
  minTargetAltitudeDeg: z.number().nullable(),
  maxSunAltitudeDeg: z.number().nullable(),
  sunSeparationDeg: z.number().nullable(),
});

const transitWindowSchema = z.object({
  epoch: z.number().int(),
  midBjdTdb: z.number(),
  /** Mid-transit uncertainty at this epoch: it grows with the epoch from the period's error. */
  sigmaDays: z.number(),
  startBjdTdb: z.number(),
  endBjdTdb: z.number(),
  startUtc: z.string(),
  midUtc: z.string(),
  endUtc: z.string(),
  sunSeparationDeg: z.number(),
  observatories: z.array(windowObservatorySchema),
});

const candidateWindowsSchema = z.object({
  candidate: z.object({
    id: z.number().int(),
    campaignId: z.number().int(),
    targetId: z.number().int(),
    designation: z.string(),
    periodDays: z.number().nullable(),
  }),
  windows: z.array(transitWindowSchema),
  leftOutNearSun: z.number().int().nonnegative(),
  cautions: z.array(z.string()),
});

export type TransitWindow = z.infer<typeof transitWindowSchema>;
export type WindowObservatory = z.infer<typeof windowObservatorySchema>;
export type CandidateWindows = z.infer<typeof candidateWindowsSchema>;

export const WINDOW_COUNTS = [5, 10, 20, 50] as const;
export type WindowCount = (typeof WINDOW_COUNTS)[number];

export function getCandidateWindows(
  candidateId: number,
  count: number,
  signal?: AbortSignal,
): Promise<CandidateWindows> {
  return api.get(apiPaths.candidateWindows(candidateId, count), candidateWindowsSchema, { signal });
}

export const candidateWindowsQueryOptions = (candidateId: number, count: number) =>
  queryOptions({
    queryKey: queryKeys.candidates.windows(candidateId, count),
    queryFn: ({ signal }) => getCandidateWindows(candidateId, count, signal),
  });

export function useCandidateWindows(candidateId: number, count: number) {
  // The windows already shown stay while more are fetched, so the page does not jump back to a spinner.
  return useQuery({ ...candidateWindowsQueryOptions(candidateId, count), placeholderData: keepPreviousData });
}
