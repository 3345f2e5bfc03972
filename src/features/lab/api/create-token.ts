import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type CreatedToken, createdTokenSchema } from '../lib/tokens';

export function createToken(name: string): Promise<CreatedToken> {
  return api.post(apiPaths.tokens(), createdTokenSchema, { name });
}

export function useCreateToken() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createToken,
    onSettled: () => queryClient.invalidateQueries({ queryKey: queryKeys.tokens.all() }),
  });
}
