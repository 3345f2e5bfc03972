// Worker processes killed with SIGKILL in the middle of real jobs, then a new worker started: each
// snippet is made once and the consensus is the one an uninterrupted run reaches. And a worker whose
// database stays locked past its busy timeout fails the job, which is retried, and keeps running.
// Real processes (`tsx worker/index.ts`) on real Redis; each is stopped at an exact SQL statement by
// tests/worker/support/halt-at-statement.ts and killed there, not after a sleep.
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type Bull from 'bull';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createCampaign } from '../../seeds/factories/campaigns';
import { createPerson } from '../../seeds/factories/people';
import { markCampaignForRescore } from '../../server/db/consensus';
import { createDb, type Db } from '../../server/db/knex';
import { migrateLatest } from '../../server/db/migrate';
import { RESCORE_BATCH, rescoreDirtySnippets } from '../../server/services/consensus/rescore-snippets';
import { processUpload } from '../../server/services/uploads/process-upload';
import { createQueues, enqueue, type Queues } from '../../worker/queues';
import { createRedisConnection } from '../../worker/redis-connection';
import { eventually } from '../support/eventually';
import { holdSqliteWriteLock } from '../support/sqlite-write-lock';
import { TEST_REDIS_URL } from './support/backends';
import {
  CONSENSUS_SNIPPETS,
  consensusSignature,
  ingestedSignature,
  seedVerdicts,
  uploadInNewCampaign,
} from './support/job-fixtures';
import { killWorkers, startWorker, type WorkerProcess } from './support/worker-processes';

const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'dipdeck-faults-'));
const sqliteFile = path.join(dataDir, 'dipdeck.sqlite');
const run = `faults-${randomUUID().slice(0, 8)}`;
const opened: Queues[] = [];

/** The queues under a prefix of this run's own, as the server sees them: it only enqueues. */
function queuesFor(name: string): { prefix: string; queues: Queues } {
  const prefix = `${run}-${name}`;
  const queues = createQueues(createRedisConnection({ redisUrl: TEST_REDIS_URL }), { prefix });
  opened.push(queues);
  return { prefix, queues };
}

async function jobDone(queue: Bull.Queue, id: string): Promise<Bull.Job> {
  let job: Bull.Job | null = null;
  await eventually(async () => {
    job = await queue.getJob(id);
    return Boolean(job?.finishedOn);
  }, `job ${queue.name}:${id} finishes`);
  return job!;
}

const dirtyCount = async (db: Db, campaignId: number) =>
  Number(
    (await db('snippets').where({ campaign_id: campaignId, needs_rescore: true }).count({ n: '*' }))[0]!.n,
  );

const upload = (db: Db, id: number) => db('uploads').where({ id }).first('status', 'stage', 'snippet_count');

describe.runIf(TEST_REDIS_URL)('worker processes killed in the middle of a job', () => {
  let db: Db;
  afterAll(async () => {
    killWorkers();
    for (const queues of opened) {
      await Promise.all(queues.all().map((queue) => queue.obliterate({ force: true }).catch(() => {})));
      await queues.close();
    }
    await db?.destroy();
    fs.rmSync(dataDir, { recursive: true, force: true });
  });

  let scientist: number;
  let volunteers: number[];
  beforeAll(async () => {
    db = createDb({ databaseUrl: undefined, sqliteFile });
    await migrateLatest(db);
    scientist = (await createPerson(db, { role: 'scientist', reuseHash: true })).id;
    volunteers = [];
    for (let i = 0; i < 8; i += 1) volunteers.push((await createPerson(db, { reuseHash: true })).id);
  });

  it('after a new worker takes the work up, each snippet exists once and the consensus equals an uninterrupted run', async () => {
    // The uninterrupted runs, in this process, on the same data.
    const reference = await uploadInNewCampaign(db, scientist);
    expect(await processUpload(db, reference.uploadId, async () => {})).toBe('done');
    const ingested = await ingestedSignature(db, reference.campaignId);
    const consensusReference = await createCampaign(db, { status: 'live' });
    await seedVerdicts(db, consensusReference, volunteers);
    await markCampaignForRescore(db, consensusReference);
    await rescoreDirtySnippets(db, consensusReference);
    const consensus = await consensusSignature(db, consensusReference);
    expect(consensus.dips.length).toBeGreaterThan(10);
    expect(new Set(consensus.snippets.map((snippet) => snippet.state))).toEqual(
      new Set(['open', 'settled', 'split']),
    );

    const inTransaction = await uploadInNewCampaign(db, scientist);
    const afterCommit = await uploadInNewCampaign(db, scientist);
    const rescored = await createCampaign(db, { status: 'live' });
    await seedVerdicts(db, rescored, volunteers);

    // Three doomed workers, each on queues of its own, each stopping at its own statement.
    const doomed = {
      // Inside the ingestion's one transaction: the light curve and four snippets written, not committed.
      inTransaction: { ...queuesFor('in-transaction'), halt: { sql: '^insert into `snippets`', at: 5 } },
      // After that transaction committed, before the upload is marked done (its 8th update: 7 stages, then done).
      afterCommit: { ...queuesFor('after-commit'), halt: { sql: '^update `uploads`', at: 8 } },
      // Half-way through the second batch of the rescore: the first batch committed, the second open.
      rescore: {
        ...queuesFor('rescore'),
        halt: { sql: '^update `snippets` set `consensus_score`', at: RESCORE_BATCH * 1.5 },
      },
    };
    const workers: Record<keyof typeof doomed, WorkerProcess> = {
      inTransaction: startWorker({
        dataDir,
        halt: doomed.inTransaction.halt,
        env: { REDIS_URL: TEST_REDIS_URL!, QUEUE_PREFIX: doomed.inTransaction.prefix },
      }),
      afterCommit: startWorker({
        dataDir,
        halt: doomed.afterCommit.halt,
        env: { REDIS_URL: TEST_REDIS_URL!, QUEUE_PREFIX: doomed.afterCommit.prefix },
      }),
      rescore: startWorker({
        dataDir,
        halt: doomed.rescore.halt,
        env: { REDIS_URL: TEST_REDIS_URL!, QUEUE_PREFIX: doomed.rescore.prefix },
      }),
    };
    // All started before any job: a worker halted in its transaction holds SQLite's write lock.
    await Promise.all(Object.values(workers).map((worker) => worker.ready()));

    await enqueue(doomed.inTransaction.queues, 'ingest', 'upload', { uploadId: inTransaction.uploadId });
    expect(await workers.inTransaction.halted()).toMatch(/^HALTED insert into `snippets`/);
    workers.inTransaction.child.kill('SIGKILL');
    expect(await workers.inTransaction.exited()).toBe('SIGKILL');
    expect(await ingestedSignature(db, inTransaction.campaignId)).toEqual({ lightCurves: 0, snippets: [] });
    expect(await upload(db, inTransaction.uploadId)).toMatchObject({ status: 'processing', stage: 'saving' });

    await enqueue(doomed.afterCommit.queues, 'ingest', 'upload', { uploadId: afterCommit.uploadId });
    await workers.afterCommit.halted();
    workers.afterCommit.child.kill('SIGKILL');
    expect(await workers.afterCommit.exited()).toBe('SIGKILL');
    expect(await ingestedSignature(db, afterCommit.campaignId)).toEqual(ingested);
    expect(await upload(db, afterCommit.uploadId)).toMatchObject({ status: 'processing', stage: 'done' });

    await markCampaignForRescore(db, rescored);
    const total = CONSENSUS_SNIPPETS.real + CONSENSUS_SNIPPETS.planted + CONSENSUS_SNIPPETS.quiet;
    expect(await dirtyCount(db, rescored)).toBe(total);
    await enqueue(doomed.rescore.queues, 'consensus', 'rescore', { campaignId: rescored });
    await workers.rescore.halted();
    workers.rescore.child.kill('SIGKILL');
    expect(await workers.rescore.exited()).toBe('SIGKILL');
    // The first batch stays done; the second, cut short, left nothing.
    expect(await dirtyCount(db, rescored)).toBe(total - RESCORE_BATCH);

    // A new worker. Bull would hand it the killed jobs once their locks lapse (tests/worker/ingest.test.ts
    // shows that in-process); here it gets the same jobs afresh, which is what it would run.
    const rescue = queuesFor('rescue');
    const rescuer = startWorker({
      dataDir,
      env: { REDIS_URL: TEST_REDIS_URL!, QUEUE_PREFIX: rescue.prefix, SQLITE_BUSY_TIMEOUT_MS: '100' },
    });
    await rescuer.ready();
    const refs = [
      await enqueue(rescue.queues, 'ingest', 'upload', { uploadId: inTransaction.uploadId }),
      await enqueue(rescue.queues, 'ingest', 'upload', { uploadId: afterCommit.uploadId }),
    ];
    const rescoreRef = await enqueue(rescue.queues, 'consensus', 'rescore', { campaignId: rescored });
    for (const ref of refs) {
      const job = await jobDone(rescue.queues.byKey.ingest, ref.slice(ref.indexOf(':') + 1));
      expect(job.returnvalue, rescuer.output().slice(-3_000)).toEqual({ outcome: 'done' });
    }
    const rescoreJob = await jobDone(
      rescue.queues.byKey.consensus,
      rescoreRef.slice(rescoreRef.indexOf(':') + 1),
    );
    expect(rescoreJob.returnvalue.rescored).toBe(total - RESCORE_BATCH);

    for (const { campaignId, uploadId } of [inTransaction, afterCommit]) {
      expect(await ingestedSignature(db, campaignId)).toEqual(ingested);
      expect(await upload(db, uploadId)).toEqual({
        status: 'done',
        stage: 'done',
        snippet_count: ingested.snippets.length,
      });
    }
    expect(await consensusSignature(db, rescored)).toEqual(consensus);

    // The same worker, its database locked by another connection past its busy timeout (100 ms): the
    // job fails and is retried, and the process goes on.
    const locked = await uploadInNewCampaign(db, scientist);
    const holder = holdSqliteWriteLock(sqliteFile);
    try {
      const ref = await enqueue(rescue.queues, 'ingest', 'upload', { uploadId: locked.uploadId });
      const id = ref.slice(ref.indexOf(':') + 1);
      let failed: Bull.Job | null = null;
      await eventually(async () => {
        failed = await rescue.queues.byKey.ingest.getJob(id);
        return (failed?.attemptsMade ?? 0) >= 1;
      }, 'the job fails against the locked database');
      expect(failed!.failedReason).toMatch(/database is locked/);
      expect(await failed!.getState()).toBe('delayed');
      holder.release();
      const retried = await jobDone(rescue.queues.byKey.ingest, id);
      expect(retried.returnvalue).toEqual({ outcome: 'done' });
      expect(retried.attemptsMade).toBe(1);
    } finally {
      holder.release();
    }
    expect(await ingestedSignature(db, locked.campaignId)).toEqual(ingested);
    expect(rescuer.child.exitCode).toBeNull();
    rescuer.child.kill('SIGTERM');
    expect(await rescuer.exited()).toBe(0);
  }, 90_000);
});
