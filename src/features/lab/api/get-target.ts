import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { plantedTruthSchema, snippetKinds, snippetStates } from '../lib/snippets';
import { targetSchema } from '../lib/targets';

const lightCurveSchema = z.object({
  id: z.number().int(),
  timeStart: z.number(),
  timeEnd: z.number(),
  pointCount: z.number().int(),
  cadenceDays: z.number().nullable(),
  noisePpm: z.number().nullable(),
  noise1hPpm: z.number().nullable(),
  isQuietReference: z.boolean(),
  timeSystem: z
    .object({
      timesys: z.string().nullable().optional(),
      timeref: z.string().nullable().optional(),
      timeunit: z.string().nullable().optional(),
      bjdRefDays: z.number().nullable().optional(),
    })
    .nullable(),
  series: z.object({ timeDays: z.array(z.number()), flux: z.array(z.number().nullable()) }),
});

export type TargetLightCurve = z.infer<typeof lightCurveSchema>;

const targetSnippetSchema = z.object({
  id: z.number().int(),
  kind: z.enum(snippetKinds),
  state: z.enum(snippetStates),
  timeStart: z.number(),
  timeEnd: z.number(),
  consensusScore: z.number().nullable(),
  plantedTruth: plantedTruthSchema.nullable(),
});

export type TargetSnippet = z.infer<typeof targetSnippetSchema>;

/** A settled dip volunteers found: times in the light curve's own days, like its series. */
const targetDipSchema = z.object({
  id: z.number().int(),
  snippetId: z.number().int(),
  timeCenter: z.number(),
  timeSigma: z.number().nullable(),
  depthPpm: z.number().nullable(),
  durationHours: z.number().nullable(),
  snr: z.number().nullable(),
  consensusScore: z.number().nullable(),
});

export type TargetDip = z.infer<typeof targetDipSchema>;

const targetDetailSchema = z.object({
  target: targetSchema.extend({ campaignId: z.number().int() }),
  lightCurves: z.array(lightCurveSchema),
  snippets: z.array(targetSnippetSchema),
  dips: z.array(targetDipSchema),
  /** The candidate this target became on the follow-up list, null while it is not one. */
  candidateId: z.number().int().nullable(),
});

export type TargetDetail = z.infer<typeof targetDetailSchema>;

export function getTarget(id: number, signal?: AbortSignal): Promise<TargetDetail> {
  return api.get(apiPaths.target(id), targetDetailSchema, { signal });
}

export const targetQueryOptions = (id: number) =>
  queryOptions({
    queryKey: queryKeys.targets.detail(id),
    queryFn: ({ signal }) => getTarget(id, signal),
  });

export function useTarget(id: number) {
  return useQuery(targetQueryOptions(id));
}
