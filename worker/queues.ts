import Bull from 'bull';
import { z } from 'zod';
import type { RedisConnection } from './redis-connection';

// The one place that knows the queues: their names, their job data, and how jobs are added.

export const QUEUES = {
  ingest: { name: 'ingest', label: 'Light-curve ingestion', concurrency: 1 },
  consensus: { name: 'consensus', label: 'Consensus', concurrency: 2 },
  periodSearch: { name: 'period-search', label: 'Period search', concurrency: 1 },
  mail: { name: 'mail', label: 'Mail', concurrency: 2 },
  housekeeping: { name: 'housekeeping', label: 'Housekeeping', concurrency: 1 },
} as const;

export type QueueKey = keyof typeof QUEUES;
export type QueueName = (typeof QUEUES)[QueueKey]['name'];
export const QUEUE_KEYS = Object.keys(QUEUES) as QueueKey[];

/** Job data per queue and job name, parsed again by the processor (a job may outlive a deploy). */
export const JOB_DATA = {
  ingest: {
    upload: z.object({ uploadId: z.number().int().positive() }),
  },
  consensus: {
    /** Rescore the campaign's snippets marked `needs_rescore` (coalesced per campaign). */
    rescore: z.object({ campaignId: z.number().int().positive() }),
    /** The full re-estimate of one campaign's reliabilities, then a rescore of its snippets. */
    reestimate: z.object({ campaignId: z.number().int().positive() }),
    /** Nightly: a re-estimate of every campaign with verdicts. */
    'reestimate-all': z.object({}),
    /** Every minute: rescore jobs for campaigns with marked snippets that no job took. */
    sweep: z.object({}),
  },
  periodSearch: {
    /** BLS over a target's light curves for the period_searches row. */
    search: z.object({ periodSearchId: z.number().int().positive() }),
  },
  mail: {
    /** The address-confirmation link to a person who signed up (or asked for it again). */
    'confirm-address': z.object({ personId: z.number().int().positive() }),
    /** A reset link, if an account has this address: the request is answered before anyone looks. */
    'password-reset': z.object({ email: z.string().max(254) }),
    /** A moderator's warning to a volunteer, with the moderator's note. */
    'moderator-warning': z.object({ personId: z.number().int().positive(), note: z.string().max(2_000) }),
    /** A newsletter to its audience (one job per newsletter: its id is the job id). */
    newsletter: z.object({ newsletterId: z.number().int().positive() }),
    /** A newsletter's test copy to the person who asked, with their own personal fields. */
    'newsletter-test': z.object({
      newsletterId: z.number().int().positive(),
      personId: z.number().int().positive(),
    }),
  },
  housekeeping: {
    sweep: z.object({}),
  },
} satisfies Partial<Record<QueueKey, Record<string, z.ZodType>>>;

/** Who asked for a job, so that `GET /api/jobs/:id` can answer them; absent for scheduled work. */
export const requestedBySchema = z.object({ requestedBy: z.number().int().positive().optional() });

// Bull delivers at least once and retries: every processor must be idempotent (DEVELOPERS.md).
export const DEFAULT_JOB_OPTIONS: Bull.JobOptions = {
  attempts: 3,
  backoff: { type: 'exponential', delay: 2_000 },
  // The embedded store copies whole keys on each command, so finished jobs must not pile up.
  removeOnComplete: { age: 24 * 3600, count: 500 },
  removeOnFail: { age: 14 * 24 * 3600, count: 1_000 },
};

export const QUEUE_SETTINGS: Bull.AdvancedSettings = {
  lockDuration: 30_000,
  stalledInterval: 30_000,
  maxStalledCount: 2,
};

export interface Queues {
  backend: RedisConnection['backend'];
  byKey: Record<QueueKey, Bull.Queue>;
  all: () => Bull.Queue[];
  /** Stops taking jobs, waits for active ones (Bull's close), then closes the connections. */
  close: () => Promise<void>;
  ping: () => Promise<void>;
}

export interface QueueOptions {
  /** Key prefix in Redis; tests use their own so that runs never meet. */
  prefix?: string;
  settings?: Bull.AdvancedSettings;
}

/** One Bull queue on the connection, with Dipdeck's defaults. */
export function createQueue(
  connection: RedisConnection,
  name: string,
  options: QueueOptions = {},
): Bull.Queue {
  return new Bull(name, {
    prefix: options.prefix ?? 'dipdeck',
    createClient: connection.createClient as Bull.QueueOptions['createClient'],
    defaultJobOptions: DEFAULT_JOB_OPTIONS,
    settings: { ...QUEUE_SETTINGS, ...options.settings },
  });
}

export function createQueues(connection: RedisConnection, options: QueueOptions = {}): Queues {
  const byKey = Object.fromEntries(
    QUEUE_KEYS.map((key) => [key, createQueue(connection, QUEUES[key].name, options)]),
  ) as Record<QueueKey, Bull.Queue>;
  const all = () => Object.values(byKey);
  return {
    backend: connection.backend,
    byKey,
    all,
    async close() {
      await Promise.all(all().map((queue) => queue.close()));
      await connection.close();
    },
    async ping() {
      await byKey.housekeeping.client.ping();
    },
  };
}

/** Public job ids name their queue ("mail:42"), since Bull's ids are only unique within one. */
export const jobRef = (queue: Bull.Queue, id: Bull.JobId): string => `${queue.name}:${id}`;

export function parseJobRef(ref: string): { queueKey: QueueKey; id: string } | undefined {
  const colon = ref.indexOf(':');
  if (colon <= 0) return undefined;
  const name = ref.slice(0, colon);
  const queueKey = QUEUE_KEYS.find((key) => QUEUES[key].name === name);
  const id = ref.slice(colon + 1);
  return queueKey && id ? { queueKey, id } : undefined;
}

type JobName<K extends keyof typeof JOB_DATA> = keyof (typeof JOB_DATA)[K] & string;
type SchemaInput<S> = S extends z.ZodType ? z.input<S> : never;
// zod types an empty object's input as Record<string, never>, which no extra key could join.
type JobData<K extends keyof typeof JOB_DATA, N extends JobName<K>> = (SchemaInput<
  (typeof JOB_DATA)[K][N]
> extends Record<string, never>
  ? object
  : SchemaInput<(typeof JOB_DATA)[K][N]>) & { requestedBy?: number };

/** Adds a job after checking its data against the queue's schema; answers its public id. */
export async function enqueue<K extends keyof typeof JOB_DATA, N extends JobName<K>>(
  queues: Queues,
  key: K,
  name: N,
  data: JobData<K, N>,
  options: Bull.JobOptions = {},
): Promise<string> {
  const { requestedBy, ...rest } = data as Record<string, unknown>;
  const schema = JOB_DATA[key][name] as z.ZodType;
  const parsed = { ...(schema.parse(rest) as object), ...(requestedBy ? { requestedBy } : {}) };
  const queue = queues.byKey[key];
  const job = await queue.add(name, parsed, options);
  return jobRef(queue, job.id);
}

/** The convention for progress: a percentage and the name of the stage the job is in. */
export interface JobProgress {
  percent: number;
  stage: string | null;
}

export async function reportProgress(job: Bull.Job, percent: number, stage: string): Promise<void> {
  await job.progress({
    percent: Math.max(0, Math.min(100, Math.round(percent))),
    stage,
  } satisfies JobProgress);
}
