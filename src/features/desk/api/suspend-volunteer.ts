import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { deskVolunteerSchema } from '../lib/volunteers';

const suspendResponseSchema = z.object({ volunteer: deskVolunteerSchema, rescoring: z.number().int() });

export type SuspendResponse = z.infer<typeof suspendResponseSchema>;

export function suspendVolunteer({ id, reason }: { id: number; reason: string }): Promise<SuspendResponse> {
  return api.post(apiPaths.deskVolunteerSuspend(id), suspendResponseSchema, { reason: reason.trim() });
}

export function useSuspendVolunteer() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: suspendVolunteer,
    // A suspended volunteer's verdicts stop counting, so the snippets they judged are rescored: the
    // queue's scores, the people list and the audit log all move.
    onSettled: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: queryKeys.deskVolunteers.all() }),
        queryClient.invalidateQueries({ queryKey: queryKeys.splits.all() }),
        queryClient.invalidateQueries({ queryKey: queryKeys.people.all() }),
        queryClient.invalidateQueries({ queryKey: queryKeys.audit.all() }),
      ]),
  });
}
