import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';

const dipSchema = z.object({
  id: z.number().int(),
  snippetId: z.number().int().nullable().optional(),
  /** Light-curve time (BJD_TDB − the light curve's reference), in days. */
  timeCenter: z.number(),
  timeSigma: z.number().nullable(),
  depthPpm: z.number().nullable(),
  durationHours: z.number().nullable(),
  snr: z.number().nullable(),
  consensusScore: z.number().nullable(),
});

const dipTargetSchema = z.object({
  targetId: z.number().int(),
  designation: z.string(),
  dipCount: z.number().int().nonnegative(),
  bestSnr: z.number().nullable(),
  meanScore: z.number().nullable(),
  onCandidate: z.boolean(),
  dips: z.array(dipSchema),
});

export type SettledDip = z.infer<typeof dipSchema>;
export type DipTarget = z.infer<typeof dipTargetSchema>;

const dipTargetsResponseSchema = z.object({ targets: z.array(dipTargetSchema) });

export function getDipTargets(campaignId: number, signal?: AbortSignal): Promise<DipTarget[]> {
  return api
    .get(apiPaths.campaignDipTargets(campaignId), dipTargetsResponseSchema, { signal })
    .then(({ targets }) => targets);
}

export const dipTargetsQueryOptions = (campaignId: number) =>
  queryOptions({
    queryKey: queryKeys.candidates.dipTargets(campaignId),
    queryFn: ({ signal }) => getDipTargets(campaignId, signal),
  });

export function useDipTargets(campaignId: number) {
  return useQuery(dipTargetsQueryOptions(campaignId));
}
