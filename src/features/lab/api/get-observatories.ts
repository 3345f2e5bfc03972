import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';

export const observatorySchema = z.object({
  id: z.number().int(),
  name: z.string(),
  latitudeDeg: z.number(),
  /** East positive. */
  longitudeDeg: z.number(),
  elevationM: z.number(),
  minTargetAltitudeDeg: z.number(),
  sunAltitudeLimitDeg: z.number(),
  createdAt: z.string(),
});

export type Observatory = z.infer<typeof observatorySchema>;
export type ObservatoryFields = Omit<Observatory, 'id' | 'createdAt'>;

const observatoriesResponseSchema = z.object({ observatories: z.array(observatorySchema) });

export function getObservatories(signal?: AbortSignal): Promise<Observatory[]> {
  return api
    .get(apiPaths.observatories(), observatoriesResponseSchema, { signal })
    .then(({ observatories }) => observatories);
}

export const observatoriesQueryOptions = () =>
  queryOptions({
    queryKey: queryKeys.observatories.list(),
    queryFn: ({ signal }) => getObservatories(signal),
  });

export function useObservatories() {
  return useQuery(observatoriesQueryOptions());
}
