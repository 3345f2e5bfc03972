import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type DeskVolunteer, volunteerResponseSchema } from '../lib/volunteers';

export interface ClearFlagInput {
  id: number;
  code: string;
  /** Why the flag does not apply: 1 to 500 characters. */
  note: string;
}

export async function clearVolunteerFlag({ id, code, note }: ClearFlagInput): Promise<DeskVolunteer> {
  const { volunteer } = await api.post(apiPaths.deskVolunteerClearFlag(id, code), volunteerResponseSchema, {
    note: note.trim(),
  });
  return volunteer;
}

export function useClearVolunteerFlag() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: clearVolunteerFlag,
    onSettled: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: queryKeys.deskVolunteers.all() }),
        queryClient.invalidateQueries({ queryKey: queryKeys.audit.all() }),
      ]),
  });
}
