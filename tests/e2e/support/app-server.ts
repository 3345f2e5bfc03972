import { type ChildProcess, spawn } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';

const root = path.resolve(import.meta.dirname, '../../..');
const startTimeoutMs = 60_000;

export interface AppServer {
  baseUrl: string;
  /** The server's own DATA_DIR (its SQLite file is dipdeck.sqlite there), for a journey that sets up data. */
  dataDir: string;
  /** The last 20 kB the server printed, for the record of a failed test. */
  log: () => string;
  stop: () => Promise<void>;
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      probe.close(() =>
        typeof address === 'object' && address ? resolve(address.port) : reject(new Error('no port')),
      );
    });
  });
}

async function waitForHealth(baseUrl: string, child: ChildProcess, output: () => string): Promise<void> {
  const deadline = Date.now() + startTimeoutMs;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) {
      throw new Error(
        `the app server exited with code ${child.exitCode} before it was healthy:\n${output()}`,
      );
    }
    try {
      const response = await fetch(`${baseUrl}/api/health`);
      if (response.status === 200) return;
    } catch {
      // Not listening yet.
    }
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
  throw new Error(
    `the app server did not answer /api/health with 200 within ${startTimeoutMs} ms:\n${output()}`,
  );
}

/** Starts the real server, with demo accounts, on a free port and a fresh data directory. */
export async function startAppServer(): Promise<AppServer> {
  if (!existsSync(path.join(root, 'dist/client/index.html'))) {
    throw new Error(
      'dist/client is missing: run `npx vite build` (the `test:e2e` script does) before the e2e tests',
    );
  }
  const port = await freePort();
  const dataDir = mkdtempSync(path.join(tmpdir(), 'dipdeck-e2e-data-'));
  const baseUrl = `http://127.0.0.1:${port}`;
  let log = '';
  const child = spawn(path.join(root, 'node_modules/.bin/tsx'), ['server/index.ts'], {
    cwd: root,
    env: {
      ...process.env,
      PORT: String(port),
      DATA_DIR: dataDir,
      NODE_ENV: 'test',
      DIPDECK_DEMO: '1',
      DIPDECK_DEMO_TARGETS: '12',
      // Kept in memory only, for the record of a failed test.
      LOG_LEVEL: process.env.LOG_LEVEL ?? 'info',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const keep = (chunk: Buffer) => {
    log = (log + chunk.toString()).slice(-20_000);
  };
  child.stdout?.on('data', keep);
  child.stderr?.on('data', keep);

  const stop = async () => {
    if (child.exitCode === null) {
      const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
      child.kill('SIGTERM');
      const timer = setTimeout(() => child.kill('SIGKILL'), 5_000);
      await exited;
      clearTimeout(timer);
    }
    rmSync(dataDir, { recursive: true, force: true });
  };

  try {
    await waitForHealth(baseUrl, child, () => log);
  } catch (error) {
    await stop();
    throw error;
  }
  return { baseUrl, dataDir, log: () => log, stop };
}
