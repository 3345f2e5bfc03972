// A worker process for the stalled-job test on real Redis: takes one job, says "STARTED <id>" on
// stdout, then hangs until the test kills it with SIGKILL.
// Usage: tsx stall-worker.ts <redis url> <prefix> <queue name> <lock duration ms>
import { createQueue } from '../../../worker/queues';
import { createRedisConnection } from '../../../worker/redis-connection';

const [url, prefix, name, lockDuration] = process.argv.slice(2);
const queue = createQueue(createRedisConnection({ redisUrl: url }), name!, {
  prefix: prefix!,
  settings: { lockDuration: Number(lockDuration), stalledInterval: 0 },
});
void queue.process(async (job) => {
  process.stdout.write(`STARTED ${job.id}\n`);
  await new Promise(() => {});
});
