import { AppError } from '../errors';

/**
 * The database could not do its part for a reason of its own (busy, full, away), not because of the
 * request: the answer is "unavailable" (503), never "something went wrong" (500).
 */
export class DatabaseUnavailableError extends AppError {
  override name = 'DatabaseUnavailableError';

  constructor(
    code: string,
    message: string,
    /** When a retry may succeed without anyone's help; absent when an administrator must act. */
    readonly retryAfterSeconds: number | undefined,
  ) {
    super(code, message, 'unavailable');
  }
}

/** Another writer held SQLite's lock past the busy timeout, or PostgreSQL gave up on a lock: it will pass. */
export const BUSY_RETRY_AFTER_S = 2;
/** A PostgreSQL server starting up, shutting down or out of connections usually answers within seconds. */
export const UNREACHABLE_RETRY_AFTER_S = 5;

const busy = () =>
  new DatabaseUnavailableError(
    'database_busy',
    'The database is busy with other writes: nothing was saved, try again in a moment',
    BUSY_RETRY_AFTER_S,
  );
const storageFull = () =>
  new DatabaseUnavailableError(
    'storage_full',
    "The database's storage is full: nothing was saved. Tell an administrator: the server needs more disk space",
    undefined,
  );
const storageFailing = () =>
  new DatabaseUnavailableError(
    'storage_unavailable',
    "The database cannot write to its storage: nothing was saved. Tell an administrator: the server's disk needs checking",
    undefined,
  );
const unreachable = () =>
  new DatabaseUnavailableError(
    'database_unavailable',
    'The database is not answering: try again in a moment',
    UNREACHABLE_RETRY_AFTER_S,
  );

// SQLite's result codes as better-sqlite3 names them (extended codes such as SQLITE_BUSY_SNAPSHOT
// start with their primary one): https://www.sqlite.org/rescode.html
function fromSqlite(code: string): DatabaseUnavailableError | undefined {
  if (code.startsWith('SQLITE_BUSY') || code.startsWith('SQLITE_LOCKED')) return busy();
  if (code === 'SQLITE_FULL') return storageFull();
  if (code.startsWith('SQLITE_IOERR') || code.startsWith('SQLITE_READONLY')) return storageFailing();
  return undefined;
}

// PostgreSQL's SQLSTATE codes: https://www.postgresql.org/docs/current/errcodes-appendix.html
const POSTGRES_BUSY = new Set([
  '55P03', // lock_not_available
  '40P01', // deadlock_detected
  '53000', // insufficient_resources
  '53200', // out_of_memory
  '53300', // too_many_connections
]);
const POSTGRES_UNREACHABLE = new Set([
  '57P01', // admin_shutdown
  '57P02', // crash_shutdown
  '57P03', // cannot_connect_now (starting up, recovering)
  '08000', // connection_exception
  '08001', // sqlclient_unable_to_establish_sqlconnection
  '08003', // connection_does_not_exist
  '08006', // connection_failure
]);
const POSTGRES_STORAGE_FULL = '53100'; // disk_full

// How a connection to the database fails before any SQL: a route's only outgoing connections are the
// database's (the queues' Redis client raises errors of its own, and mail leaves through the queue).
const NETWORK_UNREACHABLE = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENOTFOUND']);

interface CodedError {
  code?: unknown;
  name?: unknown;
  message?: unknown;
  cause?: unknown;
}

/**
 * The answer for an error that says the database is busy, full or away, or undefined for any other
 * error. Looks through `cause` chains, since Knex and services may wrap the driver's error.
 */
export function databaseUnavailable(error: unknown): DatabaseUnavailableError | undefined {
  let current: unknown = error;
  for (let depth = 0; depth < 5 && current && typeof current === 'object'; depth += 1) {
    if (current instanceof DatabaseUnavailableError) return current;
    const { code, name, message, cause } = current as CodedError;
    if (typeof code === 'string') {
      const known =
        fromSqlite(code) ??
        (code === POSTGRES_STORAGE_FULL ? storageFull() : undefined) ??
        (POSTGRES_BUSY.has(code) ? busy() : undefined) ??
        (POSTGRES_UNREACHABLE.has(code) || NETWORK_UNREACHABLE.has(code) ? unreachable() : undefined);
      if (known) return known;
    }
    // Knex's pool waited its whole acquireConnectionTimeout: every connection is taken.
    if (name === 'KnexTimeoutError') return busy();
    // pg's words when the server closes the connection under a query.
    if (typeof message === 'string' && /^Connection terminated( unexpectedly)?$/.test(message)) {
      return unreachable();
    }
    current = cause;
  }
  return undefined;
}
