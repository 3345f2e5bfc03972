import type { Knex } from 'knex';

// The first data model: every table the issues ask for, portable between SQLite and PostgreSQL
// (schema builder only, no dialect SQL). Later migrations add columns; this one is never edited
// after it has shipped.

const ROLES = ['volunteer', 'moderator', 'scientist', 'admin'];
const CAMPAIGN_STATUSES = ['draft', 'live', 'paused', 'closed'];
const SNIPPET_STATES = ['open', 'settled', 'split', 'ruled'];
const SNIPPET_KINDS = ['real', 'planted', 'quiet'];
const VERDICT_ANSWERS = ['dip', 'flat', 'unsure'];
const RULINGS = ['dip', 'flat', 'systematic'];
const UPLOAD_STATUSES = ['queued', 'processing', 'done', 'failed'];
const CANDIDATE_STATES = ['promoted', 'scheduled', 'observed', 'resolved'];
const DISPOSITIONS = [
  'planet candidate',
  'eclipsing binary',
  'systematic',
  'false positive',
  'confirmed planet',
];
const NEWSLETTER_STATUSES = ['draft', 'scheduled', 'sending', 'sent', 'cancelled'];
const DELIVERY_STATUSES = ['claimed', 'sent', 'failed', 'skipped', 'unknown'];

function timestamps(t: Knex.CreateTableBuilder, knex: Knex): void {
  t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
}

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('people', (t) => {
    t.increments('id').primary();
    t.string('email', 254).nullable().unique(); // null once an account is deleted
    t.string('display_name', 80).notNullable();
    t.text('password_hash').nullable();
    t.enu('role', ROLES, { useNative: false, enumName: 'person_role' }).notNullable().defaultTo('volunteer');
    t.timestamp('suspended_at', { useTz: true }).nullable();
    t.text('suspended_reason').nullable();
    t.boolean('newsletter_opt_in').notNullable().defaultTo(false);
    t.timestamp('newsletter_opt_in_at', { useTz: true }).nullable();
    t.boolean('credit_by_name').notNullable().defaultTo(false); // agreed to be named on candidates
    t.timestamp('email_confirmed_at', { useTz: true }).nullable();
    t.timestamp('sessions_valid_after', { useTz: true }).nullable(); // sessions begun earlier are ended
    t.timestamp('last_active_at', { useTz: true }).nullable();
    t.timestamp('deleted_at', { useTz: true }).nullable();
    timestamps(t, knex);
    t.index(['role']);
  });

  // Shape expected by connect-session-knex (created here so that migrations own every table).
  await knex.schema.createTable('sessions', (t) => {
    t.string('sid', 255).primary();
    t.json('sess').notNullable();
    t.timestamp('expired', { useTz: true }).notNullable().index();
  });

  await knex.schema.createTable('api_tokens', (t) => {
    t.increments('id').primary();
    t.integer('person_id').notNullable().references('id').inTable('people').onDelete('CASCADE');
    t.string('name', 80).notNullable();
    t.string('token_hash', 128).notNullable().unique();
    t.string('token_prefix', 16).notNullable();
    t.timestamp('last_used_at', { useTz: true }).nullable();
    t.timestamp('revoked_at', { useTz: true }).nullable();
    timestamps(t, knex);
    t.index(['person_id']);
  });

  await knex.schema.createTable('survey_teams', (t) => {
    t.increments('id').primary();
    t.string('name', 120).notNullable().unique();
    t.text('description').nullable();
    timestamps(t, knex);
  });

  await knex.schema.createTable('campaigns', (t) => {
    t.increments('id').primary();
    t.integer('survey_team_id').nullable().references('id').inTable('survey_teams').onDelete('SET NULL');
    t.string('name', 120).notNullable();
    t.text('description').notNullable().defaultTo('');
    t.enu('status', CAMPAIGN_STATUSES, { useNative: false, enumName: 'campaign_status' })
      .notNullable()
      .defaultTo('draft');
    t.double('snippet_length_days').notNullable().defaultTo(2);
    t.double('snippet_overlap').notNullable().defaultTo(0.25);
    t.double('longest_transit_hours').notNullable().defaultTo(12);
    t.double('detrend_window_days').nullable(); // null: three times the longest transit duration
    t.double('planted_share').notNullable().defaultTo(0.1);
    t.double('quiet_share').notNullable().defaultTo(0.05);
    t.double('planted_snr_min').notNullable().defaultTo(7);
    t.double('planted_snr_max').notNullable().defaultTo(30);
    t.integer('verdicts_to_settle').notNullable().defaultTo(5);
    t.integer('verdicts_max').notNullable().defaultTo(15);
    t.double('settle_upper').notNullable().defaultTo(0.95);
    t.double('settle_lower').notNullable().defaultTo(0.05);
    t.double('feedback_rate').notNullable().defaultTo(0.5);
    t.double('snr_threshold').notNullable().defaultTo(7.1);
    t.double('prior_dip_rate').nullable(); // π, estimated by the consensus job
    t.integer('created_by').nullable().references('id').inTable('people').onDelete('SET NULL');
    t.timestamp('status_changed_at', { useTz: true }).nullable();
    timestamps(t, knex);
    t.index(['status']);
  });

  await knex.schema.createTable('targets', (t) => {
    t.increments('id').primary();
    t.integer('campaign_id').notNullable().references('id').inTable('campaigns').onDelete('CASCADE');
    t.string('designation', 64).notNullable();
    t.double('ra_deg').nullable();
    t.double('dec_deg').nullable();
    t.double('magnitude').nullable();
    t.double('stellar_radius_rsun').nullable();
    t.double('stellar_mass_msun').nullable();
    t.double('teff_k').nullable();
    t.json('assumed_fields').nullable(); // which values are defaults, not catalogue values
    timestamps(t, knex);
    t.unique(['campaign_id', 'designation']);
  });

  await knex.schema.createTable('uploads', (t) => {
    t.increments('id').primary();
    t.integer('campaign_id').notNullable().references('id').inTable('campaigns').onDelete('CASCADE');
    t.integer('uploaded_by').nullable().references('id').inTable('people').onDelete('SET NULL');
    t.string('content_hash', 64).notNullable();
    t.string('original_name', 255).notNullable();
    t.string('format', 8).notNullable();
    t.bigInteger('size_bytes').notNullable();
    t.string('storage_path', 512).notNullable();
    t.string('target_hint', 64).nullable();
    t.boolean('is_quiet_reference').notNullable().defaultTo(false);
    t.enu('status', UPLOAD_STATUSES, { useNative: false, enumName: 'upload_status' })
      .notNullable()
      .defaultTo('queued');
    t.string('stage', 32).nullable();
    t.double('progress').notNullable().defaultTo(0);
    t.text('error').nullable();
    t.string('job_id', 64).nullable();
    t.integer('snippet_count').notNullable().defaultTo(0);
    timestamps(t, knex);
    t.unique(['campaign_id', 'content_hash']);
    t.index(['status']);
  });

  await knex.schema.createTable('light_curves', (t) => {
    t.increments('id').primary();
    t.integer('campaign_id').notNullable().references('id').inTable('campaigns').onDelete('CASCADE');
    t.integer('target_id').notNullable().references('id').inTable('targets').onDelete('CASCADE');
    t.integer('upload_id').nullable().unique().references('id').inTable('uploads').onDelete('SET NULL');
    t.string('content_hash', 64).notNullable();
    t.boolean('is_quiet_reference').notNullable().defaultTo(false);
    t.json('time_system').nullable(); // TIMESYS, TIMEREF, BJDREFI/F, TIMEUNIT as read
    t.json('ingest_settings').nullable(); // the campaign settings its snippets were cut with
    t.integer('point_count').notNullable();
    t.double('time_start').notNullable();
    t.double('time_end').notNullable();
    t.double('cadence_days').nullable();
    t.double('noise_ppm').nullable();
    t.double('noise_1h_ppm').nullable();
    t.binary('series').nullable(); // cleaned and detrended time/flux/error, packed float64
    timestamps(t, knex);
    t.index(['target_id']);
  });

  await knex.schema.createTable('snippets', (t) => {
    t.increments('id').primary();
    t.integer('campaign_id').notNullable().references('id').inTable('campaigns').onDelete('CASCADE');
    t.integer('light_curve_id').notNullable().references('id').inTable('light_curves').onDelete('CASCADE');
    t.integer('target_id').notNullable().references('id').inTable('targets').onDelete('CASCADE');
    t.enu('kind', SNIPPET_KINDS, { useNative: false, enumName: 'snippet_kind' })
      .notNullable()
      .defaultTo('real');
    t.enu('state', SNIPPET_STATES, { useNative: false, enumName: 'snippet_state' })
      .notNullable()
      .defaultTo('open');
    t.integer('source_snippet_id').nullable().references('id').inTable('snippets').onDelete('SET NULL');
    t.double('time_start').notNullable();
    t.double('time_end').notNullable();
    t.integer('point_count').notNullable();
    t.binary('display').nullable(); // at most 600 binned points for the card
    t.json('planted_truth').nullable(); // t0, depth, duration, b, expected SNR
    t.integer('verdict_count').notNullable().defaultTo(0);
    t.double('consensus_score').nullable();
    t.double('dip_share').nullable();
    t.double('effective_votes').nullable();
    t.boolean('needs_rescore').notNullable().defaultTo(false);
    t.timestamp('settled_at', { useTz: true }).nullable();
    timestamps(t, knex);
    t.unique(['light_curve_id', 'kind', 'time_start']);
    t.index(['campaign_id', 'state']);
    t.index(['needs_rescore']);
  });

  await knex.schema.createTable('verdicts', (t) => {
    t.increments('id').primary();
    t.string('client_id', 64).notNullable().unique();
    t.integer('snippet_id').notNullable().references('id').inTable('snippets').onDelete('CASCADE');
    t.integer('person_id').nullable().references('id').inTable('people').onDelete('SET NULL');
    t.string('guest_key', 64).nullable(); // a visitor's verdicts before sign-up; never counted unclaimed
    t.enu('answer', VERDICT_ANSWERS, { useNative: false, enumName: 'verdict_answer' }).notNullable();
    t.double('mark_time').nullable();
    t.integer('elapsed_ms').nullable();
    t.timestamp('withdrawn_at', { useTz: true }).nullable(); // undo
    timestamps(t, knex);
    t.unique(['snippet_id', 'person_id']);
    t.index(['person_id']);
    t.index(['guest_key']);
  });

  await knex.schema.createTable('reliability', (t) => {
    t.integer('person_id').notNullable().references('id').inTable('people').onDelete('CASCADE');
    t.integer('campaign_id').notNullable().references('id').inTable('campaigns').onDelete('CASCADE');
    t.double('sensitivity').notNullable();
    t.double('specificity').notNullable();
    t.double('weight_dip').notNullable().defaultTo(0);
    t.double('weight_flat').notNullable().defaultTo(0);
    t.integer('planted_seen').notNullable().defaultTo(0);
    t.integer('planted_found').notNullable().defaultTo(0);
    t.integer('quiet_seen').notNullable().defaultTo(0);
    t.integer('quiet_correct').notNullable().defaultTo(0);
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['person_id', 'campaign_id']);
  });

  await knex.schema.createTable('rulings', (t) => {
    t.increments('id').primary();
    t.integer('snippet_id').notNullable().references('id').inTable('snippets').onDelete('CASCADE');
    t.integer('moderator_id').nullable().references('id').inTable('people').onDelete('SET NULL');
    t.enu('ruling', RULINGS, { useNative: false, enumName: 'ruling_value' }).notNullable();
    t.text('note').nullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['snippet_id']);
  });

  await knex.schema.createTable('dips', (t) => {
    t.increments('id').primary();
    t.integer('snippet_id').notNullable().references('id').inTable('snippets').onDelete('CASCADE');
    t.integer('target_id').notNullable().references('id').inTable('targets').onDelete('CASCADE');
    t.integer('campaign_id').notNullable().references('id').inTable('campaigns').onDelete('CASCADE');
    t.double('time_center').notNullable();
    t.double('time_sigma').nullable();
    t.double('depth_ppm').nullable();
    t.double('duration_hours').nullable();
    t.double('snr').nullable();
    t.double('consensus_score').nullable();
    timestamps(t, knex);
    t.index(['target_id']);
  });

  await knex.schema.createTable('candidates', (t) => {
    t.increments('id').primary();
    t.integer('campaign_id').notNullable().references('id').inTable('campaigns').onDelete('CASCADE');
    t.integer('target_id').notNullable().references('id').inTable('targets').onDelete('CASCADE');
    t.integer('promoted_by').nullable().references('id').inTable('people').onDelete('SET NULL');
    t.enu('state', CANDIDATE_STATES, { useNative: false, enumName: 'candidate_state' })
      .notNullable()
      .defaultTo('promoted');
    t.enu('disposition', DISPOSITIONS, { useNative: false, enumName: 'candidate_disposition' })
      .notNullable()
      .defaultTo('planet candidate');
    t.text('notes').nullable();
    t.double('period_days').nullable();
    t.double('period_sigma_days').nullable();
    t.double('t0_bjd').nullable();
    t.double('t0_sigma_days').nullable();
    t.double('depth_ppm').nullable();
    t.double('duration_hours').nullable();
    t.double('snr').nullable();
    t.double('priority').nullable();
    timestamps(t, knex);
    t.unique(['campaign_id', 'target_id']);
  });

  await knex.schema.createTable('candidate_dips', (t) => {
    t.integer('candidate_id').notNullable().references('id').inTable('candidates').onDelete('CASCADE');
    t.integer('dip_id').notNullable().references('id').inTable('dips').onDelete('CASCADE');
    t.primary(['candidate_id', 'dip_id']);
  });

  await knex.schema.createTable('newsletters', (t) => {
    t.increments('id').primary();
    t.integer('author_id').nullable().references('id').inTable('people').onDelete('SET NULL');
    t.string('headline', 200).notNullable();
    t.text('body_markdown').notNullable();
    t.json('audience').notNullable();
    t.enu('status', NEWSLETTER_STATUSES, { useNative: false, enumName: 'newsletter_status' })
      .notNullable()
      .defaultTo('draft');
    t.timestamp('scheduled_for', { useTz: true }).nullable();
    t.timestamp('sent_at', { useTz: true }).nullable();
    timestamps(t, knex);
  });

  await knex.schema.createTable('deliveries', (t) => {
    t.increments('id').primary();
    t.integer('newsletter_id').notNullable().references('id').inTable('newsletters').onDelete('CASCADE');
    t.integer('person_id').notNullable().references('id').inTable('people').onDelete('CASCADE');
    t.enu('status', DELIVERY_STATUSES, { useNative: false, enumName: 'delivery_status' }).notNullable();
    t.string('message_id', 255).nullable();
    t.text('error').nullable();
    t.timestamp('claimed_at', { useTz: true }).nullable();
    t.timestamp('sent_at', { useTz: true }).nullable();
    timestamps(t, knex);
    t.unique(['newsletter_id', 'person_id']);
  });

  // Append-only: no route updates or deletes a row (see server/db/audit-log.ts).
  await knex.schema.createTable('audit_log', (t) => {
    t.increments('id').primary();
    t.integer('actor_id').nullable().references('id').inTable('people').onDelete('SET NULL');
    t.string('action', 64).notNullable();
    t.string('entity_type', 32).notNullable();
    t.string('entity_id', 64).nullable();
    t.json('before').nullable();
    t.json('after').nullable();
    t.text('note').nullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['entity_type', 'entity_id']);
    t.index(['actor_id']);
    t.index(['action']);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of [
    'audit_log',
    'deliveries',
    'newsletters',
    'candidate_dips',
    'candidates',
    'dips',
    'rulings',
    'reliability',
    'verdicts',
    'snippets',
    'light_curves',
    'uploads',
    'targets',
    'campaigns',
    'survey_teams',
    'api_tokens',
    'sessions',
    'people',
  ]) {
    await knex.schema.dropTableIfExists(table);
  }
}
