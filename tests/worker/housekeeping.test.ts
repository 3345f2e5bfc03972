import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/config';
import { createDb } from '../../server/db/knex';
import { migrateLatest } from '../../server/db/migrate';
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

  it('is scheduled as a repeatable job when the processors start', async () => {
    const repeatable = await queues.byKey.housekeeping.getRepeatableJobs();
    expect(repeatable.map((job) => job.name)).toEqual(['sweep']);
  });
});
