import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api, isApiError } from '@/lib/api-client';
import { type Person, personResponseSchema } from '@/lib/person';
import { queryKeys } from '@/lib/query-keys';

/** The signed-in person, or null when nobody is signed in (the API answers 401 then). */
export async function getMe(signal?: AbortSignal): Promise<Person | null> {
  try {
    const { person } = await api.get(apiPaths.me(), personResponseSchema, { signal });
    return person;
  } catch (error) {
    if (isApiError(error) && error.status === 401) return null;
    throw error;
  }
}

export const meQueryOptions = () =>
  queryOptions({
    queryKey: queryKeys.me(),
    queryFn: ({ signal }) => getMe(signal),
    staleTime: 5 * 60_000,
  });

export function useMe() {
  return useQuery(meQueryOptions());
}
