import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type Newsletter, newsletterPollInterval, newsletterSchema } from '../lib/newsletters';

const newsletterListSchema = z.object({ newsletters: z.array(newsletterSchema) });

export function getNewsletters(signal?: AbortSignal): Promise<Newsletter[]> {
  return api
    .get(apiPaths.newsletters(), newsletterListSchema, { signal })
    .then(({ newsletters }) => newsletters);
}

export const newslettersQueryOptions = () =>
  queryOptions({
    queryKey: queryKeys.newsletters.list(),
    queryFn: ({ signal }) => getNewsletters(signal),
    refetchInterval: (query) =>
      newsletterPollInterval((query.state.data ?? []).map((newsletter) => newsletter.status)),
  });

export function useNewsletters() {
  return useQuery(newslettersQueryOptions());
}
