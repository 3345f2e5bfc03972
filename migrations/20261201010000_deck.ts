import type { Knex } from 'knex';

// The Deck: every client verdict id ever acknowledged (so that a retried POST of an older verdict is
// answered, not replayed), and the index the card assignment walks.

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('verdict_receipts', (t) => {
    t.string('client_id', 64).primary();
    t.integer('verdict_id').notNullable().references('id').inTable('verdicts').onDelete('CASCADE');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.schema.alterTable('snippets', (t) => {
    t.index(['campaign_id', 'state', 'kind', 'verdict_count'], 'snippets_assignment_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('snippets', (t) => {
    t.dropIndex(['campaign_id', 'state', 'kind', 'verdict_count'], 'snippets_assignment_index');
  });
  await knex.schema.dropTableIfExists('verdict_receipts');
}
