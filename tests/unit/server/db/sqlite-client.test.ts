import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { createDb, isSqlite } from '../../../../server/db/knex';

interface Connection {
  prepare(sql: string): unknown;
}

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'dipdeck-sqlite-client-'));
const db = createDb({ databaseUrl: undefined, sqliteFile: path.join(dir, 'c.sqlite') });
afterAll(async () => {
  await db.destroy();
  fs.rmSync(dir, { recursive: true, force: true });
});

describe('the SQLite client with kept statements', () => {
  it('is still recognised as SQLite (the session store and write-first transactions ask)', () => {
    expect(isSqlite(db)).toBe(true);
    expect(db.client.dialect).toBe('sqlite3');
  });

  it('answers a repeated query with fresh bindings each time', async () => {
    await db.schema.createTable('stars', (t) => {
      t.increments('id');
      t.string('designation');
    });
    await db('stars').insert([{ designation: 'DD-1' }, { designation: 'DD-2' }]);
    for (const [id, designation] of [
      [1, 'DD-1'],
      [2, 'DD-2'],
      [1, 'DD-1'],
    ] as const) {
      expect(await db('stars').where({ id }).first('designation')).toEqual({ designation });
    }
  });

  it('prepares a statement once, however often it runs', async () => {
    const client = db.client as {
      acquireConnection(): Promise<Connection>;
      releaseConnection(c: Connection): void;
    };
    const connection = await client.acquireConnection();
    const prepare = connection.prepare.bind(connection);
    const prepared: string[] = [];
    connection.prepare = (sql: string) => {
      prepared.push(sql);
      return prepare(sql);
    };
    client.releaseConnection(connection);
    try {
      for (let i = 0; i < 5; i += 1) await db('stars').where({ id: 2 }).first('id');
    } finally {
      connection.prepare = prepare;
    }
    expect(prepared.filter((sql) => sql.startsWith('select `id` from `stars`'))).toHaveLength(1);
  });

  it('sees a column added after the statement was first kept (SQLite re-prepares on schema change)', async () => {
    await db('stars').where({ id: 1 }).first();
    await db.schema.alterTable('stars', (t) => t.double('magnitude'));
    await db('stars').where({ id: 1 }).update({ magnitude: 11.5 });
    expect(await db('stars').where({ id: 1 }).first()).toEqual({
      id: 1,
      designation: 'DD-1',
      magnitude: 11.5,
    });
  });

  it('reports inserted ids and changed-row counts as Knex expects', async () => {
    const [inserted] = await db('stars').insert({ designation: 'DD-3' });
    expect(inserted).toBe(3);
    expect(await db('stars').where('id', '<', 3).update({ magnitude: 12 })).toBe(2);
  });

  it('keeps nested transactions (savepoints) working, rollback included', async () => {
    await db.transaction(async (trx) => {
      await trx('stars').insert({ designation: 'DD-4' });
      await trx
        .transaction(async (inner) => {
          await inner('stars').insert({ designation: 'DD-5' });
          throw new Error('undo the inner one');
        })
        .catch(() => undefined);
    });
    expect(await db('stars').pluck('designation')).toEqual(['DD-1', 'DD-2', 'DD-3', 'DD-4']);
  });

  it('honours a query’s own integer mode without passing it on to the next query', async () => {
    const [big] = await db.raw('select 9007199254740993 as n').options({ safeIntegers: true });
    expect(big.n).toBe(9007199254740993n);
    const [plain] = await db.raw('select 9007199254740993 as n');
    expect(typeof plain.n).toBe('number');
  });
});
