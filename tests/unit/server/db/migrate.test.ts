import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { createDb, type Db } from '../../../../server/db/knex';
import { migrateLatest, rollbackAll } from '../../../../server/db/migrate';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'dipdeck-migrate-'));
const sqlite = createDb({ databaseUrl: undefined, sqliteFile: path.join(dir, 'm.sqlite') });
afterAll(async () => {
  await sqlite.destroy();
  fs.rmSync(dir, { recursive: true, force: true });
});

const MIGRATION_COUNT = 8;

const EXPECTED_TABLES = [
  'api_tokens',
  'audit_log',
  'campaigns',
  'candidate_dips',
  'candidates',
  'deliveries',
  'dip_finders',
  'dips',
  'email_tokens',
  'flag_clearances',
  'light_curves',
  'mail_messages',
  'newsletters',
  'observatories',
  'people',
  'period_searches',
  'reliability',
  'rulings',
  'sessions',
  'snippets',
  'survey_teams',
  'targets',
  'uploads',
  'verdict_receipts',
  'verdicts',
];

async function sqliteTables(db: Db): Promise<string[]> {
  const rows = await db.raw(
    "select name from sqlite_master where type = 'table' and name not like 'knex_%' and name not like 'sqlite_%'",
  );
  return rows.map((row: { name: string }) => row.name).sort();
}

async function postgresTables(db: Db): Promise<string[]> {
  const result = await db.raw(
    "select table_name from information_schema.tables where table_schema = current_schema() and table_name not like 'knex_%'",
  );
  return result.rows.map((row: { table_name: string }) => row.table_name).sort();
}

async function upDownUp(db: Db, tables: (db: Db) => Promise<string[]>): Promise<void> {
  await rollbackAll(db);
  expect(await migrateLatest(db)).toHaveLength(MIGRATION_COUNT);
  expect(await tables(db)).toEqual(EXPECTED_TABLES);
  expect(await migrateLatest(db)).toHaveLength(0);
  expect(await rollbackAll(db)).toHaveLength(MIGRATION_COUNT);
  expect(await tables(db)).toEqual([]);
  expect(await migrateLatest(db)).toHaveLength(MIGRATION_COUNT);
  expect(await tables(db)).toEqual(EXPECTED_TABLES);
}

describe('migrations on SQLite', () => {
  it('run up, down and up again cleanly, creating the whole first data model', async () => {
    await upDownUp(sqlite, sqliteTables);
  });

  it('open SQLite in WAL mode with synchronous=NORMAL, a busy timeout and foreign keys on', async () => {
    expect((await sqlite.raw('pragma journal_mode'))[0].journal_mode).toBe('wal');
    expect((await sqlite.raw('pragma synchronous'))[0].synchronous).toBe(1); // 1 = NORMAL
    expect((await sqlite.raw('pragma busy_timeout'))[0].timeout).toBeGreaterThan(0);
    expect((await sqlite.raw('pragma foreign_keys'))[0].foreign_keys).toBe(1);
  });
});

// .ci/run starts Debian's PostgreSQL and sets TEST_DATABASE_URL; in CI its absence is a failure.
const postgresUrl = process.env.TEST_DATABASE_URL;
describe('migrations on PostgreSQL', () => {
  it.runIf(postgresUrl || process.env.CI)(
    'run up, down and up again cleanly (the same migrations)',
    async () => {
      expect(postgresUrl, 'CI must provide TEST_DATABASE_URL').toBeTruthy();
      const postgres = createDb({ databaseUrl: postgresUrl, sqliteFile: '' });
      try {
        await upDownUp(postgres, postgresTables);
        await rollbackAll(postgres);
      } finally {
        await postgres.destroy();
      }
    },
  );
});

describe('migrations started by several processes at once', () => {
  it('leave one complete schema when three connections migrate a new database together', async () => {
    const file = path.join(dir, 'race.sqlite');
    const connections = [0, 1, 2].map(() => createDb({ databaseUrl: undefined, sqliteFile: file }));
    try {
      const applied = await Promise.all(connections.map((connection) => migrateLatest(connection)));
      expect(applied.flat()).toHaveLength(MIGRATION_COUNT);
      expect(await sqliteTables(connections[0]!)).toEqual(EXPECTED_TABLES);
    } finally {
      await Promise.all(connections.map((connection) => connection.destroy()));
    }
  });
});
