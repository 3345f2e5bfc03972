// npm run worker: a worker process that takes jobs from real Redis (REDIS_URL). Several may run side by
// side: Bull hands each job to one of them, and a job whose worker dies is picked up again as stalled.
import { ConfigError, loadConfig } from '../server/config';
import { createDb } from '../server/db/knex';
import { migrateLatest } from '../server/db/migrate';
import { createLogger } from '../server/logger';
import { createMailer } from '../server/mail/mailer';
import { createQueues } from './queues';
import { createRedisConnection } from './redis-connection';
import { startProcessors } from './start-processors';

const SHUTDOWN_GRACE_MS = 25_000;

async function main(): Promise<void> {
  const config = loadConfig();
  if (!config.redisUrl) {
    throw new ConfigError(
      'The separate worker needs REDIS_URL. Without it the queues are embedded in the server, which runs the jobs itself (`npm start`).',
    );
  }
  const logger = createLogger(config).child({ role: 'worker', pid: process.pid });
  const db = createDb(config);
  await migrateLatest(db);
  const queues = createQueues(createRedisConnection(config), { prefix: config.queuePrefix });
  const mailer = await createMailer(config, db, logger);
  await startProcessors(queues, { config, db, logger, queues, mailer });
  logger.info({ mail: mailer.describe() }, 'worker ready');
  console.info(`Dipdeck worker ${process.pid} is taking jobs from ${new URL(config.redisUrl).host}`);

  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    logger.info({ signal }, 'stopping: no new jobs; finishing the current ones');
    // Past the grace period we exit anyway: the job's lock lapses and another worker takes it over.
    setTimeout(() => process.exit(1), SHUTDOWN_GRACE_MS).unref();
    await queues.close();
    await mailer.close();
    await db.destroy();
    logger.info('worker stopped');
    process.exit(0);
  };
  process.on('SIGTERM', () => void stop('SIGTERM'));
  process.on('SIGINT', () => void stop('SIGINT'));
}

main().catch((error: unknown) => {
  console.error(error instanceof ConfigError ? error.message : error);
  process.exit(1);
});
