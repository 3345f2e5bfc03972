import fs from 'node:fs';
import path from 'node:path';
import knex, { type Knex } from 'knex';
import type { Config } from '../config';
import { migrationSource } from './migration-list';
import { CachedStatementsSqliteClient } from './sqlite-client';

export type Db = Knex;

/** The default of SQLITE_BUSY_TIMEOUT_MS: long enough to outwait any one of our write transactions. */
export const SQLITE_BUSY_TIMEOUT_MS = 5_000;

type DbSettings = Pick<Config, 'databaseUrl' | 'sqliteFile'> & Partial<Pick<Config, 'sqliteBusyTimeoutMs'>>;

interface BetterSqliteConnection {
  pragma(source: string): unknown;
}

/** Knex settings for the configured database: PostgreSQL when DATABASE_URL is set, else SQLite in DATA_DIR. */
export function knexSettings(config: DbSettings): Knex.Config {
  const migrations: Knex.MigratorConfig = { migrationSource, tableName: 'knex_migrations' };
  if (config.databaseUrl) {
    return { client: 'pg', connection: config.databaseUrl, pool: { min: 0, max: 10 }, migrations };
  }
  const busyTimeoutMs = config.sqliteBusyTimeoutMs ?? SQLITE_BUSY_TIMEOUT_MS;
  return {
    // Knex's types know only its base client; this one is its better-sqlite3 client, extended.
    client: CachedStatementsSqliteClient as unknown as typeof Knex.Client,
    connection: { filename: config.sqliteFile },
    useNullAsDefault: true,
    // better-sqlite3 is synchronous: one connection per process, so statements queue instead of contending.
    pool: {
      min: 1,
      max: 1,
      afterCreate(
        connection: BetterSqliteConnection,
        done: (error: Error | null, connection: unknown) => void,
      ) {
        try {
          // See docs/decisions/001-sqlite-wal-and-transactions.md for why these four.
          connection.pragma('journal_mode = WAL');
          connection.pragma('synchronous = NORMAL');
          connection.pragma(`busy_timeout = ${busyTimeoutMs}`);
          connection.pragma('foreign_keys = ON');
          done(null, connection);
        } catch (error) {
          done(error as Error, connection);
        }
      },
    },
    migrations,
  };
}

/** The one Knex instance of a process. */
export function createDb(config: DbSettings): Db {
  if (!config.databaseUrl) fs.mkdirSync(path.dirname(config.sqliteFile), { recursive: true });
  return knex(knexSettings(config));
}

export const isSqlite = (db: Db): boolean => db.client.dialect === 'sqlite3';

/**
 * The `nulls` of an ORDER BY that sorts NULLs as the smallest values, as SQLite does; PostgreSQL's
 * default is the opposite. SQLite is given none: Knex rewrites a SQLite `nulls` option into a
 * null test that replaces the column's own order.
 */
export function nullsAsSmallest(
  db: Db | Knex.Transaction,
  order: 'asc' | 'desc',
): 'first' | 'last' | undefined {
  if (db.client.dialect === 'sqlite3') return undefined;
  return order === 'asc' ? 'first' : 'last';
}
