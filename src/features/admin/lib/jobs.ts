import { z } from 'zod';

export const jobStates = [
  'waiting',
  'active',
  'completed',
  'failed',
  'delayed',
  'paused',
  'unknown',
] as const;
export type JobState = (typeof jobStates)[number];

export const jobSchema = z.object({
  id: z.string(),
  queue: z.string(),
  name: z.string(),
  state: z.enum(jobStates),
  progress: z.object({ percent: z.number(), stage: z.string().nullable() }),
  attemptsMade: z.number().int().nonnegative(),
  attempts: z.number().int().nonnegative(),
  error: z.string().nullable(),
  stacktrace: z.array(z.string()),
  createdAt: z.string().nullable(),
  finishedAt: z.string().nullable(),
});

export type Job = z.infer<typeof jobSchema>;

/** When a failed job last changed: the server sets finishedAt when the last attempt failed. */
export function jobTime(job: Pick<Job, 'createdAt' | 'finishedAt'>): string | null {
  return job.finishedAt ?? job.createdAt;
}

export function attemptsText(job: Pick<Job, 'attemptsMade' | 'attempts'>): string {
  // A job queued without a limit reports 0 attempts allowed; showing "3 of 0" would read as a bug.
  if (job.attempts < job.attemptsMade || job.attempts === 0) return `${job.attemptsMade}`;
  return `${job.attemptsMade} of ${job.attempts}`;
}

const secondMs = 1000;
const minuteMs = 60 * secondMs;
const hourMs = 60 * minuteMs;
const dayMs = 24 * hourMs;

/**
 * A short "how long ago" for a timestamp, or null when there is none or it cannot be read.
 * A time slightly in the future (clocks of server and browser disagree) reads as "just now".
 */
export function timeAgo(iso: string | null, nowMs: number): string | null {
  if (!iso) return null;
  const thenMs = Date.parse(iso);
  if (Number.isNaN(thenMs)) return null;
  const elapsedMs = nowMs - thenMs;
  if (elapsedMs < 45 * secondMs) return 'just now';
  if (elapsedMs < 90 * minuteMs) return `${Math.max(1, Math.round(elapsedMs / minuteMs))} min ago`;
  if (elapsedMs < 36 * hourMs) return `${Math.round(elapsedMs / hourMs)} h ago`;
  const days = Math.round(elapsedMs / dayMs);
  return `${days} days ago`;
}

/** The error's first line: Bull keeps the whole message, and a multi-line one would flood the table. */
export function errorHeadline(error: string | null): string {
  const first = error
    ?.split('\n')
    .map((line) => line.trim())
    .find(Boolean);
  return first ?? 'The job failed without an error message.';
}

/**
 * The stack traces worth reading, latest attempt first. Bull keeps one per attempt, oldest first, and a
 * job that fails the same way each time would otherwise show the same trace over and over.
 */
export function distinctTraces(stacktrace: readonly string[]): string[] {
  const seen = new Set<string>();
  const distinct: string[] = [];
  for (const trace of [...stacktrace].reverse()) {
    const text = trace.trim();
    if (text === '' || seen.has(text)) continue;
    seen.add(text);
    distinct.push(text);
  }
  return distinct;
}
