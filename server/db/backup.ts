import fs from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import type { Config } from '../config';
import { SQLITE_BUSY_TIMEOUT_MS } from './knex';

/** The part of better-sqlite3 (which ships no types) that a backup uses. */
interface SqliteConnection {
  pragma(source: string, options?: { simple: boolean }): unknown;
  backup(destination: string, options: { progress: () => number }): Promise<unknown>;
  close(): void;
}
type SqliteConstructor = new (
  file: string,
  options: { readonly?: boolean; fileMustExist?: boolean },
) => SqliteConnection;
const Database: SqliteConstructor = createRequire(import.meta.url)('better-sqlite3');

/** A backup that was not started, with what to do instead. */
export class BackupRefusedError extends Error {
  override name = 'BackupRefusedError';
}

export interface BackupResult {
  source: string;
  destination: string;
  bytes: number;
}

// SQLite copies this many pages in one step at most: in effect "all of them", in one read transaction.
const ALL_PAGES = 0x7fff_ffff;

/** DATA_DIR/backups/dipdeck-20260314T021500Z.sqlite: UTC, so that names sort in time order everywhere. */
export function defaultBackupPath(dataDir: string, now = new Date()): string {
  const stamp = now
    .toISOString()
    .replace(/\.\d{3}Z$/, 'Z')
    .replaceAll(/[-:]/g, '');
  return path.join(dataDir, 'backups', `dipdeck-${stamp}.sqlite`);
}

/**
 * Copies the SQLite database to `destination` (by default under DATA_DIR/backups) with SQLite's online
 * backup API, while the server and workers keep writing. The copy is taken in one step, inside one read
 * transaction: it is the database as of one commit, with every transaction wholly in or wholly out (in
 * several steps, each write by another process would restart the copy, and a busy database would never
 * finish). It is written beside its destination first and appears there only once checked, as a
 * single self-contained file (rollback journal, not WAL). Never overwrites a file.
 * @throws BackupRefusedError on PostgreSQL, without a database, or when the destination exists.
 */
export async function backupDatabase(
  config: Pick<Config, 'databaseUrl' | 'sqliteFile' | 'dataDir'> &
    Partial<Pick<Config, 'sqliteBusyTimeoutMs'>>,
  destination?: string,
): Promise<BackupResult> {
  if (config.databaseUrl) {
    throw new BackupRefusedError(
      'This deployment keeps its data in PostgreSQL (DATABASE_URL is set); db:backup copies SQLite only. ' +
        'Back PostgreSQL up with its own tool: pg_dump --format=custom --file=dipdeck.dump "$DATABASE_URL"',
    );
  }
  const source = path.resolve(config.sqliteFile);
  if (!fs.existsSync(source)) throw new BackupRefusedError(`There is no database at ${source} to back up`);
  const target = path.resolve(destination ?? defaultBackupPath(config.dataDir));
  if (target === source) throw new BackupRefusedError('The backup cannot be the database itself');
  if (fs.existsSync(target)) {
    throw new BackupRefusedError(`${target} already exists: a backup never overwrites a file; name another`);
  }
  fs.mkdirSync(path.dirname(target), { recursive: true });

  const partial = `${target}.partial-${process.pid}`;
  const database = new Database(source, { readonly: true, fileMustExist: true });
  try {
    database.pragma(`busy_timeout = ${config.sqliteBusyTimeoutMs ?? SQLITE_BUSY_TIMEOUT_MS}`);
    await database.backup(partial, { progress: () => ALL_PAGES });
    checkCopy(partial);
    // link, unlike rename, fails if a file of that name appeared meanwhile.
    fs.linkSync(partial, target);
  } finally {
    database.close();
    fs.rmSync(partial, { force: true });
    fs.rmSync(`${partial}-journal`, { force: true });
  }
  return { source, destination: target, bytes: fs.statSync(target).size };
}

function checkCopy(file: string): void {
  const copy = new Database(file, { fileMustExist: true });
  try {
    // The source is in WAL mode; a copy on its own is easier to move and restore without its -wal file.
    copy.pragma('journal_mode = DELETE');
    const result = copy.pragma('quick_check', { simple: true });
    if (result !== 'ok')
      throw new Error(`The copy failed SQLite's check (${String(result)}); nothing was kept`);
  } finally {
    copy.close();
  }
}

/** 12.3 MB: sizes for people (powers of 1000, as disks are sold). */
export function formatBytes(bytes: number): string {
  const units = ['bytes', 'kB', 'MB', 'GB', 'TB'];
  let value = bytes;
  let unit = 0;
  while (value >= 1000 && unit < units.length - 1) {
    value /= 1000;
    unit += 1;
  }
  return unit === 0 ? `${bytes} bytes` : `${value.toFixed(1)} ${units[unit]}`;
}
