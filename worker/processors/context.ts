import type { Config } from '../../server/config';
import type { Db } from '../../server/db/knex';
import type { Logger } from '../../server/logger';

/** What every processor may use: the same services the API uses, on the same database. */
export interface ProcessorContext {
  config: Config;
  db: Db;
  logger: Logger;
}
