import { z } from 'zod';

/** How often an open Queues screen asks again; the counts move while jobs run. */
export const queuesRefreshMs = 5_000;

/** Every state the server counts, in the order a job usually passes through them, failed last. */
export const queueStates = ['waiting', 'active', 'delayed', 'paused', 'completed', 'failed'] as const;
export type QueueState = (typeof queueStates)[number];

export const queueStateLabels: Record<QueueState, string> = {
  waiting: 'Waiting',
  active: 'Active',
  delayed: 'Delayed',
  paused: 'Paused',
  completed: 'Completed',
  failed: 'Failed',
};

const countSchema = z.number().int().nonnegative();

export const queueSchema = z.object({
  name: z.string(),
  label: z.string(),
  counts: z.object({
    waiting: countSchema,
    active: countSchema,
    completed: countSchema,
    failed: countSchema,
    delayed: countSchema,
    paused: countSchema,
  }),
});

export type Queue = z.infer<typeof queueSchema>;

export const queueBackends = ['embedded', 'redis'] as const;
export type QueueBackend = (typeof queueBackends)[number];

export const queuesOverviewSchema = z.object({
  backend: z.enum(queueBackends),
  queues: z.array(queueSchema),
});

export type QueuesOverview = z.infer<typeof queuesOverviewSchema>;

export type QueueCounts = Queue['counts'];

export function totalCounts(queues: readonly Queue[]): QueueCounts {
  const totals: QueueCounts = { waiting: 0, active: 0, completed: 0, failed: 0, delayed: 0, paused: 0 };
  for (const queue of queues) {
    for (const state of queueStates) totals[state] += queue.counts[state];
  }
  return totals;
}

/**
 * How a count should look: a zero is background, a failure needs someone's attention, anything else is
 * plain information.
 */
export type CountTone = 'zero' | 'attention' | 'plain';

export function countTone(state: QueueState, count: number): CountTone {
  if (count === 0) return 'zero';
  return state === 'failed' ? 'attention' : 'plain';
}

export interface BackendDescription {
  badge: string;
  title: string;
  body: string;
}

export const backendDescriptions: Record<QueueBackend, BackendDescription> = {
  embedded: {
    badge: 'Embedded',
    title: 'Jobs run inside the server process',
    body: 'There is no Redis and no separate worker: the web server takes jobs from its queues and runs them itself. Simple to run, but heavy jobs such as period searches share the machine with the website.',
  },
  redis: {
    badge: 'Redis',
    title: 'Jobs run in separate workers, queued in Redis',
    body: 'Jobs wait in Redis and separate worker processes take them, so heavy jobs do not slow the website. If waiting jobs keep piling up, check that a worker is running.',
  },
};

/** The queue's own label when the overview knows it, so a job list can be read without the counts. */
export function queueLabel(queues: readonly Pick<Queue, 'name' | 'label'>[], name: string): string {
  return queues.find((queue) => queue.name === name)?.label ?? name;
}
