import type Bull from 'bull';
import { parseJobRef, QUEUE_KEYS, QUEUES, type QueueKey, type Queues } from '../../../worker/queues';
import { hasRole } from '../../auth/roles';
import { appendAudit } from '../../db/audit-log';
import type { Db } from '../../db/knex';
import type { PersonRow } from '../../db/people';
import { AppError, notFound } from '../../errors';
import { type JobState, type JobView, toJobView } from './job-view';

function unavailable(): AppError {
  return new AppError(
    'queues_unavailable',
    'The background queues are not running in this process',
    'unavailable',
  );
}

async function findJob(
  queues: Queues | undefined,
  ref: string,
): Promise<{ queue: Bull.Queue; job: Bull.Job }> {
  if (!queues) throw unavailable();
  const parsed = parseJobRef(ref);
  if (!parsed)
    throw new AppError('validation_failed', 'Job ids look like "ingest:42"', 'invalid', {
      id: 'Unknown job id',
    });
  const queue = queues.byKey[parsed.queueKey];
  const job = await queue.getJob(parsed.id);
  if (!job) throw notFound('Job');
  return { queue, job };
}

/** A job's state for the staff member who started it (admins see every job). */
export async function getJobForPerson(
  queues: Queues | undefined,
  ref: string,
  person: PersonRow,
): Promise<JobView> {
  const { queue, job } = await findJob(queues, ref);
  const requestedBy = (job.data as { requestedBy?: number } | undefined)?.requestedBy;
  if (requestedBy !== person.id && !hasRole(person.role, 'admin')) {
    throw new AppError(
      'not_your_job',
      'Only the person who started this job, or an admin, can follow it',
      'forbidden',
    );
  }
  return toJobView(queue, job);
}

export interface QueueSummary {
  name: string;
  label: string;
  counts: Record<'waiting' | 'active' | 'completed' | 'failed' | 'delayed' | 'paused', number>;
}

export async function summariseQueues(
  queues: Queues | undefined,
): Promise<{ backend: string; queues: QueueSummary[] }> {
  if (!queues) throw unavailable();
  const summaries = await Promise.all(
    QUEUE_KEYS.map(async (key) => {
      const counts = (await queues.byKey[key].getJobCounts()) as unknown as Record<string, number>;
      return {
        name: QUEUES[key].name,
        label: QUEUES[key].label,
        counts: {
          waiting: counts.waiting ?? 0,
          active: counts.active ?? 0,
          completed: counts.completed ?? 0,
          failed: counts.failed ?? 0,
          delayed: counts.delayed ?? 0,
          paused: counts.paused ?? 0,
        },
      };
    }),
  );
  return { backend: queues.backend, queues: summaries };
}

export async function listJobs(
  queues: Queues | undefined,
  filter: { state: Exclude<JobState, 'unknown'>; queue?: string | undefined; limit: number },
): Promise<JobView[]> {
  if (!queues) throw unavailable();
  const keys: QueueKey[] = filter.queue
    ? QUEUE_KEYS.filter((key) => QUEUES[key].name === filter.queue)
    : QUEUE_KEYS;
  const found = await Promise.all(
    keys.map(async (key) => {
      const queue = queues.byKey[key];
      const jobs = await queue.getJobs([filter.state], 0, filter.limit - 1, false);
      return Promise.all(jobs.filter(Boolean).map((job) => toJobView(queue, job)));
    }),
  );
  const newestFirst = (view: JobView) => Date.parse(view.finishedAt ?? view.createdAt ?? '') || 0;
  return found
    .flat()
    .sort((a, b) => newestFirst(b) - newestFirst(a))
    .slice(0, filter.limit);
}

/** An admin sends a failed job round again; the retry is on the audit log. */
export async function retryJob(
  db: Db,
  queues: Queues | undefined,
  ref: string,
  actor: PersonRow,
): Promise<JobView> {
  const { queue, job } = await findJob(queues, ref);
  if ((await job.getState()) !== 'failed') {
    throw new AppError('not_failed', 'Only a failed job can be retried', 'conflict');
  }
  await job.retry();
  await appendAudit(db, {
    actorId: actor.id,
    action: 'job.retried',
    entityType: 'job',
    entityId: ref,
    before: { state: 'failed', error: job.failedReason ?? null },
  });
  return toJobView(queue, (await queue.getJob(job.id)) ?? job);
}
