import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { type JobListParams, queryKeys } from '@/lib/query-keys';
import { type Job, jobSchema } from '../lib/jobs';
import { queuesRefreshMs } from '../lib/queues';

const jobListSchema = z.object({ jobs: z.array(jobSchema) });

export function getJobs(params: JobListParams, signal?: AbortSignal): Promise<Job[]> {
  return api
    .get(apiPaths.jobs(), jobListSchema, {
      query: { state: params.state, queue: params.queue, limit: params.limit },
      signal,
    })
    .then(({ jobs }) => jobs);
}

export const jobsQueryOptions = (params: JobListParams) =>
  queryOptions({
    queryKey: queryKeys.jobs.list(params),
    queryFn: ({ signal }) => getJobs(params, signal),
    placeholderData: keepPreviousData,
    // The list refreshes with the counts above it, so the two never disagree for long.
    refetchInterval: queuesRefreshMs,
    staleTime: 0,
  });

export function useJobs(params: JobListParams) {
  return useQuery(jobsQueryOptions(params));
}
