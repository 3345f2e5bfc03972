import type { AddressInfo } from 'node:net';
import { createQueues } from '../worker/queues';
import { createRedisClient, createRedisConnection } from '../worker/redis-connection';
import { startProcessors } from '../worker/start-processors';
import { ConfigError, loadConfig } from './config';
import { createDb } from './db/knex';
import { createApp } from './http/app';
import { createLogger } from './logger';
import { createMailer } from './mail/mailer';
import { demoAccountsBanner, prepareDatabase } from './prepare-database';

async function main(): Promise<void> {
  const config = loadConfig();
  const logger = createLogger(config);
  const db = createDb(config);
  await prepareDatabase(db, config, logger);

  const queues = createQueues(createRedisConnection(config), { prefix: config.queuePrefix });
  const mailer = queues.backend === 'embedded' ? await createMailer(config, db, logger) : null;
  if (mailer) {
    // The embedded store lives in this process, so this process is also the worker (and sends the mail).
    await startProcessors(queues, { config, db, logger, queues, mailer });
  }

  // With Redis, the abuse limits count there, so that they hold across several server processes.
  const rateLimitRedis = config.redisUrl
    ? createRedisClient(config.redisUrl, (error) =>
        logger.warn({ err: error }, 'rate-limit Redis: no connection'),
      )
    : undefined;
  const { app } = createApp({ config, db, logger, queues, rateLimitRedis });
  const server = app.listen(config.port);
  await new Promise<void>((resolve, reject) => {
    server.once('listening', resolve);
    server.once('error', reject);
  });
  const { port } = server.address() as AddressInfo;
  console.info(`Dipdeck is listening on http://localhost:${port}`);
  console.info(
    queues.backend === 'embedded'
      ? 'Background jobs run in this process (embedded queues; set REDIS_URL to scale out).'
      : 'Background jobs go to Redis: start workers with `npm run worker`.',
  );
  if (mailer) console.info(`Mail goes to ${mailer.describe()}; read it in Admin → Outbox.`);
  if (config.demo) console.info(demoAccountsBanner());

  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    logger.info({ signal }, 'shutting down');
    setTimeout(() => process.exit(1), 15_000).unref();
    // A keep-alive connection whose client always sends its next request never falls idle, so close()
    // alone waited out the 15 s above under load: every answer from now on closes its connection, and
    // connections between two requests are closed as they appear.
    server.prependListener('request', (_req, res) => res.setHeader('Connection', 'close'));
    const closeIdle = setInterval(() => server.closeIdleConnections(), 100);
    await new Promise<void>((resolve) => {
      server.close(() => resolve());
      server.closeIdleConnections();
    });
    clearInterval(closeIdle);
    await queues.close().catch((error: unknown) => logger.error({ err: error }, 'closing the queues failed'));
    await mailer?.close();
    await rateLimitRedis?.quit().catch(() => rateLimitRedis.disconnect());
    await db.destroy();
    process.exit(0);
  };
  process.on('SIGTERM', () => void stop('SIGTERM'));
  process.on('SIGINT', () => void stop('SIGINT'));
}

main().catch((error: unknown) => {
  if (error instanceof ConfigError) console.error(error.message);
  else console.error('Dipdeck could not start:', error);
  process.exit(1);
});
