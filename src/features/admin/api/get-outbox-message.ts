import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type OutboxMessage, outboxMessageSchema } from '../lib/outbox';

const outboxMessageResponseSchema = z.object({ message: outboxMessageSchema });

export function getOutboxMessage(id: number, signal?: AbortSignal): Promise<OutboxMessage> {
  return api
    .get(apiPaths.outboxMessage(id), outboxMessageResponseSchema, { signal })
    .then(({ message }) => message);
}

export const outboxMessageQueryOptions = (id: number) =>
  queryOptions({
    queryKey: queryKeys.outbox.detail(id),
    queryFn: ({ signal }) => getOutboxMessage(id, signal),
    // A caught message never changes.
    staleTime: Number.POSITIVE_INFINITY,
  });

export function useOutboxMessage(id: number) {
  return useQuery(outboxMessageQueryOptions(id));
}
