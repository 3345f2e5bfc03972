import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createCampaign } from '../../seeds/factories/campaigns';
import { loadConfig } from '../../server/config';
import { createDb } from '../../server/db/knex';
import { migrateLatest } from '../../server/db/migrate';
import { upsertTarget } from '../../server/db/targets';
import { insertUpload } from '../../server/db/uploads';
import { createLogger } from '../../server/logger';
import { createQueues, enqueue, type Queues } from '../../worker/queues';
import { createRedisConnection } from '../../worker/redis-connection';
import { startProcessors } from '../../worker/start-processors';

const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'dipdeck-housekeeping-'));
const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir });
const db = createDb(config);
let queues: Queues;

beforeAll(async () => {
  await migrateLatest(db);
  queues = createQueues(createRedisConnection({ redisUrl: undefined }, 'housekeeping-test'));
  await startProcessors(queues, { config, db, logger: createLogger(config), queues });
});
afterAll(async () => {
  await queues.close();
  await db.destroy();
  fs.rmSync(dataDir, { recursive: true, force: true });
});

async function runSweep(): Promise<unknown> {
  const ref = await enqueue(queues, 'housekeeping', 'sweep', {});
  const job = (await queues.byKey.housekeeping.getJob(ref.split(':')[1]!))!;
  return job.finished();
}

describe('the housekeeping sweep, through the queue', () => {
  it('deletes expired sessions, keeps live ones, and changes nothing when run again', async () => {
    const past = new Date(Date.now() - 60_000).toISOString();
    const future = new Date(Date.now() + 3_600_000).toISOString();
    await db('sessions').insert([
      { sid: 'expired', sess: '{}', expired: past },
      { sid: 'live', sess: '{}', expired: future },
    ]);
    expect(await runSweep()).toEqual({ expiredSessionsDeleted: 1, uploadsRequeued: 0 });
    expect(await db('sessions').pluck('sid')).toEqual(['live']);
    expect(await runSweep()).toEqual({ expiredSessionsDeleted: 0, uploadsRequeued: 0 });
    expect(await db('sessions').pluck('sid')).toEqual(['live']);
  });

  it('re-queues an upload whose job went missing, and the upload then completes', async () => {
    const campaignId = await createCampaign(db, { status: 'live' });
    await upsertTarget(db, campaignId, {
      designation: 'DPD-0417-3021',
      raDeg: null,
      decDeg: null,
      magnitude: null,
      stellarRadiusRsun: 1,
      stellarMassMsun: 1,
      teffK: 5800,
      assumedFields: [],
    });
    const fixture = path.resolve(import.meta.dirname, '../fixtures/reference/hot-jupiter.fits');
    const { upload } = await insertUpload(db, {
      campaignId,
      uploadedBy: null,
      contentHash: 'lost-job',
      originalName: 'hot-jupiter.fits',
      format: 'fits',
      sizeBytes: fs.statSync(fixture).size,
      storagePath: fixture,
      targetHint: null,
      isQuietReference: false,
    });
    // Queued an hour ago and never enqueued: as if Redis had lost the job.
    await db('uploads')
      .where({ id: upload.id })
      .update({ updated_at: new Date(Date.now() - 3_600_000).toISOString() });
    expect(await runSweep()).toEqual({ expiredSessionsDeleted: 0, uploadsRequeued: 1 });
    for (
      let i = 0;
      i < 200 && (await db('uploads').where({ id: upload.id }).first()).status !== 'done';
      i += 1
    ) {
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    expect((await db('uploads').where({ id: upload.id }).first()).status).toBe('done');
    expect(await runSweep()).toEqual({ expiredSessionsDeleted: 0, uploadsRequeued: 0 });
  });

  it('is scheduled as a repeatable job when the processors start', async () => {
    const repeatable = await queues.byKey.housekeeping.getRepeatableJobs();
    expect(repeatable.map((job) => job.name)).toEqual(['sweep']);
  });
});
