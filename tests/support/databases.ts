import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import knex from 'knex';
import { createDb, type Db } from '../../server/db/knex';
import { migrateLatest } from '../../server/db/migrate';

/** .ci/run starts Debian's PostgreSQL and sets TEST_DATABASE_URL; in CI its absence is a failure. */
export const TEST_DATABASE_URL = process.env.TEST_DATABASE_URL;
if (process.env.CI && !TEST_DATABASE_URL) throw new Error('CI must provide TEST_DATABASE_URL (PostgreSQL)');

export interface TestDatabase {
  name: 'sqlite' | 'postgres';
  /** A migrated, empty database of its own; `drop` removes it. */
  open(): Promise<{ db: Db; drop: () => Promise<void> }>;
}

const sqlite: TestDatabase = {
  name: 'sqlite',
  async open() {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'dipdeck-db-'));
    const db = createDb({ databaseUrl: undefined, sqliteFile: path.join(dir, 'test.sqlite') });
    await migrateLatest(db);
    return {
      db,
      drop: async () => {
        await db.destroy();
        fs.rmSync(dir, { recursive: true, force: true });
      },
    };
  },
};

/**
 * A schema of its own in the PostgreSQL server at `url`, and a DATABASE_URL whose connections see only
 * that schema (libpq's `options` parameter sets their search_path), so the app reaches it through its
 * own config path. Files running side by side (and the migration test, which rolls everything back)
 * never meet.
 */
export async function createPostgresSchema(
  url: string,
): Promise<{ schema: string; databaseUrl: string; dropSchema: () => Promise<void> }> {
  const schema = `test_${randomUUID().replaceAll('-', '').slice(0, 12)}`;
  const asAdmin = async (sql: string) => {
    const admin = knex({ client: 'pg', connection: url, pool: { min: 0, max: 1 } });
    try {
      await admin.raw(sql);
    } finally {
      await admin.destroy();
    }
  };
  await asAdmin(`create schema ${schema}`);
  const databaseUrl = new URL(url);
  databaseUrl.searchParams.set('options', `-c search_path=${schema}`);
  return {
    schema,
    databaseUrl: databaseUrl.toString(),
    dropSchema: () => asAdmin(`drop schema ${schema} cascade`),
  };
}

const postgres = (url: string): TestDatabase => ({
  name: 'postgres',
  async open() {
    const { databaseUrl, dropSchema } = await createPostgresSchema(url);
    const db = createDb({ databaseUrl, sqliteFile: '' });
    await migrateLatest(db);
    return {
      db,
      drop: async () => {
        await db.destroy();
        await dropSchema();
      },
    };
  },
});

/** SQLite always; PostgreSQL too when TEST_DATABASE_URL names one (always in CI). */
export const testDatabases: TestDatabase[] = [
  sqlite,
  ...(TEST_DATABASE_URL ? [postgres(TEST_DATABASE_URL)] : []),
];

/**
 * The database the API tests run their app on: the `api-postgres` project (vite.config.ts) sets
 * DIPDECK_TEST_DB=postgres, the `api` project runs on SQLite.
 */
export const apiTestDatabase: TestDatabase['name'] =
  process.env.DIPDECK_TEST_DB === 'postgres' ? 'postgres' : 'sqlite';
if (apiTestDatabase === 'postgres' && !TEST_DATABASE_URL) {
  throw new Error('DIPDECK_TEST_DB=postgres needs TEST_DATABASE_URL (PostgreSQL)');
}
