import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { CANDIDATE_STATES, DISPOSITIONS } from '../lib/candidates';

export const candidateSchema = z.object({
  id: z.number().int(),
  campaignId: z.number().int(),
  targetId: z.number().int(),
  designation: z.string(),
  promotedBy: z.number().int().nullable(),
  state: z.enum(CANDIDATE_STATES),
  disposition: z.enum(DISPOSITIONS),
  notes: z.string().nullable(),
  periodDays: z.number().nullable(),
  periodSigmaDays: z.number().nullable(),
  /** Mid-transit time, BJD_TDB (a full Julian date). */
  t0Bjd: z.number().nullable(),
  t0SigmaDays: z.number().nullable(),
  depthPpm: z.number().nullable(),
  durationHours: z.number().nullable(),
  snr: z.number().nullable(),
  priority: z.number().nullable(),
  dipIds: z.array(z.number().int()),
  createdAt: z.string(),
  updatedAt: z.string(),
  credits: z.object({ named: z.array(z.string()), others: z.number().int().nonnegative() }),
});

export type Candidate = z.infer<typeof candidateSchema>;

const candidatesResponseSchema = z.object({ caution: z.string(), candidates: z.array(candidateSchema) });

export type CampaignCandidates = z.infer<typeof candidatesResponseSchema>;

export function getCandidates(campaignId: number, signal?: AbortSignal): Promise<CampaignCandidates> {
  return api.get(apiPaths.campaignCandidates(campaignId), candidatesResponseSchema, { signal });
}

export const candidatesQueryOptions = (campaignId: number) =>
  queryOptions({
    queryKey: queryKeys.candidates.ofCampaign(campaignId),
    queryFn: ({ signal }) => getCandidates(campaignId, signal),
  });

/** The campaign's follow-up list; `enabled` false while the campaign is not known yet. */
export function useCandidates(campaignId: number, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...candidatesQueryOptions(campaignId), enabled });
}
