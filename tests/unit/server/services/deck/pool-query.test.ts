import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../../../../server/db/knex';
import { migrateLatest } from '../../../../../server/db/migrate';
import { poolQuery } from '../../../../../server/services/deck/next-cards';

// The pool query runs three times for every card request. Sorting instead of walking an index cost
// about 1 ms a call on 6,000 snippets and was 40 % of the server's time under `npm run bench -- load`;
// this keeps that from coming back unnoticed when the query or the indexes change.
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'dipdeck-pool-'));
const db = createDb({ databaseUrl: undefined, sqliteFile: path.join(dir, 'pool.sqlite') });
beforeAll(async () => {
  await migrateLatest(db);
});
afterAll(async () => {
  await db.destroy();
  fs.rmSync(dir, { recursive: true, force: true });
});

async function plan(query: ReturnType<typeof poolQuery>): Promise<string[]> {
  const { sql, bindings } = query.toSQL();
  const rows: { detail: string }[] = await db.raw(`explain query plan ${sql}`, bindings);
  return rows.map((row) => row.detail);
}

describe('the Deck pool query on SQLite', () => {
  it.each([
    ['a volunteer holding no cards', { personId: 7 }, []],
    ['a volunteer holding cards', { personId: 7 }, [3, 9, 12]],
    ['a visitor', { guestKey: 'guest-key' }, [4]],
  ] as const)('walks snippets_pool_order_index in order, with no sort, for %s', async (_, judge, held) => {
    const steps = await plan(poolQuery(db, 1, 'real', 15, judge, [...held]));
    expect(steps.some((step) => step.includes('USING INDEX snippets_pool_order_index'))).toBe(true);
    expect(steps.filter((step) => step.includes('TEMP B-TREE'))).toEqual([]);
  });
});
