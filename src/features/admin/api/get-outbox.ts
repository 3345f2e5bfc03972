import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { type OutboxListParams, queryKeys } from '@/lib/query-keys';
import { outboxSummarySchema } from '../lib/outbox';

const outboxPageSchema = z.object({
  messages: z.array(outboxSummarySchema),
  total: z.number().int(),
});

export type OutboxPage = z.infer<typeof outboxPageSchema>;

export function getOutbox(params: OutboxListParams, signal?: AbortSignal): Promise<OutboxPage> {
  return api.get(apiPaths.outbox(), outboxPageSchema, {
    query: { limit: params.limit, offset: params.offset },
    signal,
  });
}

export const outboxQueryOptions = (params: OutboxListParams) =>
  queryOptions({
    queryKey: queryKeys.outbox.list(params),
    queryFn: ({ signal }) => getOutbox(params, signal),
    placeholderData: keepPreviousData,
    // Mail arrives whenever the worker sends it; an admin opening the page wants the newest.
    staleTime: 0,
  });

export function useOutbox(params: OutboxListParams) {
  return useQuery(outboxQueryOptions(params));
}
