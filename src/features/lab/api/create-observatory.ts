import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type Observatory, type ObservatoryFields, observatorySchema } from './get-observatories';

const observatoryResponseSchema = z.object({ observatory: observatorySchema });

export async function createObservatory(fields: ObservatoryFields): Promise<Observatory> {
  const { observatory } = await api.post(apiPaths.observatories(), observatoryResponseSchema, fields);
  return observatory;
}

export function useCreateObservatory() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createObservatory,
    onSettled: async () => {
      await queryClient.invalidateQueries({ queryKey: queryKeys.observatories.all() });
      // Every candidate's windows say, per observatory, whether they can be watched.
      await queryClient.invalidateQueries({ queryKey: queryKeys.candidates.all() });
    },
  });
}
