import type { AddressInfo } from 'node:net';
import { ConfigError, loadConfig } from './config';
import { createDb } from './db/knex';
import { createApp } from './http/app';
import { createLogger } from './logger';
import { demoAccountsBanner, prepareDatabase } from './prepare-database';

async function main(): Promise<void> {
  const config = loadConfig();
  const logger = createLogger(config);
  const db = createDb(config);
  await prepareDatabase(db, config, logger);

  const { app } = createApp({ config, db, logger });
  const server = app.listen(config.port);
  await new Promise<void>((resolve, reject) => {
    server.once('listening', resolve);
    server.once('error', reject);
  });
  const { port } = server.address() as AddressInfo;
  console.info(`Dipdeck is listening on http://localhost:${port}`);
  if (config.demo) console.info(demoAccountsBanner());

  let stopping = false;
  const stop = (signal: string) => {
    if (stopping) return;
    stopping = true;
    logger.info({ signal }, 'shutting down');
    server.close(() => {
      db.destroy().finally(() => process.exit(0));
    });
    server.closeIdleConnections();
    setTimeout(() => process.exit(1), 10_000).unref();
  };
  process.on('SIGTERM', () => stop('SIGTERM'));
  process.on('SIGINT', () => stop('SIGINT'));
}

main().catch((error: unknown) => {
  if (error instanceof ConfigError) console.error(error.message);
  else console.error('Dipdeck could not start:', error);
  process.exit(1);
});
