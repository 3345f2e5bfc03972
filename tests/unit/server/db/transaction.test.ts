import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Db } from '../../../../server/db/knex';
import { writeTransaction } from '../../../../server/db/transaction';
import { type TestDatabase, testDatabases } from '../../../support/databases';

describe.each(testDatabases)('writeTransaction on $name', (database: TestDatabase) => {
  let db: Db;
  let drop: () => Promise<void>;
  beforeAll(async () => {
    ({ db, drop } = await database.open());
    await db.schema.createTable('scratch_names', (table) => {
      table.increments('id');
      table.string('name').notNullable(); // no unique index: the check in the transaction is all there is
    });
  });
  afterAll(() => drop());

  // The services' check-then-write steps rely on one write transaction at a time.
  it('lets only one of two concurrent check-then-insert transactions pass the check', async () => {
    const claim = (name: string) =>
      writeTransaction(db, async (trx) => {
        const taken = await trx('scratch_names').where({ name }).first();
        await new Promise((resolve) => setTimeout(resolve, 50));
        if (taken) return false;
        await trx('scratch_names').insert({ name });
        return true;
      });
    const results = await Promise.all([claim('north'), claim('north'), claim('north')]);
    expect(results.filter(Boolean)).toHaveLength(1);
    expect(await db('scratch_names').where({ name: 'north' }).count({ n: '*' })).toEqual([
      { n: database.name === 'postgres' ? '1' : 1 },
    ]);
  });
});
