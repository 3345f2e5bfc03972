import { type ChildProcess, spawn, spawnSync } from 'node:child_process';
import net from 'node:net';
import { performance } from 'node:perf_hooks';
import type Bull from 'bull';
import { createQueue } from '../../worker/queues';
import { createRedisConnection } from '../../worker/redis-connection';
import type { Figure } from './figures';

// Jobs per second to add and process 10,000 trivial jobs, on the embedded store and on a real Redis
// started here (Debian's redis-server, in memory, on loopback), side by side in one run.
const JOBS = 10_000;
const CHUNK = 500;
const RUNS = 3;

async function jobsPerSecond(redisUrl: string | undefined): Promise<number> {
  const connection = createRedisConnection({ redisUrl }, `bench-${Date.now()}`);
  const queue = createQueue(connection, 'bench', { prefix: `bench-${Date.now()}` });
  await queue.isReady();
  let done = 0;
  const finished = new Promise<void>((resolve, reject) => {
    queue.on('completed', () => {
      done += 1;
      if (done === JOBS) resolve();
    });
    queue.on('failed', (_job: Bull.Job, error: Error) => reject(error));
  });
  const start = performance.now();
  void queue.process(1, async () => 1);
  for (let i = 0; i < JOBS; i += CHUNK) {
    const jobs = Array.from({ length: Math.min(CHUNK, JOBS - i) }, (_, k) => ({
      data: { i: i + k },
      opts: { removeOnComplete: true },
    }));
    await queue.addBulk(jobs);
  }
  await finished;
  const rate = JOBS / ((performance.now() - start) / 1000);
  await queue.obliterate({ force: true });
  await queue.close();
  await connection.close();
  return rate;
}

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer().listen(0, '127.0.0.1', () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
    server.on('error', reject);
  });
}

async function startRedis(): Promise<{ url: string; stop: () => void } | undefined> {
  if (spawnSync('redis-server', ['--version']).status !== 0) return undefined;
  const port = await freePort();
  const child: ChildProcess = spawn(
    'redis-server',
    ['--port', String(port), '--bind', '127.0.0.1', '--save', '', '--appendonly', 'no'],
    {
      stdio: 'ignore',
    },
  );
  for (let i = 0; i < 50; i += 1) {
    const up = await new Promise<boolean>((resolve) => {
      const socket = net.connect(port, '127.0.0.1', () => {
        socket.end();
        resolve(true);
      });
      socket.on('error', () => resolve(false));
    });
    if (up) break;
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  return { url: `redis://127.0.0.1:${port}`, stop: () => child.kill() };
}

const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!;

export async function run(): Promise<Figure[]> {
  const redis = await startRedis();
  const embedded: number[] = [];
  const real: number[] = [];
  try {
    // Alternate the backends so that background load on the machine hits both alike.
    for (let i = 0; i < RUNS; i += 1) {
      embedded.push(await jobsPerSecond(undefined));
      if (redis) real.push(await jobsPerSecond(redis.url));
    }
  } finally {
    redis?.stop();
  }
  const figures: Figure[] = [{ name: 'queue.embedded_jobs_per_s', value: median(embedded), unit: 'jobs/s' }];
  if (redis) {
    figures.push({ name: 'queue.redis_jobs_per_s', value: median(real), unit: 'jobs/s' });
    figures.push({ name: 'queue.ratio_embedded_vs_redis', value: median(embedded) / median(real), unit: '' });
  } else {
    console.error('# redis-server is not installed: the real-Redis figure is skipped');
  }
  return figures;
}
