// Which database errors are "unavailable" (503) rather than our bug (500). The ones the API tests can
// provoke for real are in tests/api/database-faults.test.ts; these are the rest, by their codes.
import { describe, expect, it } from 'vitest';
import { databaseUnavailable } from '../../../../server/db/database-errors';

const coded = (code: string, message = 'from the driver') => Object.assign(new Error(message), { code });

describe('databaseUnavailable', () => {
  it.each([
    // SQLite result codes (https://www.sqlite.org/rescode.html), as better-sqlite3 names them
    ['SQLITE_BUSY', 'database_busy'],
    ['SQLITE_BUSY_SNAPSHOT', 'database_busy'],
    ['SQLITE_LOCKED', 'database_busy'],
    ['SQLITE_FULL', 'storage_full'],
    ['SQLITE_IOERR_WRITE', 'storage_unavailable'],
    ['SQLITE_READONLY', 'storage_unavailable'],
    // PostgreSQL SQLSTATEs (https://www.postgresql.org/docs/current/errcodes-appendix.html)
    ['53100', 'storage_full'],
    ['55P03', 'database_busy'],
    ['53300', 'database_busy'],
    ['57P03', 'database_unavailable'],
    ['57P01', 'database_unavailable'],
    ['08006', 'database_unavailable'],
    ['ECONNREFUSED', 'database_unavailable'],
  ])('maps %s to %s', (code, expected) => {
    expect(databaseUnavailable(coded(code))?.code).toBe(expected);
  });

  it('finds the driver error under a wrapper, and says when to retry only when a retry can help', () => {
    const wrapped = new Error('saving failed', { cause: coded('SQLITE_BUSY') });
    expect(databaseUnavailable(wrapped)).toMatchObject({ kind: 'unavailable', retryAfterSeconds: 2 });
    expect(databaseUnavailable(coded('SQLITE_FULL'))?.retryAfterSeconds).toBeUndefined();
  });

  it('leaves every other error alone: constraint failures, syntax errors, our own bugs', () => {
    for (const error of [
      coded('SQLITE_CONSTRAINT_UNIQUE'),
      coded('SQLITE_ERROR'),
      coded('23505'), // unique_violation
      coded('42P01'), // undefined_table
      new TypeError('x is undefined'),
      'a string',
      undefined,
    ]) {
      expect(databaseUnavailable(error)).toBeUndefined();
    }
  });
});
