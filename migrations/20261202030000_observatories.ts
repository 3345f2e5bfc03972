import type { Knex } from 'knex';

// Observatories the Lab plans transit windows for: where they are and what they can see.

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('observatories', (t) => {
    t.increments('id').primary();
    t.string('name', 120).notNullable().unique();
    t.double('latitude_deg').notNullable();
    t.double('longitude_deg').notNullable(); // east positive
    t.double('elevation_m').notNullable().defaultTo(0);
    t.double('min_target_altitude_deg').notNullable().defaultTo(30);
    t.double('sun_altitude_limit_deg').notNullable().defaultTo(-12);
    t.integer('created_by').nullable().references('id').inTable('people').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('observatories');
}
