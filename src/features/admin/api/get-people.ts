import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { personSchema } from '@/lib/person';
import { type PeopleListParams, queryKeys } from '@/lib/query-keys';

const peoplePageSchema = z.object({
  people: z.array(personSchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});

export type PeoplePage = z.infer<typeof peoplePageSchema>;

export function getPeople(params: PeopleListParams, signal?: AbortSignal): Promise<PeoplePage> {
  return api.get(apiPaths.people(), peoplePageSchema, {
    query: { q: params.q.trim(), role: params.role, page: params.page, pageSize: params.pageSize },
    signal,
  });
}

export const peopleQueryOptions = (params: PeopleListParams) =>
  queryOptions({
    queryKey: queryKeys.people.list(params),
    queryFn: ({ signal }) => getPeople(params, signal),
    placeholderData: keepPreviousData,
  });

export function usePeople(params: PeopleListParams) {
  return useQuery(peopleQueryOptions(params));
}
