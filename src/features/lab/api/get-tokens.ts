import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type Token, tokenSchema } from '../lib/tokens';

const tokenListSchema = z.object({ tokens: z.array(tokenSchema) });

export function getTokens(signal?: AbortSignal): Promise<Token[]> {
  return api.get(apiPaths.tokens(), tokenListSchema, { signal }).then(({ tokens }) => tokens);
}

export const tokensQueryOptions = () =>
  queryOptions({
    queryKey: queryKeys.tokens.list(),
    queryFn: ({ signal }) => getTokens(signal),
  });

export function useTokens() {
  return useQuery(tokensQueryOptions());
}
