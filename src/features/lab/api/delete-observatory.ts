import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';

export function deleteObservatory(id: number): Promise<void> {
  return api.delete(apiPaths.observatory(id));
}

export function useDeleteObservatory() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteObservatory,
    onSettled: async () => {
      await queryClient.invalidateQueries({ queryKey: queryKeys.observatories.all() });
      await queryClient.invalidateQueries({ queryKey: queryKeys.candidates.all() });
    },
  });
}
