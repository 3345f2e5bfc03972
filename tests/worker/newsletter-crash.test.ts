// A worker process killed in the middle of a newsletter, and another started: nobody is mailed twice,
// everyone not in doubt is mailed once, and the one in doubt is reported. Real processes, real Redis,
// and a real SMTP server of the test's own that kills the worker at the worst moment: after receiving
// a message and before answering that it was accepted.
import { type ChildProcess, spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { SMTPServer } from 'smtp-server';
import { afterAll, describe, expect, it } from 'vitest';
import { createPerson } from '../../seeds/factories/people';
import { createDb, type Db } from '../../server/db/knex';
import { migrateLatest } from '../../server/db/migrate';
import { deliveryCounts, insertNewsletter, updateNewsletter } from '../../server/db/newsletters';
import { updatePerson } from '../../server/db/people';
import { createQueues, enqueue, type Queues } from '../../worker/queues';
import { createRedisConnection } from '../../worker/redis-connection';
import { eventually } from '../support/eventually';
import { TEST_REDIS_URL } from './support/backends';

const repo = path.resolve(import.meta.dirname, '../..');
const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'dipdeck-newsletter-crash-'));
const children: ChildProcess[] = [];
afterAll(() => {
  for (const child of children) if (child.exitCode === null) child.kill('SIGKILL');
  fs.rmSync(dataDir, { recursive: true, force: true });
});

function startWorker(env: Record<string, string>) {
  let output = '';
  const child = spawn(process.execPath, ['--import', 'tsx', 'worker/index.ts'], {
    cwd: repo,
    env: { ...process.env, NODE_ENV: 'test', DATA_DIR: dataDir, LOG_LEVEL: 'warn', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout!.on('data', (chunk) => {
    output += chunk;
  });
  child.stderr!.on('data', (chunk) => {
    output += chunk;
  });
  children.push(child);
  return { child, output: () => output };
}

describe.runIf(TEST_REDIS_URL)('a newsletter when its worker is killed', () => {
  let db: Db;
  let queues: Queues;
  let smtp: SMTPServer;
  afterAll(async () => {
    await queues?.byKey.mail.obliterate({ force: true }).catch(() => {});
    await queues?.close();
    await new Promise<void>((resolve) => (smtp ? smtp.close(() => resolve()) : resolve()));
    await db?.destroy();
  });

  it('mails nobody twice and everyone not in doubt once after a restart', async () => {
    db = createDb({ databaseUrl: undefined, sqliteFile: path.join(dataDir, 'dipdeck.sqlite') });
    await migrateLatest(db);
    const people = [];
    for (let i = 0; i < 6; i += 1) people.push(await createPerson(db, { reuseHash: true }));
    for (const person of people) await updatePerson(db, person.id, { newsletterOptIn: true });
    const newsletter = await insertNewsletter(db, {
      authorId: people[0]!.id,
      headline: 'Crash test',
      bodyMarkdown: 'Hello {{displayName}}',
      audience: { kind: 'opted-in' },
      allowRemoteImages: false,
    });
    await updateNewsletter(db, newsletter.id, { status: 'sending' });

    // The test's SMTP server: it records each recipient, and on the 3rd message kills the worker
    // before answering, so the worker can never learn that the message arrived.
    const received: string[] = [];
    let victim: ChildProcess | undefined;
    smtp = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS'],
      logger: false,
      onData(stream, session, callback) {
        stream.on('data', () => {});
        stream.on('end', () => {
          received.push(...session.envelope.rcptTo.map((rcpt) => rcpt.address));
          if (received.length === 3 && victim) {
            victim.kill('SIGKILL');
            return;
          }
          callback();
        });
      },
    });
    await new Promise<void>((resolve) => smtp.listen(0, '127.0.0.1', () => resolve()));
    const port = (smtp.server.address() as { port: number }).port;
    // A prefix of its own, so that no other test's workers take these jobs.
    const prefix = `crash-${process.pid}-${Date.now()}`;
    const env = {
      REDIS_URL: TEST_REDIS_URL!,
      QUEUE_PREFIX: prefix,
      SMTP_URL: `smtp://127.0.0.1:${port}`,
      MAIL_RATE_PER_S: '50',
    };

    queues = createQueues(createRedisConnection({ redisUrl: TEST_REDIS_URL }), { prefix });
    await queues.byKey.mail.obliterate({ force: true });
    const first = startWorker(env);
    victim = first.child;
    await enqueue(
      queues,
      'mail',
      'newsletter',
      { newsletterId: newsletter.id },
      { jobId: `crash-${newsletter.id}-1` },
    );
    await eventually(
      async () => first.child.exitCode !== null || first.child.signalCode !== null,
      'the worker is killed',
    );
    expect(received).toHaveLength(3);
    expect((await deliveryCounts(db, newsletter.id)).claimed).toBe(1);

    // Restarted: a new worker carries the newsletter on (here from a fresh job, as Bull would hand the
    // stalled one over after its lock lapses).
    const second = startWorker(env);
    await enqueue(
      queues,
      'mail',
      'newsletter',
      { newsletterId: newsletter.id },
      { jobId: `crash-${newsletter.id}-2` },
    );
    await eventually(
      async () => (await db('newsletters').where({ id: newsletter.id }).first('status')).status === 'sent',
      `the newsletter is sent (${second.output()})`,
    );
    const counts = await deliveryCounts(db, newsletter.id);
    expect(counts).toEqual({ claimed: 0, sent: 5, failed: 0, skipped: 0, unknown: 1 });
    for (const person of people) {
      expect(received.filter((address) => address === person.email).length, person.email!).toBe(1);
    }
    const doubt = await db('deliveries')
      .where({ newsletter_id: newsletter.id, status: 'unknown' })
      .first('person_id');
    expect(received[2]).toBe(people.find((person) => person.id === Number(doubt.person_id))!.email);
    second.child.kill('SIGTERM');
  }, 60_000);
});
