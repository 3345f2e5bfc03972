import { randomUUID } from 'node:crypto';
import type Bull from 'bull';
import { createQueue, type QueueOptions } from '../../../worker/queues';
import { createRedisConnection, type RedisConnection } from '../../../worker/redis-connection';

/** .ci/run starts Debian's redis-server on loopback and sets TEST_REDIS_URL; in CI its absence is a failure. */
export const TEST_REDIS_URL = process.env.TEST_REDIS_URL;
if (process.env.CI && !TEST_REDIS_URL)
  throw new Error('CI must provide TEST_REDIS_URL (a real redis-server)');

export interface Backend {
  name: 'embedded' | 'redis';
  url: string | undefined;
  prefix: string;
  connection: RedisConnection;
  queue: (name: string, options?: QueueOptions) => Bull.Queue;
  /** Closes every queue made so far (and on real Redis deletes their keys). */
  closeQueues: () => Promise<void>;
  close: () => Promise<void>;
}

function backend(name: Backend['name'], url: string | undefined): Backend {
  // Each test file gets its own embedded store and its own key prefix on the shared real Redis.
  const prefix = `test-${randomUUID().slice(0, 8)}`;
  const connection = createRedisConnection({ redisUrl: url }, prefix);
  const made: Bull.Queue[] = [];
  const closeQueues = async () => {
    const queues = made.splice(0);
    await Promise.all(queues.map((queue) => queue.obliterate({ force: true }).catch(() => {})));
    await Promise.all(queues.map((queue) => queue.close(true)));
  };
  return {
    name,
    url,
    prefix,
    connection,
    queue(queueName, options = {}) {
      const queue = createQueue(connection, queueName, { prefix, ...options });
      made.push(queue);
      return queue;
    },
    closeQueues,
    async close() {
      await closeQueues();
      await connection.close();
    },
  };
}

export function backends(): Backend[] {
  const list = [backend('embedded', undefined)];
  if (TEST_REDIS_URL) list.push(backend('redis', TEST_REDIS_URL));
  return list;
}

/** Resolves when `event` has fired `count` times on the queue; rejects after `ms`. */
export function waitForEvents<T extends unknown[]>(
  queue: Bull.Queue,
  event: string,
  count = 1,
  ms = 10_000,
): Promise<T[]> {
  return new Promise((resolve, reject) => {
    const seen: T[] = [];
    const timer = setTimeout(() => {
      queue.removeListener(event, listener);
      reject(new Error(`timed out waiting for ${count} '${event}' events (saw ${seen.length})`));
    }, ms);
    const listener = (...args: T) => {
      seen.push(args);
      if (seen.length < count) return;
      clearTimeout(timer);
      queue.removeListener(event, listener);
      resolve(seen);
    };
    queue.on(event, listener);
  });
}

export const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));
