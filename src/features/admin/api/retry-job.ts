import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type Job, jobSchema } from '../lib/jobs';

const retryResponseSchema = z.object({ job: jobSchema });

export async function retryJob(id: string): Promise<Job> {
  const { job } = await api.post(apiPaths.retryJob(id), retryResponseSchema);
  return job;
}

export function useRetryJob() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: retryJob,
    // A retry moves a job between states, so both the counts and the failed list change; a refused retry
    // (already retried elsewhere) means both are out of date too.
    onSettled: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: queryKeys.queues.all() }),
        queryClient.invalidateQueries({ queryKey: queryKeys.jobs.all() }),
      ]),
  });
}
