import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys, type SnippetListParams } from '@/lib/query-keys';
import { snippetRowSchema } from '../lib/snippets';

const snippetPageSchema = z.object({
  snippets: z.array(snippetRowSchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});

export type SnippetPage = z.infer<typeof snippetPageSchema>;

export function getSnippets(params: SnippetListParams, signal?: AbortSignal): Promise<SnippetPage> {
  return api.get(apiPaths.campaignSnippets(params.campaignId), snippetPageSchema, {
    query: {
      state: params.state,
      kind: params.kind,
      target: params.target.trim(),
      sort: params.sort,
      order: params.order,
      page: params.page,
      pageSize: params.pageSize,
    },
    signal,
  });
}

export const snippetsQueryOptions = (params: SnippetListParams) =>
  queryOptions({
    queryKey: queryKeys.snippets.list(params),
    queryFn: ({ signal }) => getSnippets(params, signal),
    placeholderData: keepPreviousData,
  });

export function useSnippets(params: SnippetListParams) {
  return useQuery(snippetsQueryOptions(params));
}
