import type { Knex } from 'knex';
import { type Db, isSqlite } from './knex';

/**
 * Runs `work` in a transaction that holds SQLite's write lock from its first statement.
 *
 * Knex opens SQLite transactions with a plain (deferred) BEGIN. When the server and a worker are two
 * processes, a deferred transaction that reads and then writes can fail with SQLITE_BUSY at once,
 * without waiting for the busy timeout, because upgrading a read lock could deadlock. A write that
 * touches no row still takes the lock, so the transaction behaves like BEGIN IMMEDIATE and waits its
 * turn instead. On PostgreSQL row locks do this job and nothing extra is sent.
 */
export async function writeTransaction<T>(db: Db, work: (trx: Knex.Transaction) => Promise<T>): Promise<T> {
  return db.transaction(async (trx) => {
    if (isSqlite(db)) await trx.raw('DELETE FROM knex_migrations_lock WHERE 0');
    return work(trx);
  });
}
