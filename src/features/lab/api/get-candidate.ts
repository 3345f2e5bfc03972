import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { candidateSchema } from './get-candidates';

const candidateDetailSchema = z.object({ candidate: candidateSchema.extend({ caution: z.string() }) });

export type CandidateDetail = z.infer<typeof candidateDetailSchema>['candidate'];

export function getCandidate(id: number, signal?: AbortSignal): Promise<CandidateDetail> {
  return api
    .get(apiPaths.candidate(id), candidateDetailSchema, { signal })
    .then((answer) => answer.candidate);
}

export const candidateQueryOptions = (id: number) =>
  queryOptions({
    queryKey: queryKeys.candidates.detail(id),
    queryFn: ({ signal }) => getCandidate(id, signal),
  });

export function useCandidate(id: number) {
  return useQuery(candidateQueryOptions(id));
}
