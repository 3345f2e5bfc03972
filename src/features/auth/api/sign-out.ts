import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { apiRequest } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';

export async function signOut(): Promise<void> {
  await apiRequest(apiPaths.signOut(), { method: 'POST', rotatesSession: true });
}

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSuccess: () => {
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== queryKeys.me()[0] });
      queryClient.setQueryData(queryKeys.me(), null);
    },
  });
}
