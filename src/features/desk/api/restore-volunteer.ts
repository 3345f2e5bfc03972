import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { deskVolunteerSchema } from '../lib/volunteers';

const restoreResponseSchema = z.object({ volunteer: deskVolunteerSchema, rescoring: z.number().int() });

export type RestoreResponse = z.infer<typeof restoreResponseSchema>;

export function restoreVolunteer({ id, note }: { id: number; note?: string }): Promise<RestoreResponse> {
  return api.post(
    apiPaths.deskVolunteerRestore(id),
    restoreResponseSchema,
    note?.trim() ? { note: note.trim() } : {},
  );
}

export function useRestoreVolunteer() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: restoreVolunteer,
    onSettled: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: queryKeys.deskVolunteers.all() }),
        queryClient.invalidateQueries({ queryKey: queryKeys.splits.all() }),
        queryClient.invalidateQueries({ queryKey: queryKeys.people.all() }),
        queryClient.invalidateQueries({ queryKey: queryKeys.audit.all() }),
      ]),
  });
}
