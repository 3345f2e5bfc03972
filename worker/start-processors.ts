import type Bull from 'bull';
import type { ProcessorContext } from './processors/context';
import { housekeepingProcessor } from './processors/housekeeping';
import { ingestProcessor } from './processors/ingest';
import { QUEUES, type QueueKey, type Queues } from './queues';

type Processor = (job: Bull.Job) => Promise<unknown>;

/** Queues whose processors exist so far; the others hold their jobs until theirs arrive. */
function processors(ctx: ProcessorContext): Partial<Record<QueueKey, Processor>> {
  return { ingest: ingestProcessor(ctx), housekeeping: housekeepingProcessor(ctx) };
}

export const SWEEP_EVERY_MS = 10 * 60_000;

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
    queue.on('error', (error) => ctx.logger.error({ queue: queue.name, err: error }, 'queue error'));
    void queue.process('*', QUEUES[key].concurrency, processor);
  }
  await queues.byKey.housekeeping.add('sweep', {}, { repeat: { every: SWEEP_EVERY_MS }, jobId: 'sweep' });
}
