import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';

export function revokeToken(id: number): Promise<void> {
  return api.delete(apiPaths.token(id));
}

export function useRevokeToken() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: revokeToken,
    onSettled: () => queryClient.invalidateQueries({ queryKey: queryKeys.tokens.all() }),
  });
}
