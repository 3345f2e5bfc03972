// `npm run worker` as a separate process on real Redis: the server only enqueues, workers take the jobs.
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type Bull from 'bull';
import { afterAll, describe, expect, it } from 'vitest';
import { createCampaign } from '../../seeds/factories/campaigns';
import { createPerson } from '../../seeds/factories/people';
import { markCampaignForRescore } from '../../server/db/consensus';
import { createDb, type Db } from '../../server/db/knex';
import { migrateLatest } from '../../server/db/migrate';
import { rescoreDirtySnippets } from '../../server/services/consensus/rescore-snippets';
import { processUpload } from '../../server/services/uploads/process-upload';
import { createQueues, enqueue, parseJobRef, type Queues } from '../../worker/queues';
import { createRedisConnection } from '../../worker/redis-connection';
import { eventually } from '../support/eventually';
import { holdSqliteWriteLock } from '../support/sqlite-write-lock';
import { TEST_REDIS_URL } from './support/backends';
import {
  consensusSignature,
  ingestedSignature,
  seedVerdicts,
  uploadInNewCampaign,
} from './support/job-fixtures';
import { killWorkers, startWorker } from './support/worker-processes';

const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'dipdeck-worker-'));
afterAll(() => {
  killWorkers();
  fs.rmSync(dataDir, { recursive: true, force: true });
});

describe('npm run worker', () => {
  it('refuses to start without REDIS_URL, and says why', async () => {
    const worker = startWorker({ dataDir, env: { REDIS_URL: '' } });
    expect(await worker.exited()).toBe(1);
    expect(worker.output()).toMatch(/needs REDIS_URL/);
  });

  describe.runIf(TEST_REDIS_URL)('on real Redis', () => {
    let db: Db;
    let queues: Queues;
    // Queues of this run's own: no other test's or developer's worker takes these jobs.
    const prefix = `workers-${randomUUID().slice(0, 8)}`;
    afterAll(async () => {
      await Promise.all(
        queues?.all().map((queue) => queue.obliterate({ force: true }).catch(() => {})) ?? [],
      );
      await queues?.close();
      await db?.destroy();
    });

    it('two worker processes share real ingest and consensus jobs: each job runs once, on one of them, with the results of one run, and SIGTERM stops both cleanly', async () => {
      const sqliteFile = path.join(dataDir, 'dipdeck.sqlite');
      db = createDb({ databaseUrl: undefined, sqliteFile });
      await migrateLatest(db);
      const scientist = (await createPerson(db, { role: 'scientist', reuseHash: true })).id;
      const volunteers: number[] = [];
      for (let i = 0; i < 8; i += 1) volunteers.push((await createPerson(db, { reuseHash: true })).id);

      // What one run gives, in this process.
      const reference = await uploadInNewCampaign(db, scientist);
      await processUpload(db, reference.uploadId, async () => {});
      const ingested = await ingestedSignature(db, reference.campaignId);
      const consensusReference = await createCampaign(db, { status: 'live' });
      await seedVerdicts(db, consensusReference, volunteers);
      await markCampaignForRescore(db, consensusReference);
      await rescoreDirtySnippets(db, consensusReference);
      const consensus = await consensusSignature(db, consensusReference);

      const uploads = [];
      for (let i = 0; i < 4; i += 1) uploads.push(await uploadInNewCampaign(db, scientist));
      const rescored: number[] = [];
      for (let i = 0; i < 3; i += 1) {
        const campaignId = await createCampaign(db, { status: 'live' });
        await seedVerdicts(db, campaignId, volunteers);
        await markCampaignForRescore(db, campaignId);
        rescored.push(campaignId);
      }

      // A long busy timeout: a worker whose first write meets the test's lock waits for it.
      const env = { REDIS_URL: TEST_REDIS_URL!, QUEUE_PREFIX: prefix, SQLITE_BUSY_TIMEOUT_MS: '30000' };
      const workers = [startWorker({ dataDir, env }), startWorker({ dataDir, env })];
      await Promise.all(workers.map((worker) => worker.ready()));
      // This process plays the server: it only enqueues.
      queues = createQueues(createRedisConnection({ redisUrl: TEST_REDIS_URL }), { prefix });

      // Held write lock: each worker takes one ingest job (their concurrency is 1) and waits on the
      // lock, so two active ingest jobs are on two different processes.
      const holder = holdSqliteWriteLock(sqliteFile);
      const refs: string[] = [];
      try {
        for (const { uploadId } of uploads)
          refs.push(await enqueue(queues, 'ingest', 'upload', { uploadId }));
        await eventually(
          async () => (await queues.byKey.ingest.getActiveCount()) === 2,
          'both workers take an ingest job',
        );
      } finally {
        holder.release();
      }
      for (const campaignId of rescored)
        refs.push(await enqueue(queues, 'consensus', 'rescore', { campaignId }));

      // Poll the jobs' own records (pub/sub events could be missed before the subscription is up).
      const jobs: Bull.Job[] = [];
      for (const ref of refs) {
        const { queueKey, id } = parseJobRef(ref)!;
        let job: Bull.Job | null = null;
        await eventually(async () => {
          job = await queues.byKey[queueKey].getJob(id);
          return Boolean(job?.finishedOn);
        }, `${ref} finishes`);
        jobs.push(job!);
      }
      expect(await Promise.all(jobs.map((job) => job.getState()))).toEqual(refs.map(() => 'completed'));
      // Run once each: no job needed a second attempt, and each was completed by exactly one process.
      expect(jobs.map((job) => job.attemptsMade)).toEqual(refs.map(() => 0));
      const completed = workers.map((worker) => worker.completedJobs().filter((ref) => refs.includes(ref)));
      expect([...completed[0]!, ...completed[1]!].sort()).toEqual([...refs].sort());
      expect(
        completed.every((list) => list.length > 0),
        JSON.stringify(completed),
      ).toBe(true);
      expect((await queues.byKey.ingest.getWorkers()).length).toBeGreaterThanOrEqual(2);

      for (const { campaignId } of uploads) expect(await ingestedSignature(db, campaignId)).toEqual(ingested);
      for (const campaignId of rescored) expect(await consensusSignature(db, campaignId)).toEqual(consensus);

      for (const worker of workers) worker.child.kill('SIGTERM');
      expect(await Promise.all(workers.map((worker) => worker.exited()))).toEqual([0, 0]);
    }, 90_000);
  });
});
