import type { Knex } from 'knex';

// The Deck's pool query (server/services/deck/next-cards.ts) asks for a campaign's open snippets of one
// kind, most verdicts first and then by id. The first assignment index ends at verdict_count, so for
// each count SQLite sorted every snippet with that count by id before it could stop at the pool's size:
// about 1 ms a call, 40 % of the server's time under `npm run bench -- load`. With the id in the index,
// in the query's own directions, the walk is in order and stops after the pool is full. Raw SQL because
// Knex's index builder has no per-column direction; SQLite and PostgreSQL both read this statement.

const COLUMNS = '(campaign_id, state, kind, verdict_count desc, id)';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`create index snippets_pool_order_index on snippets ${COLUMNS}`);
  await knex.schema.alterTable('snippets', (t) => {
    t.dropIndex(['campaign_id', 'state', 'kind', 'verdict_count'], 'snippets_assignment_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('snippets', (t) => {
    t.index(['campaign_id', 'state', 'kind', 'verdict_count'], 'snippets_assignment_index');
  });
  await knex.raw('drop index snippets_pool_order_index');
}
