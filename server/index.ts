import type { AddressInfo } from 'node:net';
import { createQueues } from '../worker/queues';
import { createRedisConnection } from '../worker/redis-connection';
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

  const { app } = createApp({ config, db, logger, queues });
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
    await new Promise<void>((resolve) => {
      server.close(() => resolve());
      server.closeIdleConnections();
    });
    await queues.close().catch((error: unknown) => logger.error({ err: error }, 'closing the queues failed'));
    await mailer?.close();
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
