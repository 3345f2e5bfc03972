import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';

const recordSchema = z.object({
  verdicts: z.object({
    total: z.number(),
    dip: z.number(),
    flat: z.number(),
    unsure: z.number(),
    last30Days: z.number(),
  }),
  controls: z.object({
    plantedSeen: z.number(),
    plantedFound: z.number(),
    quietSeen: z.number(),
    quietCorrect: z.number(),
    sensitivity: z.number().nullable(),
    specificity: z.number().nullable(),
  }),
  dipsHelped: z.number(),
  candidatesCredited: z.number(),
  recent: z.array(
    z.object({
      snippetId: z.number(),
      answer: z.string(),
      at: z.string(),
      campaignName: z.string(),
      designation: z.string().nullable(),
    }),
  ),
});

export type MyRecord = z.infer<typeof recordSchema>;

const recordResponseSchema = z.object({ record: recordSchema });

export function getRecord(signal?: AbortSignal): Promise<MyRecord> {
  return api.get(apiPaths.record(), recordResponseSchema, { signal }).then(({ record }) => record);
}

export const recordQueryOptions = () =>
  queryOptions({
    queryKey: queryKeys.record.mine(),
    queryFn: ({ signal }) => getRecord(signal),
    // Verdicts arrive from the Deck all the time; the page should show the newest when opened.
    staleTime: 0,
  });

export function useRecord() {
  return useQuery(recordQueryOptions());
}
