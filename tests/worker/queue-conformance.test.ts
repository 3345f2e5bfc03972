// One conformance suite for the queues, run on both backends: the embedded store (ioredis-mock through
// worker/embedded-redis.ts) and a real Debian redis-server (TEST_REDIS_URL, started by .ci/run).
import { type ChildProcess, spawn } from 'node:child_process';
import path from 'node:path';
import type Bull from 'bull';
import { afterAll, afterEach, describe, expect, it } from 'vitest';
import { type Backend, backends, sleep, waitForEvents } from './support/backends';

const all = backends();
afterAll(async () => {
  for (const backend of all) await backend.close();
});

describe.each(all)('queues on $name', (backend: Backend) => {
  afterEach(() => backend.closeQueues());

  it('adds and processes jobs and keeps each result', async () => {
    const queue = backend.queue('basic');
    const done = waitForEvents<[Bull.Job, unknown]>(queue, 'completed', 5);
    void queue.process(async (job) => ({ doubled: job.data.x * 2 }));
    const jobs = await Promise.all([1, 2, 3, 4, 5].map((x) => queue.add({ x }, { removeOnComplete: false })));
    const results = (await done).map(([, result]) => result);
    expect(results).toEqual(expect.arrayContaining([2, 4, 6, 8, 10].map((doubled) => ({ doubled }))));
    const stored = await queue.getJob(jobs[2]!.id);
    expect(stored?.returnvalue).toEqual({ doubled: 6 });
    expect(await stored?.getState()).toBe('completed');
  });

  it('runs up to the given concurrency at once', async () => {
    const queue = backend.queue('concurrency');
    let inFlight = 0;
    let mostInFlight = 0;
    const done = waitForEvents(queue, 'completed', 8);
    void queue.process(4, async () => {
      inFlight += 1;
      mostInFlight = Math.max(mostInFlight, inFlight);
      await sleep(150);
      inFlight -= 1;
    });
    await queue.addBulk(Array.from({ length: 8 }, (_, i) => ({ data: { i } })));
    await done;
    expect(mostInFlight).toBe(4);
  });

  it('retries with exponential backoff: a job that fails twice succeeds on its third attempt', async () => {
    const queue = backend.queue('retry');
    const calls: number[] = [];
    void queue.process(async () => {
      calls.push(Date.now());
      if (calls.length < 3) throw new Error(`failure ${calls.length}`);
      return 'ok';
    });
    const completed = waitForEvents<[Bull.Job, unknown]>(queue, 'completed');
    const job = await queue.add({}, { attempts: 3, backoff: { type: 'exponential', delay: 100 } });
    const [[finished, result]] = (await completed) as [[Bull.Job, unknown]];
    expect(finished.id).toBe(job.id);
    expect(result).toBe('ok');
    expect(calls).toHaveLength(3);
    // Exponential: about 100 ms before the second attempt, 200 ms before the third.
    expect(calls[1]! - calls[0]!).toBeGreaterThanOrEqual(90);
    expect(calls[2]! - calls[1]!).toBeGreaterThanOrEqual(190);
  });

  it('a job that always fails ends failed with its error, and can be retried', async () => {
    const queue = backend.queue('always-fails');
    let healed = false;
    void queue.process(async () => {
      if (!healed) throw new Error('the star is behind the Sun');
      return 'recovered';
    });
    const failures = waitForEvents<[Bull.Job, Error]>(queue, 'failed', 2);
    const job = await queue.add({}, { attempts: 2, backoff: 10 });
    await failures;
    await sleep(50);
    const stored = (await queue.getJob(job.id))!;
    expect(await stored.getState()).toBe('failed');
    expect(stored.failedReason).toBe('the star is behind the Sun');
    expect(stored.attemptsMade).toBe(2);
    expect(stored.stacktrace.length).toBeGreaterThan(0);
    expect((await queue.getJobCounts()).failed).toBe(1);
    expect((await queue.getFailed()).map((failed) => failed.id)).toEqual([job.id]);

    healed = true;
    const completed = waitForEvents<[Bull.Job, unknown]>(queue, 'completed');
    await stored.retry();
    const [[again, result]] = (await completed) as [[Bull.Job, unknown]];
    expect(again.id).toBe(job.id);
    expect(result).toBe('recovered');
  });

  it('progress, as a percentage and a stage, is readable while the job runs and after', async () => {
    const queue = backend.queue('progress');
    let midway: unknown;
    void queue.process(async (job) => {
      await job.progress({ percent: 50, stage: 'detrending' });
      midway = (await queue.getJob(job.id))?.progress();
      await job.progress({ percent: 100, stage: 'done' });
    });
    const completed = waitForEvents(queue, 'completed');
    const job = await queue.add({}, { removeOnComplete: false });
    await completed;
    expect(midway).toEqual({ percent: 50, stage: 'detrending' });
    expect((await queue.getJob(job.id))?.progress()).toEqual({ percent: 100, stage: 'done' });
  });

  it('a delayed job waits for its delay, then runs', async () => {
    const queue = backend.queue('delayed');
    let ranAt = 0;
    void queue.process(async () => {
      ranAt = Date.now();
    });
    const completed = waitForEvents(queue, 'completed');
    const addedAt = Date.now();
    const job = await queue.add({}, { delay: 400 });
    expect(await job.getState()).toBe('delayed');
    await completed;
    expect(ranAt - addedAt).toBeGreaterThanOrEqual(390);
  });

  it('a repeatable job fires again and again until it is removed', async () => {
    const queue = backend.queue('repeat');
    let runs = 0;
    void queue.process(async () => {
      runs += 1;
    });
    const fired = waitForEvents(queue, 'completed', 3, 8_000);
    await queue.add({}, { repeat: { every: 200 } });
    await fired;
    await queue.removeRepeatable({ every: 200 });
    expect(await queue.getRepeatableJobs()).toHaveLength(0);
    await sleep(150);
    const afterRemoval = runs;
    await sleep(600);
    expect(runs).toBe(afterRemoval);
    expect(runs).toBeGreaterThanOrEqual(3);
  });

  it('a job whose worker dies mid-run is picked up again and completes once', async () => {
    const settings = { lockDuration: 600, stalledInterval: 300, maxStalledCount: 1 };
    const name = 'stalled';
    let jobId: Bull.JobId;
    if (backend.name === 'embedded') {
      // One process holds the embedded store, so the "dead worker" is a queue that took the job and
      // was closed without finishing it: its lock is no longer renewed, as when a process dies.
      const doomed = backend.queue(name, { settings: { ...settings, stalledInterval: 0 } });
      const started = new Promise<void>((resolve) =>
        doomed.process(async () => {
          resolve();
          await new Promise(() => {});
        }),
      );
      jobId = (await doomed.add({ v: 1 })).id;
      await started;
      await doomed.close(true);
    } else {
      // Real Redis: a separate worker process, killed with SIGKILL while it runs the job.
      jobId = (await backend.queue(name).add({ v: 1 })).id;
      const child: ChildProcess = spawn(
        process.execPath,
        [
          '--import',
          'tsx',
          path.join(import.meta.dirname, 'support/stall-worker.ts'),
          backend.url!,
          backend.prefix,
          name,
          String(settings.lockDuration),
        ],
        { stdio: ['ignore', 'pipe', 'inherit'] },
      );
      await new Promise<void>((resolve, reject) => {
        child.stdout!.on('data', (chunk) => String(chunk).includes(`STARTED ${jobId}`) && resolve());
        child.once('exit', (code) => reject(new Error(`the stall worker exited early (${code})`)));
      });
      child.kill('SIGKILL');
      await new Promise((resolve) => child.once('exit', resolve));
    }

    const rescuer = backend.queue(name, { settings });
    let runs = 0;
    const stalled = waitForEvents<[Bull.Job]>(rescuer, 'stalled');
    const completed = waitForEvents<[Bull.Job, unknown]>(rescuer, 'completed');
    void rescuer.process(async (job) => {
      runs += 1;
      return `recovered ${job.data.v}`;
    });
    const [[stalledJob]] = (await stalled) as [[Bull.Job]];
    const [[job, result]] = (await completed) as [[Bull.Job, unknown]];
    expect(stalledJob.id).toBe(jobId);
    expect(job.id).toBe(jobId);
    expect(result).toBe('recovered 1');
    await sleep(1_000); // another stalled check must not run it again
    expect(runs).toBe(1);
  });

  it('removes completed jobs beyond the count it keeps', async () => {
    const queue = backend.queue('remove-on-complete');
    void queue.process(async () => 'x');
    const done = waitForEvents(queue, 'completed', 5);
    await Promise.all([1, 2, 3, 4, 5].map((a) => queue.add({ a }, { removeOnComplete: 2 })));
    await done;
    await sleep(50);
    expect((await queue.getJobCounts()).completed).toBe(2);
  });

  it('keeps non-ASCII data and long job ids intact through the scripts', async () => {
    const queue = backend.queue('unicode');
    const data = { text: 'Grüße ✓ 日本語 🌑', long: 'x'.repeat(70_000) };
    const jobId = `jöb-✓-${'é'.repeat(300)}`;
    void queue.process(async (job) => `${job.data.text}|${job.data.long.length}`);
    const done = waitForEvents<[Bull.Job, unknown]>(queue, 'completed');
    await queue.add(data, { jobId, removeOnComplete: false });
    const [[, result]] = (await done) as [[Bull.Job, unknown]];
    expect(result).toBe('Grüße ✓ 日本語 🌑|70000');
    expect((await queue.getJob(jobId))?.data).toEqual(data);
  });
});
