import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import knex from 'knex';
import { createDb, type Db, knexSettings } from '../../server/db/knex';
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

// Each test file gets a schema of its own in the shared server, so files running side by side (and the
// migration test, which rolls everything back) never meet.
const postgres = (url: string): TestDatabase => ({
  name: 'postgres',
  async open() {
    const schema = `test_${randomUUID().replaceAll('-', '').slice(0, 12)}`;
    const admin = knex({ client: 'pg', connection: url });
    await admin.raw(`create schema ${schema}`);
    await admin.destroy();
    const db = knex({ ...knexSettings({ databaseUrl: url, sqliteFile: '' }), searchPath: [schema] });
    await migrateLatest(db);
    return {
      db,
      drop: async () => {
        await db.raw(`drop schema ${schema} cascade`);
        await db.destroy();
      },
    };
  },
});

/** SQLite always; PostgreSQL too when TEST_DATABASE_URL names one (always in CI). */
export const testDatabases: TestDatabase[] = [
  sqlite,
  ...(TEST_DATABASE_URL ? [postgres(TEST_DATABASE_URL)] : []),
];
