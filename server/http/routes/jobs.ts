import { z } from 'zod';
import { QUEUE_KEYS, QUEUES } from '../../../worker/queues';
import { getJobForPerson, listJobs, retryJob, summariseQueues } from '../../services/jobs/job-status';
import type { AppDeps } from '../app-deps';
import { defineRoute } from '../define-route';

const jobParams = z.object({ id: z.string().min(3).max(200) });

const jobListQuery = z.object({
  state: z.enum(['waiting', 'active', 'completed', 'failed', 'delayed', 'paused']).default('failed'),
  queue: z.enum(QUEUE_KEYS.map((key) => QUEUES[key].name) as [string, ...string[]]).optional(),
  limit: z.coerce.number().int().min(1).max(100).default(20),
});

export const jobRoutes = (deps: AppDeps) => [
  defineRoute({
    method: 'get',
    path: '/jobs/:id',
    access: 'moderator',
    summary: 'State, progress, stage and error of a background job you started',
    params: jobParams,
    handle: async ({ params, person }) => ({ job: await getJobForPerson(deps.queues, params.id, person!) }),
  }),
  defineRoute({
    method: 'get',
    path: '/admin/queues',
    access: 'admin',
    summary: 'Job counts per queue and state, and which backend runs the queues',
    handle: async () => summariseQueues(deps.queues),
  }),
  defineRoute({
    method: 'get',
    path: '/admin/jobs',
    access: 'admin',
    summary: 'The latest jobs in a state (failed by default), newest first',
    query: jobListQuery,
    handle: async ({ query }) => ({ jobs: await listJobs(deps.queues, query) }),
  }),
  defineRoute({
    method: 'post',
    path: '/admin/jobs/:id/retry',
    access: 'admin',
    summary: 'Send a failed job round again',
    params: jobParams,
    status: 202,
    handle: async ({ params, person }) => ({ job: await retryJob(deps.db, deps.queues, params.id, person!) }),
  }),
];
