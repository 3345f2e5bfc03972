import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { createDb } from '../../../../server/db/knex';
import { migrateLatest, rollbackAll } from '../../../../server/db/migrate';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'dipdeck-migrate-'));
const db = createDb({ databaseUrl: undefined, sqliteFile: path.join(dir, 'm.sqlite') });
afterAll(async () => {
  await db.destroy();
  fs.rmSync(dir, { recursive: true, force: true });
});

const tables = async () =>
  (
    await db.raw(
      "select name from sqlite_master where type = 'table' and name not like 'knex_%' and name not like 'sqlite_%'",
    )
  )
    .map((row: { name: string }) => row.name)
    .sort();

describe('migrations on SQLite', () => {
  it('run up, down and up again cleanly', async () => {
    expect(await migrateLatest(db)).toHaveLength(1);
    const created = await tables();
    expect(created).toEqual(
      expect.arrayContaining([
        'people',
        'sessions',
        'api_tokens',
        'campaigns',
        'targets',
        'light_curves',
        'snippets',
      ]),
    );
    expect(created).toEqual(
      expect.arrayContaining(['verdicts', 'reliability', 'rulings', 'candidates', 'newsletters']),
    );
    expect(created).toEqual(expect.arrayContaining(['deliveries', 'audit_log', 'uploads', 'dips']));
    expect(await migrateLatest(db)).toHaveLength(0);
    expect(await rollbackAll(db)).toHaveLength(1);
    expect(await tables()).toEqual([]);
    expect(await migrateLatest(db)).toHaveLength(1);
    expect(await tables()).toEqual(created);
  });

  it('opens SQLite in WAL mode with synchronous=NORMAL, a busy timeout and foreign keys on', async () => {
    expect((await db.raw('pragma journal_mode'))[0].journal_mode).toBe('wal');
    expect((await db.raw('pragma synchronous'))[0].synchronous).toBe(1); // 1 = NORMAL
    expect((await db.raw('pragma busy_timeout'))[0].timeout).toBeGreaterThan(0);
    expect((await db.raw('pragma foreign_keys'))[0].foreign_keys).toBe(1);
  });
});
