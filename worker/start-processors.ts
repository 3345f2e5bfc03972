import type Bull from 'bull';
import { consensusProcessor } from './processors/consensus';
import type { ProcessorContext } from './processors/context';
import { housekeepingProcessor } from './processors/housekeeping';
import { ingestProcessor } from './processors/ingest';
import { mailProcessor } from './processors/mail';
import { periodSearchProcessor } from './processors/period-search';
import { QUEUES, type QueueKey, type Queues } from './queues';

type Processor = (job: Bull.Job) => Promise<unknown>;

/** Queues whose processors exist so far; the others hold their jobs until theirs arrive. */
function processors(ctx: ProcessorContext): Partial<Record<QueueKey, Processor>> {
  return {
    ingest: ingestProcessor(ctx),
    consensus: consensusProcessor(ctx),
    periodSearch: periodSearchProcessor(ctx),
    housekeeping: housekeepingProcessor(ctx),
    ...(ctx.mailer ? { mail: mailProcessor({ ...ctx, mailer: ctx.mailer }) } : {}),
  };
}

export const SWEEP_EVERY_MS = 10 * 60_000;
/** How often snippets marked for rescoring but without a job get one. */
export const CONSENSUS_SWEEP_EVERY_MS = 60_000;
/** The nightly full re-estimate of every campaign's reliabilities (03:00 UTC, when volunteers are fewest in Europe). */
export const REESTIMATE_CRON = '0 3 * * *';

/**
 * Makes this process a worker: registers each queue's processor and the repeatable jobs. Runs in the
 * server process in embedded mode, and in each `npm run worker` process with Redis. Adding the same
 * repeatable job from several processes is harmless: Bull keys it by its repeat options.
 */
export async function startProcessors(queues: Queues, ctx: ProcessorContext): Promise<void> {
  for (const [key, processor] of Object.entries(processors(ctx)) as [QueueKey, Processor][]) {
    const queue = queues.byKey[key];
    queue.on('failed', (job, error) =>
      ctx.logger.warn(
        { queue: queue.name, jobId: job.id, attemptsMade: job.attemptsMade, err: error },
        'job failed',
      ),
    );
    // Which process ran a job, when several share the queues.
    queue.on('completed', (job) =>
      ctx.logger.debug({ queue: queue.name, jobId: job.id, attemptsMade: job.attemptsMade }, 'job completed'),
    );
    queue.on('error', (error) => ctx.logger.error({ queue: queue.name, err: error }, 'queue error'));
    void queue.process('*', QUEUES[key].concurrency, processor);
  }
  await queues.byKey.housekeeping.add('sweep', {}, { repeat: { every: SWEEP_EVERY_MS }, jobId: 'sweep' });
  await queues.byKey.consensus.add(
    'sweep',
    {},
    { repeat: { every: CONSENSUS_SWEEP_EVERY_MS }, jobId: 'consensus-sweep', removeOnComplete: true },
  );
  await queues.byKey.consensus.add(
    'reestimate-all',
    {},
    { repeat: { cron: REESTIMATE_CRON, tz: 'UTC' }, jobId: 'reestimate-all', removeOnComplete: true },
  );
}
