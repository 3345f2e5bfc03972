import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Knex } from 'knex';
import { afterAll, beforeEach, describe, expect, it } from 'vitest';
import { createGroupCommit } from '../../../../server/db/group-commit';
import { createDb } from '../../../../server/db/knex';
import { AppError } from '../../../../server/errors';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'dipdeck-group-commit-'));
const db = createDb({ databaseUrl: undefined, sqliteFile: path.join(dir, 'g.sqlite') });
afterAll(async () => {
  await db.destroy();
  fs.rmSync(dir, { recursive: true, force: true });
});

const begins: string[] = [];
db.on('query', (query: { sql: string }) => {
  if (/^BEGIN/i.test(query.sql)) begins.push(query.sql);
});

beforeEach(async () => {
  await db.schema.dropTableIfExists('notes');
  // The write-first transaction writes to the migrations lock table.
  await db.schema.dropTableIfExists('knex_migrations_lock');
  await db.schema.createTable('knex_migrations_lock', (t) => t.integer('is_locked'));
  await db.schema.createTable('notes', (t) => {
    t.increments('id');
    t.string('text').notNullable().unique();
  });
  begins.length = 0;
});

// Checks first, then writes, as the group commit requires; "refuse" is an expected refusal, "break"
// an unexpected failure (a unique-index violation) after the write began.
async function addNote(trx: Knex.Transaction, text: string): Promise<number> {
  if (text === 'refuse') throw new AppError('refused', 'Not this one', 'invalid');
  if (text === 'break') await trx('notes').insert({ text: 'first' });
  const [id] = await trx('notes').insert({ text });
  return Number(id);
}

describe('group commit', () => {
  it('puts writes that arrive together in one transaction, in the order they came', async () => {
    const notes = createGroupCommit(db, addNote);
    const ids = await Promise.all(['a', 'b', 'c', 'd'].map((text) => notes.submit(text)));
    expect(ids).toEqual([1, 2, 3, 4]);
    expect(begins).toHaveLength(1);
    expect(await db('notes').orderBy('id').pluck('text')).toEqual(['a', 'b', 'c', 'd']);
  });

  it('starts a new transaction for writes that come while one is running', async () => {
    const notes = createGroupCommit(db, addNote);
    await notes.submit('a');
    await Promise.all([notes.submit('b'), notes.submit('c')]);
    expect(begins).toHaveLength(2);
  });

  it('answers a refused item with its error and stores the rest of its batch', async () => {
    const notes = createGroupCommit(db, addNote);
    const outcomes = await Promise.allSettled(['a', 'refuse', 'b'].map((text) => notes.submit(text)));
    expect(outcomes.map((outcome) => outcome.status)).toEqual(['fulfilled', 'rejected', 'fulfilled']);
    expect((outcomes[1] as PromiseRejectedResult).reason).toBeInstanceOf(AppError);
    expect(await db('notes').orderBy('id').pluck('text')).toEqual(['a', 'b']);
  });

  it('after an unexpected error, tries each item alone, so only the broken one fails', async () => {
    const notes = createGroupCommit(db, addNote);
    await notes.submit('first');
    const outcomes = await Promise.allSettled(['a', 'break', 'b'].map((text) => notes.submit(text)));
    expect(outcomes.map((outcome) => outcome.status)).toEqual(['fulfilled', 'rejected', 'fulfilled']);
    expect((outcomes[1] as PromiseRejectedResult).reason).not.toBeInstanceOf(AppError);
    expect(await db('notes').orderBy('id').pluck('text')).toEqual(['first', 'a', 'b']);
  });

  it('splits a long queue into batches of the chosen size', async () => {
    const notes = createGroupCommit(db, addNote, { maxBatch: 3 });
    await Promise.all(Array.from({ length: 7 }, (_, i) => notes.submit(`n${i}`)));
    expect(begins).toHaveLength(3);
    expect(await db('notes').count({ n: '*' })).toEqual([{ n: 7 }]);
  });
});
