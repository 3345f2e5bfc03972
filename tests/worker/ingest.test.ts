// The ingest job: an upload becomes a light curve and its snippets exactly once, however often the job
// runs and wherever it is interrupted.
import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type Bull from 'bull';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPerson } from '../../seeds/factories/people';
import { loadConfig } from '../../server/config';
import { createDb } from '../../server/db/knex';
import { migrateLatest } from '../../server/db/migrate';
import { createLogger } from '../../server/logger';
import { processUpload } from '../../server/services/uploads/process-upload';
import { ingestProcessor } from '../../worker/processors/ingest';
import { createQueue, createQueues, type Queues } from '../../worker/queues';
import { createRedisConnection } from '../../worker/redis-connection';
import { waitForEvents } from './support/backends';
import { uploadInNewCampaign } from './support/job-fixtures';

const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'dipdeck-ingest-job-'));
const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir });
const db = createDb(config);
const connection = createRedisConnection({ redisUrl: undefined }, `ingest-${randomUUID()}`);
let queues: Queues;
let personId: number;

beforeAll(async () => {
  await migrateLatest(db);
  queues = createQueues(connection, { prefix: 'unused' });
  personId = (await createPerson(db, { role: 'scientist', reuseHash: true })).id;
});
afterAll(async () => {
  await queues.close();
  await db.destroy();
  fs.rmSync(dataDir, { recursive: true, force: true });
});

async function snippetSignature(campaignId: number): Promise<string[]> {
  const rows = await db('snippets')
    .where({ campaign_id: campaignId })
    .orderBy(['time_start', 'kind'])
    .select('kind', 'time_start');
  return rows.map((row) => `${row.kind}@${Number(row.time_start).toFixed(6)}`);
}

describe('the ingest job', () => {
  let expected: string[];

  it('turns an upload into its snippets, and a repeated run changes nothing', async () => {
    const { uploadId, campaignId } = await uploadInNewCampaign(db, personId);
    expect(await processUpload(db, uploadId, async () => {})).toBe('done');
    expected = await snippetSignature(campaignId);
    expect(expected.length).toBeGreaterThan(10);
    expect(await processUpload(db, uploadId, async () => {})).toBe('skipped');
    expect(await snippetSignature(campaignId)).toEqual(expected);
  });

  it('killed mid-way (its worker gone before the commit), is taken over as stalled and makes each snippet once', async () => {
    const { uploadId, campaignId } = await uploadInNewCampaign(db, personId);
    const prefix = `kill-${randomUUID().slice(0, 6)}`;
    const settings = { lockDuration: 500, stalledInterval: 250, maxStalledCount: 1 };
    // The doomed worker runs the real ingestion but never gets past "saving", like a process killed there.
    const doomed = createQueue(connection, 'ingest', {
      prefix,
      settings: { ...settings, stalledInterval: 0 },
    });
    const reachedSaving = new Promise<void>((resolve) => {
      void doomed.process('*', 1, async () =>
        processUpload(db, uploadId, async (_percent, stage) => {
          if (stage === 'saving') {
            resolve();
            await new Promise(() => {});
          }
        }),
      );
    });
    await doomed.add('upload', { uploadId }, { jobId: `upload-${uploadId}` });
    await reachedSaving;
    await doomed.close(true);
    expect(await db('snippets').where({ campaign_id: campaignId }).count({ n: '*' })).toEqual([{ n: 0 }]);

    const rescuer = createQueue(connection, 'ingest', { prefix, settings });
    const completed = waitForEvents<[Bull.Job, unknown]>(rescuer, 'completed', 1, 15_000);
    void rescuer.process('*', 1, ingestProcessor({ config, db, logger: createLogger(config), queues }));
    const [[, result]] = (await completed) as [[Bull.Job, unknown]];
    expect(result).toEqual({ outcome: 'done' });
    expect(await snippetSignature(campaignId)).toEqual(expected);
    expect(await db('uploads').where({ id: uploadId }).first()).toMatchObject({
      status: 'done',
      progress: 1,
    });
    await rescuer.close();
  });

  it('retried after an unexpected error, still makes each snippet once', async () => {
    const { uploadId, campaignId } = await uploadInNewCampaign(db, personId);
    const queue = createQueue(connection, 'ingest', { prefix: `retry-${randomUUID().slice(0, 6)}` });
    const real = ingestProcessor({ config, db, logger: createLogger(config), queues });
    let attempts = 0;
    void queue.process('*', 1, async (job: Bull.Job) => {
      attempts += 1;
      if (attempts === 1) {
        await processUpload(db, uploadId, async (_percent, stage) => {
          if (stage === 'saving') throw new Error('disk hiccup');
        });
      }
      return real(job);
    });
    const completed = waitForEvents(queue, 'completed', 1, 15_000);
    await queue.add('upload', { uploadId }, { attempts: 3, backoff: 50 });
    await completed;
    expect(attempts).toBe(2);
    expect(await snippetSignature(campaignId)).toEqual(expected);
    await queue.close();
  });
});
