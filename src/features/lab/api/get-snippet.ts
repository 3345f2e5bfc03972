import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type SnippetDetail, snippetDetailSchema } from '../lib/snippets';

const snippetResponseSchema = z.object({ snippet: snippetDetailSchema });

export function getSnippet(id: number, signal?: AbortSignal): Promise<SnippetDetail> {
  return api.get(apiPaths.snippet(id), snippetResponseSchema, { signal }).then(({ snippet }) => snippet);
}

export const snippetQueryOptions = (id: number) =>
  queryOptions({
    queryKey: queryKeys.snippets.detail(id),
    queryFn: ({ signal }) => getSnippet(id, signal),
    // Hovering down the list should swap the preview without flashing an empty panel in between.
    placeholderData: keepPreviousData,
    staleTime: 60_000,
  });

export function useSnippet(id: number | null) {
  return useQuery({ ...snippetQueryOptions(id ?? 0), enabled: id !== null });
}
