import IORedis, { type Redis } from 'ioredis';
import type { Config } from '../server/config';
import { embeddedBullClients } from './embedded-redis';

export type ClientType = 'client' | 'subscriber' | 'bclient';

/** The one connection factory: real Redis when REDIS_URL is set, the embedded store otherwise. */
export interface RedisConnection {
  backend: 'embedded' | 'redis';
  /** Bull's `createClient` option: one shared client and subscriber, a new blocking client per queue. */
  createClient: (type: ClientType) => Redis;
  close: () => Promise<void>;
}

export function createRedisConnection(
  config: Pick<Config, 'redisUrl'>,
  embeddedStore = 'dipdeck',
): RedisConnection {
  if (!config.redisUrl) {
    // ioredis-mock keeps its data per process, keyed by host: the server runs the processors itself.
    const clients = embeddedBullClients({ host: embeddedStore });
    return { backend: 'embedded', createClient: clients.createClient, close: clients.close };
  }
  const url = config.redisUrl;
  const made: Redis[] = [];
  const shared: Partial<Record<ClientType, Redis>> = {};
  return {
    backend: 'redis',
    createClient(type) {
      const existing = type === 'bclient' ? undefined : shared[type];
      if (existing) return existing;
      // Bull refuses blocking and subscriber connections that retry per request or check readiness.
      const client = new IORedis(
        url,
        type === 'client' ? {} : { maxRetriesPerRequest: null, enableReadyCheck: false },
      );
      made.push(client);
      if (type !== 'bclient') shared[type] = client;
      return client;
    },
    async close() {
      await Promise.all(made.splice(0).map((client) => client.quit().catch(() => client.disconnect())));
      delete shared.client;
      delete shared.subscriber;
    },
  };
}

/**
 * A plain client for what is not a queue (the abuse limits' counts). While Redis cannot be reached a
 * command fails at once instead of waiting in a queue, so that an outage slows no request down.
 */
export function createRedisClient(url: string, onError: (error: Error) => void): Redis {
  const client = new IORedis(url, { enableOfflineQueue: false, maxRetriesPerRequest: 1 });
  client.on('error', onError);
  return client;
}
