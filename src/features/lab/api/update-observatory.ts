import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type Observatory, type ObservatoryFields, observatorySchema } from './get-observatories';

const observatoryResponseSchema = z.object({ observatory: observatorySchema });

export interface UpdateObservatoryInput {
  id: number;
  changes: Partial<ObservatoryFields>;
}

export async function updateObservatory({ id, changes }: UpdateObservatoryInput): Promise<Observatory> {
  const { observatory } = await api.patch(apiPaths.observatory(id), observatoryResponseSchema, changes);
  return observatory;
}

export function useUpdateObservatory() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateObservatory,
    onSettled: async () => {
      await queryClient.invalidateQueries({ queryKey: queryKeys.observatories.all() });
      // A moved site or a new limit changes what every candidate's windows say about it.
      await queryClient.invalidateQueries({ queryKey: queryKeys.candidates.all() });
    },
  });
}
