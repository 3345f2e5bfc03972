import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type RulingResponse, type RulingValue, rulingResponseSchema } from '../lib/splits';

export interface CreateRulingInput {
  snippetId: number;
  ruling: RulingValue;
  /** At most 2,000 characters; left out when empty. */
  note?: string;
}

export function createRuling({ snippetId, ruling, note }: CreateRulingInput): Promise<RulingResponse> {
  const body = note?.trim() ? { ruling, note: note.trim() } : { ruling };
  return api.post(apiPaths.snippetRuling(snippetId), rulingResponseSchema, body);
}

export function useCreateRuling() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createRuling,
    // A ruling takes the snippet out of the queue, changes its state in the Lab's snippet lists, feeds
    // volunteers' reliability and writes the audit log.
    onSettled: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: queryKeys.splits.all() }),
        queryClient.invalidateQueries({ queryKey: queryKeys.snippets.all() }),
        queryClient.invalidateQueries({ queryKey: queryKeys.deskVolunteers.all() }),
        queryClient.invalidateQueries({ queryKey: queryKeys.audit.all() }),
      ]),
  });
}
