import type { Knex } from 'knex';
import * as firstDataModel from '../../migrations/20261201000000_first_data_model';
import * as deck from '../../migrations/20261201010000_deck';
import * as consensus from '../../migrations/20261202000000_consensus';
import * as desk from '../../migrations/20261202010000_desk';
import * as periodSearches from '../../migrations/20261202020000_period_searches';
import * as observatories from '../../migrations/20261202030000_observatories';
import * as mail from '../../migrations/20261202040000_mail';
import * as deckPoolOrder from '../../migrations/20261202050000_deck_pool_order';

// Migrations are imported here rather than found on disk, so that they load the same way under tsx,
// vitest and any bundler. A new migration file is added to this list, in order (see DEVELOPERS.md).
const MIGRATIONS: [name: string, module: Knex.Migration][] = [
  ['20261201000000_first_data_model', firstDataModel],
  ['20261201010000_deck', deck],
  ['20261202000000_consensus', consensus],
  ['20261202010000_desk', desk],
  ['20261202020000_period_searches', periodSearches],
  ['20261202030000_observatories', observatories],
  ['20261202040000_mail', mail],
  ['20261202050000_deck_pool_order', deckPoolOrder],
];

export const migrationSource: Knex.MigrationSource<[string, Knex.Migration]> = {
  getMigrations: async () => MIGRATIONS,
  getMigrationName: ([name]) => name,
  getMigration: async ([, migration]) => migration,
};
