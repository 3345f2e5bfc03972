// The database busy, full or away: the API answers 503 with what to do, keeps serving, and loses nothing
// already stored. Each fault is provoked for real: another connection holding SQLite's write lock, a
// page limit that makes SQLite's file full, a PostgreSQL that refuses or drops connections.
import knex from 'knex';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/config';
import { createDb } from '../../server/db/knex';
import { createApp } from '../../server/http/app';
import { apiTestDatabase, createPostgresSchema, TEST_DATABASE_URL } from '../support/databases';
import { holdSqliteWriteLock } from '../support/sqlite-write-lock';
import { type Browser, createTestApp, signedIn, type TestApp } from './support/test-app';

const campaignNames = async (test: TestApp): Promise<string[]> =>
  test.db('campaigns').orderBy('id').pluck('name');

describe.runIf(apiTestDatabase === 'sqlite')('when SQLite is busy or full', () => {
  let test: TestApp;
  let browser: Browser;
  beforeAll(async () => {
    // The default busy timeout is 5 s; a short one keeps the test quick and behaves the same.
    test = await createTestApp({ env: { SQLITE_BUSY_TIMEOUT_MS: '100' } });
    ({ browser } = await signedIn(test, 'scientist'));
  });

  it('answers 503 "try again in a moment" with Retry-After while another connection holds the write lock, then saves again', async () => {
    expect((await browser.post('/api/campaigns', { name: 'Before the lock' })).status).toBe(201);
    // Just signed in: its next request also writes the session's expiry, which meets the lock too.
    const { browser: newcomer } = await signedIn(test, 'scientist');
    // Another process's write transaction (a worker's, a backup tool's), held past the busy timeout.
    const other = holdSqliteWriteLock(test.config.sqliteFile);
    try {
      const refused = await browser.post('/api/campaigns', { name: 'During the lock' });
      expect(refused.status).toBe(503);
      expect(refused.body.error).toEqual({
        code: 'database_busy',
        message: expect.stringMatching(/busy.*try again in a moment/),
      });
      expect(refused.headers['retry-after']).toBe('2');
      // Reads do not wait for the writer (WAL); the session's expiry is written another time.
      expect((await newcomer.get('/api/campaigns')).status).toBe(200);
    } finally {
      other.release();
    }
    expect((await browser.post('/api/campaigns', { name: 'After the lock' })).status).toBe(201);
    expect((await newcomer.post('/api/campaigns', { name: 'Newcomer after the lock' })).status).toBe(201);
    expect(await campaignNames(test)).toEqual([
      'Before the lock',
      'After the lock',
      'Newcomer after the lock',
    ]);
  });

  it('answers 503 "storage full, tell an administrator" when the file cannot grow, keeps what it had, and saves again once there is room', async () => {
    const before = await campaignNames(test);
    // The app's one connection may not grow the file past its current size: a full disk, for SQLite.
    const pages = Number((await test.db.raw('PRAGMA page_count'))[0].page_count);
    await test.db.raw(`PRAGMA max_page_count = ${pages}`);
    const saved: string[] = [];
    let refused: request.Response | undefined;
    try {
      // The free room left in the file's pages fills up first; then a write needs a page it cannot have.
      for (let i = 0; i < 200 && !refused; i += 1) {
        const name = `Filling ${i} ${'x'.repeat(200)}`;
        const response = await browser.post('/api/campaigns', { name: name.slice(0, 120) });
        if (response.status === 201) saved.push(name.slice(0, 120));
        else refused = response;
      }
      expect(refused?.status).toBe(503);
      expect(refused?.body.error).toEqual({
        code: 'storage_full',
        message: expect.stringMatching(/storage is full.*administrator/),
      });
      expect(refused?.headers['retry-after']).toBeUndefined();
      expect((await browser.get('/api/campaigns')).status).toBe(200);
    } finally {
      await test.db.raw('PRAGMA max_page_count = 1073741823');
    }
    // Nothing stored before was lost, and the refused write left nothing half-made.
    expect(await campaignNames(test)).toEqual([...before, ...saved]);
    expect(await test.db('audit_log').where({ action: 'campaign.created' }).count({ n: '*' })).toEqual([
      { n: before.length + saved.length },
    ]);
    expect((await browser.post('/api/campaigns', { name: 'After the clean-up' })).status).toBe(201);
    expect((await test.db.raw('PRAGMA integrity_check'))[0].integrity_check).toBe('ok');
  });
});

describe.runIf(apiTestDatabase === 'postgres')('when PostgreSQL refuses or drops connections', () => {
  it('answers 503 "not answering" with Retry-After when nothing listens at DATABASE_URL, and keeps answering', async () => {
    // Port 3469 is this test's own (see the brief's port range): nothing listens there.
    const config = loadConfig({
      NODE_ENV: 'test',
      DIPDECK_DEMO: '0',
      DATABASE_URL: 'postgres://postgres@127.0.0.1:3469/postgres',
    });
    const db = createDb(config);
    try {
      const { app } = createApp({ config, db });
      for (let i = 0; i < 2; i += 1) {
        // A script's token: checking it is the request's first use of the database.
        const response = await request(app).get('/api/campaigns').set('Authorization', 'Bearer dd_unknown');
        expect(response.status).toBe(503);
        expect(response.body.error).toEqual({
          code: 'database_unavailable',
          message: 'The database is not answering: try again in a moment',
        });
        expect(response.headers['retry-after']).toBe('5');
      }
    } finally {
      await db.destroy();
    }
  });

  describe('with a working database', () => {
    let test: TestApp;
    let browser: Browser;
    let dropSchema: () => Promise<void>;
    // The app's connections carry a name of their own, so that only they are ended on the shared server.
    const applicationName = `faults-${process.pid}`;
    const admin = () => knex({ client: 'pg', connection: TEST_DATABASE_URL, pool: { min: 0, max: 1 } });
    beforeAll(async () => {
      const schema = await createPostgresSchema(TEST_DATABASE_URL!);
      dropSchema = schema.dropSchema;
      const url = new URL(schema.databaseUrl);
      url.searchParams.set('application_name', applicationName);
      test = await createTestApp({ env: { DATABASE_URL: url.toString() } });
      ({ browser } = await signedIn(test, 'scientist'));
    });
    afterAll(async () => {
      await test.db.destroy();
      await dropSchema();
    });

    it('after an administrator ends all its connections (a database restart), the next requests are served, never 500', async () => {
      expect((await browser.post('/api/campaigns', { name: 'Before the restart' })).status).toBe(201);
      const server = admin();
      try {
        const ended = await server.raw(
          'select count(pg_terminate_backend(pid)) as n from pg_stat_activity where application_name = ?',
          [applicationName],
        );
        expect(Number(ended.rows[0].n)).toBeGreaterThanOrEqual(1);
      } finally {
        await server.destroy();
      }
      // The pool may still hand out a connection that died: that request may be refused, but only with 503.
      const statuses: number[] = [];
      for (let i = 0; i < 3; i += 1) {
        statuses.push((await browser.post('/api/campaigns', { name: `After the restart ${i}` })).status);
      }
      expect(
        statuses.every((status) => status === 201 || status === 503),
        String(statuses),
      ).toBe(true);
      expect(statuses.at(-1)).toBe(201);
      expect(await campaignNames(test)).toContain('Before the restart');
    });

    it('answers 503 "busy" when the server has no connection left for it (too_many_connections)', async () => {
      const role = `faults_${process.pid}`;
      const server = admin();
      try {
        await server.raw(`create role ${role} login connection limit 0`);
        const url = new URL(TEST_DATABASE_URL!);
        url.username = role;
        const config = loadConfig({ NODE_ENV: 'test', DIPDECK_DEMO: '0', DATABASE_URL: url.toString() });
        const db = createDb(config);
        try {
          const response = await request(createApp({ config, db }).app)
            .get('/api/campaigns')
            .set('Authorization', 'Bearer dd_unknown');
          expect(response.status).toBe(503);
          expect(response.body.error.code).toBe('database_busy');
          expect(response.headers['retry-after']).toBe('2');
        } finally {
          await db.destroy();
        }
      } finally {
        await server.raw(`drop role if exists ${role}`);
        await server.destroy();
      }
    });
  });
});
