import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Express } from 'express';
import request from 'supertest';
import { afterAll, vi } from 'vitest';
import { createPerson } from '../../../seeds/factories/people';
import type { Role } from '../../../server/auth/roles';
import { type Config, loadConfig } from '../../../server/config';
import { createDb, type Db } from '../../../server/db/knex';
import { migrateLatest } from '../../../server/db/migrate';
import type { PersonRow } from '../../../server/db/people';
import { createApp } from '../../../server/http/app';
import { createLogger } from '../../../server/logger';
import { createMailer, type Mailer } from '../../../server/mail/mailer';
import { createQueues, type Queues } from '../../../worker/queues';
import { createRedisConnection } from '../../../worker/redis-connection';
import { startProcessors } from '../../../worker/start-processors';
import { apiTestDatabase, createPostgresSchema, TEST_DATABASE_URL } from '../../support/databases';

export const TEST_PASSWORD = 'a long test passphrase';

export interface TestApp {
  app: Express;
  db: Db;
  config: Config;
  dataDir: string;
  /** Embedded queues with the real processors running, when asked for. */
  queues: Queues | undefined;
  /** With queues: the mailer their mail jobs use, sending to a real local SMTP catcher. */
  mailer: Mailer | undefined;
}

export interface TestAppOptions {
  env?: Record<string, string>;
  /** Run the embedded queues and processors in the test process, as `npm start` does. */
  queues?: boolean;
}

// Test files call createTestApp inside beforeAll, where an afterAll registered would never run (vitest
// attaches hooks while collecting, not while running a hook); this module's own afterAll, registered
// when a test file imports it, removes each file's apps after the file.
const teardowns: (() => Promise<void>)[] = [];
afterAll(async () => {
  for (const teardown of teardowns.splice(0).reverse()) await teardown();
});

/**
 * A real app on a fresh database of its own, removed after the test file: a SQLite file in its own
 * temporary directory, or under the `api-postgres` project a PostgreSQL schema of its own, reached
 * through DATABASE_URL as a deployment reaches it.
 */
export async function createTestApp(options: TestAppOptions = {}): Promise<TestApp> {
  let db: Db | undefined;
  let queues: Queues | undefined;
  let mailer: Mailer | undefined;
  let dropSchema: (() => Promise<void>) | undefined;
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'dipdeck-api-'));
  // Kept first, so that an app that fails to start leaves no schema or directory behind either.
  teardowns.push(async () => {
    await queues?.close();
    await mailer?.close();
    await db?.destroy();
    await dropSchema?.();
    fs.rmSync(dataDir, { recursive: true, force: true });
  });
  let databaseUrl: string | undefined;
  if (apiTestDatabase === 'postgres' && TEST_DATABASE_URL && !options.env?.DATABASE_URL) {
    ({ databaseUrl, dropSchema } = await createPostgresSchema(TEST_DATABASE_URL));
  }
  const config = loadConfig({
    NODE_ENV: 'test',
    DATA_DIR: dataDir,
    DIPDECK_DEMO: '0',
    DATABASE_URL: databaseUrl,
    ...options.env,
  });
  db = createDb(config);
  await migrateLatest(db);
  if (options.queues) {
    const logger = createLogger(config);
    queues = createQueues(createRedisConnection({ redisUrl: undefined }, `api-${randomUUID()}`));
    mailer = await createMailer(config, db, logger);
    await startProcessors(queues, { config, db, logger, queues, mailer });
  }
  const { app } = createApp({ config, db, queues });
  return { app, db, config, dataDir, queues, mailer };
}

export type Agent = ReturnType<typeof request.agent>;

/** A cookie-keeping client that sends the session's CSRF token on every request, like the web client. */
export class Browser {
  readonly agent: Agent;
  private token: string | undefined;

  constructor(app: Express) {
    this.agent = request.agent(app);
  }

  async csrf(): Promise<string> {
    this.token ??= (await this.agent.get('/api/auth/csrf').expect(200)).body.token as string;
    return this.token;
  }

  /** After sign-in, sign-up and sign-out the session is new, and so is its token. */
  forgetCsrf(): void {
    this.token = undefined;
  }

  get(url: string) {
    return this.agent.get(url);
  }

  // The token is fetched before the request is made: the agent attaches its cookies at creation.
  async post(url: string, body?: object) {
    const token = await this.csrf();
    const call = this.agent.post(url).set('X-CSRF-Token', token);
    return body === undefined ? call : call.send(body);
  }

  async patch(url: string, body: object) {
    const token = await this.csrf();
    return this.agent.patch(url).set('X-CSRF-Token', token).send(body);
  }

  async delete(url: string, body?: object) {
    const token = await this.csrf();
    const call = this.agent.delete(url).set('X-CSRF-Token', token);
    return body === undefined ? call : call.send(body);
  }

  async signIn(email: string, password = TEST_PASSWORD) {
    const response = await this.post('/api/auth/sign-in', { email, password });
    this.forgetCsrf();
    return response;
  }
}

export async function personWithRole(
  db: Db,
  role: Role,
  overrides: { email?: string } = {},
): Promise<PersonRow> {
  return createPerson(db, { role, password: TEST_PASSWORD, reuseHash: true, ...overrides });
}

/** A browser already signed in as a new person with this role. */
export async function signedIn(test: TestApp, role: Role): Promise<{ browser: Browser; person: PersonRow }> {
  const person = await personWithRole(test.db, role);
  const browser = new Browser(test.app);
  await browser.signIn(person.email!).then((response) => {
    if (response.status !== 200) throw new Error(`sign-in failed: ${response.status} ${response.text}`);
  });
  return { browser, person };
}

export function sessionCookie(response: request.Response): string | undefined {
  const cookies = ([] as string[]).concat(response.headers['set-cookie'] ?? []);
  return cookies.find((cookie) => cookie.startsWith('dipdeck.sid='))?.split(';')[0];
}

/** Runs `check` with the clock moved on by `ms` (and a little), as if that much time had passed. */
export async function afterMs(ms: number, check: () => Promise<void>): Promise<void> {
  vi.useFakeTimers({ toFake: ['Date'] });
  vi.setSystemTime(Date.now() + ms + 1);
  try {
    await check();
  } finally {
    vi.useRealTimers();
  }
}
