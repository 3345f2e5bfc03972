import type { Knex } from 'knex';

// Mail: what the embedded mail catcher received (the Admin outbox), the single-use tokens behind
// address-confirmation and password-reset links (only their hashes are stored), and what a newsletter
// needs beyond the first data model: remote images allowed or not, and the recipients fixed when it
// was sent (so that progress is counted against them).

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('mail_messages', (t) => {
    t.increments('id').primary();
    t.string('message_id', 255).nullable();
    t.string('from_address', 320).notNullable();
    t.json('to_addresses').notNullable();
    t.string('subject', 998).notNullable(); // RFC 5322's longest line
    t.json('headers').notNullable(); // [{ key, value }] in order, as received
    t.text('text_body').nullable();
    t.text('html_body').nullable();
    t.integer('size_bytes').notNullable();
    t.timestamp('received_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['received_at']);
  });
  await knex.schema.createTable('email_tokens', (t) => {
    t.increments('id').primary();
    t.integer('person_id').notNullable().references('id').inTable('people').onDelete('CASCADE');
    t.string('purpose', 32).notNullable(); // 'confirm-address' or 'password-reset'
    t.string('token_hash', 64).notNullable().unique(); // sha256 hex of the secret in the link
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('used_at', { useTz: true }).nullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['person_id', 'purpose']);
  });
  await knex.schema.alterTable('newsletters', (t) => {
    t.boolean('allow_remote_images').notNullable().defaultTo(false);
    t.json('recipient_ids').nullable();
    t.text('last_error').nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('newsletters', (t) => {
    t.dropColumns('allow_remote_images', 'recipient_ids', 'last_error');
  });
  await knex.schema.dropTableIfExists('email_tokens');
  await knex.schema.dropTableIfExists('mail_messages');
}
