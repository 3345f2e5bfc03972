import type { Knex } from 'knex';

// Weighted consensus: each snippet's outcome and why it went to the Desk, the counts behind each
// volunteer's reliability, the campaign's typical volunteer (the prior for newcomers), the volunteers
// credited on each dip, and one row per dip of a snippet (a snippet can hold two).

const RELIABILITY_COUNTS = ['dip_seen', 'dip_said', 'flat_seen', 'flat_said'] as const;
const CAMPAIGN_PRIORS = [
  'typical_sensitivity_alpha',
  'typical_sensitivity_beta',
  'typical_specificity_alpha',
  'typical_specificity_beta',
] as const;

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('snippets', (t) => {
    t.string('outcome', 8).nullable(); // 'dip' or 'flat' once settled or ruled
    t.string('split_reason', 32).nullable(); // why it waits on the Desk
    t.timestamp('scored_at', { useTz: true }).nullable();
  });
  await knex.schema.alterTable('reliability', (t) => {
    // Expected counts (controls and rulings whole, other snippets by their posterior).
    for (const column of RELIABILITY_COUNTS) t.double(column).notNullable().defaultTo(0);
    t.integer('verdict_count').notNullable().defaultTo(0);
  });
  await knex.schema.alterTable('campaigns', (t) => {
    for (const column of CAMPAIGN_PRIORS) t.double(column).nullable();
    t.timestamp('reliability_estimated_at', { useTz: true }).nullable();
  });
  await knex.schema.alterTable('dips', (t) => {
    t.integer('cluster_index').notNullable().defaultTo(0);
    t.integer('mark_count').notNullable().defaultTo(0);
    t.unique(['snippet_id', 'cluster_index']);
  });
  await knex.schema.createTable('dip_finders', (t) => {
    t.integer('dip_id').notNullable().references('id').inTable('dips').onDelete('CASCADE');
    t.integer('person_id').notNullable().references('id').inTable('people').onDelete('CASCADE');
    t.primary(['dip_id', 'person_id']);
    t.index(['person_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('dip_finders');
  await knex.schema.alterTable('dips', (t) => {
    t.dropUnique(['snippet_id', 'cluster_index']);
  });
  const drops: [table: string, columns: readonly string[]][] = [
    ['dips', ['cluster_index', 'mark_count']],
    ['campaigns', [...CAMPAIGN_PRIORS, 'reliability_estimated_at']],
    ['reliability', [...RELIABILITY_COUNTS, 'verdict_count']],
    ['snippets', ['outcome', 'split_reason', 'scored_at']],
  ];
  for (const [table, columns] of drops) {
    await knex.schema.alterTable(table, (t) => {
      t.dropColumns(...columns);
    });
  }
}
