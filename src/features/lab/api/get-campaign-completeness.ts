import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';

const count = z.number().int().nonnegative();
const share = z.number().min(0).max(1).nullable();

const recoverySchema = z.object({
  recovered: count,
  missed: count,
  pending: count,
  rate: share,
  wilsonLow: share,
  wilsonHigh: share,
});

/** One bin: [lower, upper) in the binning's unit (SNR, ppm or hours); upper null for the open last bin. */
const recoveryBinSchema = recoverySchema.extend({ lower: z.number(), upper: z.number().nullable() });

export const completenessSchema = z.object({
  planted: recoverySchema.extend({ total: count }),
  quiet: z.object({
    total: count,
    falseDips: count,
    flat: count,
    pending: count,
    rate: share,
    wilsonLow: share,
    wilsonHigh: share,
  }),
  bySnr: z.array(recoveryBinSchema),
  byDepth: z.array(recoveryBinSchema),
  byDuration: z.array(recoveryBinSchema),
  interval: z.object({ method: z.literal('wilson'), z: z.number() }),
});

export type Completeness = z.infer<typeof completenessSchema>;
export type RecoveryBin = z.infer<typeof recoveryBinSchema>;

const completenessResponseSchema = z.object({ completeness: completenessSchema });

export function getCampaignCompleteness(campaignId: number, signal?: AbortSignal): Promise<Completeness> {
  return api
    .get(apiPaths.campaignCompleteness(campaignId), completenessResponseSchema, { signal })
    .then(({ completeness }) => completeness);
}

export const campaignCompletenessQueryOptions = (campaignId: number) =>
  queryOptions({
    queryKey: queryKeys.campaigns.completeness(campaignId),
    queryFn: ({ signal }) => getCampaignCompleteness(campaignId, signal),
  });

export function useCampaignCompleteness(campaignId: number) {
  return useQuery(campaignCompletenessQueryOptions(campaignId));
}
