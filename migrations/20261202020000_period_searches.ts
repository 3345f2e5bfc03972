import type { Knex } from 'knex';

// Period searches of a target's light curves: asked for by a scientist, run as a worker job, the
// latest result kept for the Lab's candidate review.

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('period_searches', (t) => {
    t.increments('id').primary();
    t.integer('target_id').notNullable().references('id').inTable('targets').onDelete('CASCADE');
    t.integer('requested_by').nullable().references('id').inTable('people').onDelete('SET NULL');
    t.string('status', 16).notNullable().defaultTo('queued'); // queued, running, done, failed
    t.string('job_ref', 80).nullable();
    t.json('settings').notNullable();
    t.json('result').nullable();
    t.text('error').nullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['target_id', 'id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('period_searches');
}
