// npm run db:backup: a copy of the live SQLite database that opens, passes SQLite's integrity check,
// holds every transaction committed before it began, and holds each transaction wholly or not at all,
// however the writes around it fall.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import { createRequire } from 'node:module';
import os from 'node:os';
import path from 'node:path';
import { Worker } from 'node:worker_threads';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createCampaign } from '../../../../seeds/factories/campaigns';
import { createPerson } from '../../../../seeds/factories/people';
import { loadConfig } from '../../../../server/config';
import { BackupRefusedError, backupDatabase, defaultBackupPath } from '../../../../server/db/backup';
import { createDb } from '../../../../server/db/knex';
import { migrateLatest } from '../../../../server/db/migrate';
import { eventually } from '../../../support/eventually';

const require = createRequire(import.meta.url);
// better-sqlite3 ships no types: the few calls these tests make on a connection of their own.
interface Connection {
  prepare(sql: string): { run(...values: unknown[]): unknown; all(...values: unknown[]): unknown[] };
  pragma(source: string, options?: { simple: boolean }): unknown;
  close(): void;
}
const Database: new (
  file: string,
  options?: { readonly?: boolean },
) => Connection = require('better-sqlite3');

const repo = path.resolve(import.meta.dirname, '../../../..');
const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'dipdeck-backup-'));
const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir });
const db = createDb(config);
const ROWS_PER_BATCH = 10;
// About 4 MB of rows before the tests begin, so that a copy is more than a moment's work.
const PREFILLED_BATCHES = 200;

beforeAll(async () => {
  await migrateLatest(db);
  await createPerson(db, { role: 'scientist', reuseHash: true });
  await createCampaign(db, { status: 'live', name: 'Southern field' });
  // A table of the test's own: each batch is one transaction of ROWS_PER_BATCH rows.
  await db.schema.createTable('backup_probe', (table) => {
    table.integer('batch').notNullable();
    table.integer('item').notNullable();
    table.binary('payload').notNullable();
  });
  for (let batch = 1; batch <= PREFILLED_BATCHES; batch += 1) await writeBatch(batch);
});
afterAll(async () => {
  await db.destroy();
  fs.rmSync(dataDir, { recursive: true, force: true });
});

async function writeBatch(batch: number): Promise<void> {
  await db.transaction(async (trx) => {
    const rows = Array.from({ length: ROWS_PER_BATCH }, (_, item) => ({
      batch,
      item,
      payload: Buffer.alloc(2_000, batch % 251),
    }));
    await trx('backup_probe').insert(rows);
  });
}

/** Rows per batch in a database file, read with a connection of its own. */
function batchesIn(file: string): Map<number, number> {
  const connection = new Database(file, { readonly: true });
  try {
    const rows = connection
      .prepare('select batch, count(*) as n from backup_probe group by batch order by batch')
      .all() as { batch: number; n: number }[];
    return new Map(rows.map((row) => [row.batch, row.n]));
  } finally {
    connection.close();
  }
}

/** What a restore needs: the copy opens, passes the integrity check, and has the source's app rows. */
function expectRestorable(file: string): void {
  const copy = new Database(file, { readonly: true });
  try {
    expect(copy.pragma('integrity_check', { simple: true })).toBe('ok');
    expect(copy.pragma('journal_mode', { simple: true })).toBe('delete');
    const source = new Database(config.sqliteFile, { readonly: true });
    try {
      for (const table of ['knex_migrations', 'people', 'campaigns']) {
        expect(rowsOf(copy, table), table).toEqual(rowsOf(source, table));
      }
      expect(rowsOf(copy, 'knex_migrations').length).toBeGreaterThan(5);
    } finally {
      source.close();
    }
  } finally {
    copy.close();
  }
}
const rowsOf = (connection: Connection, table: string) =>
  connection.prepare(`select * from ${table} order by id`).all();

/** Every batch wholly in, and the batches a run from the first: a copy as of one commit. */
function expectWholeBatches(batches: Map<number, number>, atLeast: number): number {
  const numbers = [...batches.keys()];
  expect(numbers).toEqual(Array.from({ length: numbers.length }, (_, i) => i + 1));
  expect([...batches.values()].every((n) => n === ROWS_PER_BATCH)).toBe(true);
  expect(numbers.length).toBeGreaterThanOrEqual(atLeast);
  return numbers.length;
}

// Another connection in another thread, committing a batch after another until told to stop.
const WRITER = `
const { parentPort, workerData } = require('node:worker_threads');
const Database = require(workerData.driver);
const db = new Database(workerData.file);
db.pragma('busy_timeout = 5000');
const insert = db.prepare('insert into backup_probe (batch, item, payload) values (?, ?, ?)');
const write = db.transaction((batch) => {
  for (let item = 0; item < workerData.rows; item += 1) insert.run(batch, item, Buffer.alloc(2000, batch % 251));
});
let batch = workerData.first;
let stop = false;
parentPort.on('message', () => { stop = true; });
(function next() {
  if (stop) { db.close(); parentPort.postMessage({ stopped: batch - 1 }); return; }
  write(batch);
  parentPort.postMessage({ committed: batch });
  batch += 1;
  setImmediate(next);
})();
`;

const countBatches = async () => Number((await db('backup_probe').countDistinct({ n: 'batch' }))[0]!.n);

describe('backupDatabase', () => {
  it('while another thread commits transactions, copies a database that restores, with each transaction wholly in or out', async () => {
    const first = (await countBatches()) + 1;
    let committed = first - 1;
    const writer = new Worker(WRITER, {
      eval: true,
      workerData: {
        driver: require.resolve('better-sqlite3'),
        file: config.sqliteFile,
        rows: ROWS_PER_BATCH,
        first,
      },
    });
    const stopped = new Promise<number>((resolve, reject) => {
      writer.on('message', (message: { committed?: number; stopped?: number }) => {
        if (message.committed) committed = message.committed;
        if (message.stopped !== undefined) resolve(message.stopped);
      });
      writer.on('error', reject);
    });
    try {
      await eventually(async () => committed >= first + 2, 'the writer commits');
      const before = committed;
      const destination = path.join(dataDir, 'during-writes.sqlite');
      const result = await backupDatabase(config, destination);
      expect(result).toEqual({
        source: config.sqliteFile,
        destination,
        bytes: fs.statSync(destination).size,
      });
      const copied = expectWholeBatches(batchesIn(destination), before);
      // The writer went on: the copy is the database as of one moment, not the file as it grows.
      await eventually(async () => committed > copied, 'the writer commits after the copy');
      expectRestorable(destination);
    } finally {
      writer.postMessage('stop');
      await stopped;
    }
    expectWholeBatches(batchesIn(config.sqliteFile), committed);
  });

  it('leaves out a transaction open while it copies, and takes it whole once committed', async () => {
    const open = (await countBatches()) + 1;
    const other = new Database(config.sqliteFile);
    try {
      other.prepare('BEGIN IMMEDIATE').run();
      const insert = other.prepare('insert into backup_probe (batch, item, payload) values (?, ?, ?)');
      for (let item = 0; item < ROWS_PER_BATCH / 2; item += 1) insert.run(open, item, Buffer.alloc(10));
      const during = path.join(dataDir, 'open-transaction.sqlite');
      await backupDatabase(config, during);
      expect(expectWholeBatches(batchesIn(during), open - 1)).toBe(open - 1);

      for (let item = ROWS_PER_BATCH / 2; item < ROWS_PER_BATCH; item += 1)
        insert.run(open, item, Buffer.alloc(10));
      other.prepare('COMMIT').run();
      const after = path.join(dataDir, 'after-commit.sqlite');
      await backupDatabase(config, after);
      expect(expectWholeBatches(batchesIn(after), open)).toBe(open);
      expectRestorable(after);
    } finally {
      other.close();
    }
  });

  it('refuses on PostgreSQL (pointing to pg_dump) and when the destination exists, touching nothing', async () => {
    await expect(
      backupDatabase({ ...config, databaseUrl: 'postgres://dipdeck@127.0.0.1/dipdeck' }),
    ).rejects.toThrow(/PostgreSQL.*pg_dump/);
    const taken = path.join(dataDir, 'taken.sqlite');
    fs.writeFileSync(taken, 'an earlier backup');
    const attempt = backupDatabase(config, taken);
    await expect(attempt).rejects.toBeInstanceOf(BackupRefusedError);
    await expect(attempt).rejects.toThrow(/already exists/);
    expect(fs.readFileSync(taken, 'utf8')).toBe('an earlier backup');
    expect(fs.readdirSync(dataDir).filter((name) => name.includes('.partial'))).toEqual([]);
  });

  it('names its default copy DATA_DIR/backups/dipdeck-<UTC time>.sqlite', () => {
    expect(defaultBackupPath('/srv/dipdeck', new Date('2026-03-14T02:15:09.123Z'))).toBe(
      '/srv/dipdeck/backups/dipdeck-20260314T021509Z.sqlite',
    );
  });
});

describe('npm run db:backup', () => {
  it('as its own process while this one writes, prints where the copy is and its size, and the copy restores', async () => {
    const before = await countBatches();
    const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/db-backup.ts'], {
      cwd: repo,
      env: { ...process.env, NODE_ENV: 'test', DATA_DIR: dataDir, DATABASE_URL: '' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let output = '';
    child.stdout.on('data', (chunk) => {
      output += chunk;
    });
    child.stderr.on('data', (chunk) => {
      output += chunk;
    });
    const exited = new Promise<number | null>((resolve) => child.once('exit', resolve));
    let running = true;
    void exited.then(() => {
      running = false;
    });
    // The app goes on writing, one transaction after another, while the script copies.
    let batch = before;
    while (running) {
      batch += 1;
      await writeBatch(batch);
      // better-sqlite3 answers at once: without a turn of the event loop, the child's exit is never seen.
      await new Promise((resolve) => setImmediate(resolve));
    }
    expect(await exited, output).toBe(0);
    const match = output.match(/^Backed up (.+) to (.+) \((\d+\.\d) MB, checked\)\.$/m);
    expect(match, output).not.toBeNull();
    const [, source, destination, megabytes] = match!;
    expect(source).toBe(config.sqliteFile);
    expect(path.dirname(destination!)).toBe(path.join(dataDir, 'backups'));
    expect(path.basename(destination!)).toMatch(/^dipdeck-\d{8}T\d{6}Z\.sqlite$/);
    expect(Number(megabytes)).toBeCloseTo(fs.statSync(destination!).size / 1e6, 1);
    expectWholeBatches(batchesIn(destination!), before);
    expectRestorable(destination!);
  }, 30_000);
});
