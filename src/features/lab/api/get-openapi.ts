import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type ApiReference, openApiDocumentSchema, readOpenApi } from '../lib/openapi';

export function getOpenApi(signal?: AbortSignal): Promise<ApiReference> {
  return api.get(apiPaths.openApi(), openApiDocumentSchema, { signal }).then(readOpenApi);
}

export const openApiQueryOptions = () =>
  queryOptions({
    queryKey: queryKeys.openApi(),
    queryFn: ({ signal }) => getOpenApi(signal),
    // The document changes only with a new server release.
    staleTime: 10 * 60_000,
  });

export function useOpenApi() {
  return useQuery(openApiQueryOptions());
}
