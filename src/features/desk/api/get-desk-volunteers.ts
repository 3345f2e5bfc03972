import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { type DeskVolunteerListParams, queryKeys } from '@/lib/query-keys';
import { deskVolunteerSchema } from '../lib/volunteers';

const volunteerPageSchema = z.object({ volunteers: z.array(deskVolunteerSchema), total: z.number().int() });

export type VolunteerPage = z.infer<typeof volunteerPageSchema>;

export function getDeskVolunteers(
  params: DeskVolunteerListParams,
  signal?: AbortSignal,
): Promise<VolunteerPage> {
  return api.get(apiPaths.deskVolunteers(), volunteerPageSchema, {
    query: {
      campaign: params.campaign ?? undefined,
      search: params.search.trim(),
      flagged: params.flagged ? 'true' : undefined,
      sort: params.sort,
      order: params.order,
      limit: params.limit,
      offset: params.offset,
    },
    signal,
  });
}

export const deskVolunteersQueryOptions = (params: DeskVolunteerListParams) =>
  queryOptions({
    queryKey: queryKeys.deskVolunteers.list(params),
    queryFn: ({ signal }) => getDeskVolunteers(params, signal),
    placeholderData: keepPreviousData,
  });

export function useDeskVolunteers(params: DeskVolunteerListParams) {
  return useQuery(deskVolunteersQueryOptions(params));
}
