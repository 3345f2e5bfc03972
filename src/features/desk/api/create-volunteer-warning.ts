import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';

const warningResponseSchema = z.object({ recorded: z.boolean(), emailed: z.boolean() });

export type WarningResponse = z.infer<typeof warningResponseSchema>;

export function createVolunteerWarning({ id, note }: { id: number; note: string }): Promise<WarningResponse> {
  return api.post(apiPaths.deskVolunteerWarning(id), warningResponseSchema, { note: note.trim() });
}

export function useCreateVolunteerWarning() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createVolunteerWarning,
    // Until e-mail arrives, the audit log is where a warning lives.
    onSettled: () => queryClient.invalidateQueries({ queryKey: queryKeys.audit.all() }),
  });
}
