import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import type { CandidateState, Disposition } from '../lib/candidates';
import { type Candidate, candidateSchema } from './get-candidates';

export interface CandidateChanges {
  state?: CandidateState;
  disposition?: Disposition;
  notes?: string | null;
}

export interface UpdateCandidateInput {
  id: number;
  changes: CandidateChanges;
}

const candidateResponseSchema = z.object({ candidate: candidateSchema });

export async function updateCandidate({ id, changes }: UpdateCandidateInput): Promise<Candidate> {
  const { candidate } = await api.patch(apiPaths.candidate(id), candidateResponseSchema, changes);
  return candidate;
}

export function useUpdateCandidate() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateCandidate,
    // The review list, the follow-up list and the windows all share the resource.
    onSettled: () => queryClient.invalidateQueries({ queryKey: queryKeys.candidates.all() }),
  });
}
