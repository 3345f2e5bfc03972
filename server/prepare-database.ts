import { DEMO_ACCOUNTS, DEMO_PASSWORD, seedDemo } from '../seeds/demo';
import type { Config } from './config';
import type { Db } from './db/knex';
import { migrateLatest } from './db/migrate';
import { countPeople } from './db/people';
import type { Logger } from './logger';

/** Start-up: bring the schema up to date and, on an empty database, plant the demo scenario. */
export async function prepareDatabase(
  db: Db,
  config: Pick<Config, 'demo' | 'demoTargets'>,
  logger: Logger,
): Promise<void> {
  const applied = await migrateLatest(db);
  if (applied.length > 0) logger.info({ applied }, 'migrations applied');
  if (!config.demo) return;
  if ((await countPeople(db)) > 0) return;
  logger.info(
    { targets: config.demoTargets },
    'planting the demo scenario: invented targets and their light curves',
  );
  await seedDemo(db, { targets: config.demoTargets });
  logger.info('demo scenario seeded');
}

export function demoAccountsBanner(): string {
  const lines = DEMO_ACCOUNTS.map((account) => `  ${account.role.padEnd(10)} ${account.email}`);
  return [`Demo accounts (password: ${DEMO_PASSWORD}):`, ...lines].join('\n');
}
