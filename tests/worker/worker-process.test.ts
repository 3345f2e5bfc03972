// `npm run worker` as a separate process on real Redis: the server only enqueues, workers take the jobs.
import { type ChildProcess, spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { createQueues, enqueue, type Queues } from '../../worker/queues';
import { createRedisConnection } from '../../worker/redis-connection';
import { TEST_REDIS_URL } from './support/backends';

const repo = path.resolve(import.meta.dirname, '../..');
const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'dipdeck-worker-'));
const children: ChildProcess[] = [];
afterAll(() => {
  for (const child of children) if (child.exitCode === null) child.kill('SIGKILL');
  fs.rmSync(dataDir, { recursive: true, force: true });
});

function startWorker(env: Record<string, string>): { child: ChildProcess; output: () => string } {
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

const exited = (child: ChildProcess) =>
  new Promise<number | null>((resolve) => {
    if (child.exitCode !== null) resolve(child.exitCode);
    else child.once('exit', (code) => resolve(code));
  });

async function ready(worker: { output: () => string }, ms = 20_000): Promise<void> {
  const deadline = Date.now() + ms;
  while (!worker.output().includes('is taking jobs')) {
    if (Date.now() > deadline) throw new Error(`worker did not start: ${worker.output()}`);
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

describe('npm run worker', () => {
  it('refuses to start without REDIS_URL, and says why', async () => {
    const worker = startWorker({ REDIS_URL: '' });
    expect(await exited(worker.child)).toBe(1);
    expect(worker.output()).toMatch(/needs REDIS_URL/);
  });

  describe.runIf(TEST_REDIS_URL)('on real Redis', () => {
    let queues: Queues;
    afterAll(async () => {
      await queues?.byKey.housekeeping.obliterate({ force: true }).catch(() => {});
      await queues?.close();
    });

    it('two worker processes share the jobs, each job runs once, and SIGTERM stops them cleanly', async () => {
      const workers = [
        startWorker({ REDIS_URL: TEST_REDIS_URL! }),
        startWorker({ REDIS_URL: TEST_REDIS_URL! }),
      ];
      await Promise.all(workers.map((worker) => ready(worker)));
      // This process plays the server: it only enqueues.
      queues = createQueues(createRedisConnection({ redisUrl: TEST_REDIS_URL }));
      const housekeeping = queues.byKey.housekeeping;
      await housekeeping.isReady();
      const refs = await Promise.all(
        Array.from({ length: 30 }, () => enqueue(queues, 'housekeeping', 'sweep', {})),
      );
      // Poll the jobs' own records (pub/sub events could be missed before the subscription is up).
      const ids = refs.map((ref) => ref.slice(ref.indexOf(':') + 1));
      const deadline = Date.now() + 30_000;
      let jobs = await Promise.all(ids.map((id) => housekeeping.getJob(id)));
      while (jobs.some((job) => !job?.finishedOn) && Date.now() < deadline) {
        await new Promise((resolve) => setTimeout(resolve, 100));
        jobs = await Promise.all(ids.map((id) => housekeeping.getJob(id)));
      }
      const states = await Promise.all(jobs.map((job) => job?.getState()));
      expect(states.every((state) => state === 'completed')).toBe(true);
      // Run once each: no job needed a second attempt or was taken over as stalled.
      expect(jobs.every((job) => job?.attemptsMade === 0 && job.returnvalue !== undefined)).toBe(true);
      // Both processes took part: each worker names its blocking connection, and both were listed.
      const workersSeen = await housekeeping.getWorkers();
      expect(workersSeen.length).toBeGreaterThanOrEqual(2);

      for (const worker of workers) worker.child.kill('SIGTERM');
      expect(await Promise.all(workers.map((worker) => exited(worker.child)))).toEqual([0, 0]);
    });
  });
});
