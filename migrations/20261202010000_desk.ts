import type { Knex } from 'knex';

// The Desk: a moderator's clearing of an automatic flag on a volunteer, with why.

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('flag_clearances', (t) => {
    t.integer('person_id').notNullable().references('id').inTable('people').onDelete('CASCADE');
    t.string('flag_code', 32).notNullable();
    t.integer('cleared_by').nullable().references('id').inTable('people').onDelete('SET NULL');
    t.text('note').notNullable();
    t.timestamp('cleared_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['person_id', 'flag_code']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('flag_clearances');
}
