import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type Newsletter, newsletterPollInterval, newsletterResponseSchema } from '../lib/newsletters';

export function getNewsletter(id: number, signal?: AbortSignal): Promise<Newsletter> {
  return api
    .get(apiPaths.newsletter(id), newsletterResponseSchema, { signal })
    .then(({ newsletter }) => newsletter);
}

export const newsletterQueryOptions = (id: number) =>
  queryOptions({
    queryKey: queryKeys.newsletters.detail(id),
    queryFn: ({ signal }) => getNewsletter(id, signal),
    refetchInterval: (query) => {
      const status = query.state.data?.status;
      return status ? newsletterPollInterval([status]) : false;
    },
  });

export function useNewsletter(id: number) {
  return useQuery(newsletterQueryOptions(id));
}
