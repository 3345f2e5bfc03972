import type Bull from 'bull';
import { type JobProgress, jobRef } from '../../../worker/queues';

export type JobState = 'waiting' | 'active' | 'completed' | 'failed' | 'delayed' | 'paused' | 'unknown';

/** What people see of a job: never its data, which may hold personal details (mail jobs). */
export interface JobView {
  id: string;
  queue: string;
  name: string;
  state: JobState;
  progress: JobProgress;
  attemptsMade: number;
  attempts: number;
  error: string | null;
  stacktrace: string[];
  createdAt: string | null;
  finishedAt: string | null;
}

const STATES: JobState[] = ['waiting', 'active', 'completed', 'failed', 'delayed', 'paused'];

function readProgress(raw: unknown): JobProgress {
  if (typeof raw === 'number') return { percent: raw, stage: null };
  if (raw && typeof raw === 'object' && 'percent' in raw) {
    const { percent, stage } = raw as { percent: unknown; stage?: unknown };
    return { percent: Number(percent) || 0, stage: typeof stage === 'string' ? stage : null };
  }
  return { percent: 0, stage: null };
}

const isoOrNull = (ms: number | undefined | null) => (ms ? new Date(ms).toISOString() : null);

export async function toJobView(queue: Bull.Queue, job: Bull.Job): Promise<JobView> {
  const state = (await job.getState()) as string;
  return {
    id: jobRef(queue, job.id),
    queue: queue.name,
    name: job.name,
    state: STATES.includes(state as JobState) ? (state as JobState) : 'unknown',
    progress: readProgress(job.progress()),
    attemptsMade: job.attemptsMade,
    attempts: job.opts.attempts ?? 1,
    error: job.failedReason ?? null,
    stacktrace: (job.stacktrace ?? []).slice(-3),
    createdAt: isoOrNull(job.timestamp),
    finishedAt: isoOrNull(job.finishedOn),
  };
}
