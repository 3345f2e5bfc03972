import type { Knex } from 'knex';
import { type Db, isSqlite } from './knex';

/** The advisory lock key of write transactions on PostgreSQL: any fixed number no one else uses. */
const POSTGRES_WRITE_LOCK = 0x64697064_6563;

/**
 * Runs `work` in a transaction that holds SQLite's write lock from its first statement.
 *
 * Knex opens SQLite transactions with a plain (deferred) BEGIN. When the server and a worker are two
 * processes, a deferred transaction that reads and then writes can fail with SQLITE_BUSY at once,
 * without waiting for the busy timeout, because upgrading a read lock could deadlock. A write that
 * touches no row still takes the lock, so the transaction behaves like BEGIN IMMEDIATE and waits its
 * turn instead.
 *
 * On PostgreSQL the same one-writer-at-a-time rule comes from a transaction-level advisory lock: the
 * services' check-then-write steps (a status move, a ruling, a unique name) are written for it, and
 * row locks alone would let two such transactions both pass the check. Reads never wait for it.
 */
export async function writeTransaction<T>(db: Db, work: (trx: Knex.Transaction) => Promise<T>): Promise<T> {
  return db.transaction(async (trx) => {
    if (isSqlite(db)) await trx.raw('DELETE FROM knex_migrations_lock WHERE 0');
    else await trx.raw('SELECT pg_advisory_xact_lock(?)', [POSTGRES_WRITE_LOCK]);
    return work(trx);
  });
}
