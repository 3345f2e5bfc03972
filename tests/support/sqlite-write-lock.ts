import { createRequire } from 'node:module';

// better-sqlite3 ships no types; this is the little of it used here.
const Database: new (file: string) => { prepare(sql: string): { run(): unknown }; close(): void } =
  createRequire(import.meta.url)('better-sqlite3');

/**
 * Another process's write transaction (a worker's, a backup tool's), as a test's own connection that
 * holds SQLite's write lock on `file` until `release` (which may be called more than once).
 */
export function holdSqliteWriteLock(file: string): { release: () => void } {
  const connection = new Database(file);
  connection.prepare('BEGIN IMMEDIATE').run();
  let held = true;
  return {
    release() {
      if (!held) return;
      held = false;
      connection.prepare('ROLLBACK').run();
      connection.close();
    },
  };
}
