// Real `npm run worker` processes for the tests on real Redis: started, awaited, stopped and killed.
import { type ChildProcess, spawn } from 'node:child_process';
import path from 'node:path';

const repo = path.resolve(import.meta.dirname, '../../..');
const HALT_HOOK = path.join(import.meta.dirname, 'halt-at-statement.ts');

export interface WorkerProcess {
  child: ChildProcess;
  output: () => string;
  /** Resolves when it says it is taking jobs; rejects if it exits first. */
  ready: () => Promise<void>;
  /** Resolves when it has stopped at its DIPDECK_TEST_HALT_SQL statement (tests/worker/support/halt-at-statement.ts). */
  halted: () => Promise<string>;
  /** Its exit code, or the signal that ended it. */
  exited: () => Promise<number | NodeJS.Signals | null>;
  /** The jobs it completed, as "queue:id", from its own log (LOG_LEVEL=debug). */
  completedJobs: () => string[];
}

export interface WorkerOptions {
  dataDir: string;
  env?: Record<string, string>;
  /** Stop the process just before the `at`-th statement matching `sql`, to kill it there. */
  halt?: { sql: string; at: number };
}

const every: ChildProcess[] = [];

/** Kills whatever a test left running; call from afterAll. */
export function killWorkers(): void {
  for (const child of every.splice(0))
    if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
}

export function startWorker(options: WorkerOptions): WorkerProcess {
  let output = '';
  const halt = options.halt
    ? { DIPDECK_TEST_HALT_SQL: options.halt.sql, DIPDECK_TEST_HALT_AT: String(options.halt.at) }
    : {};
  const child = spawn(
    process.execPath,
    ['--import', 'tsx', ...(options.halt ? ['--import', HALT_HOOK] : []), 'worker/index.ts'],
    {
      cwd: repo,
      env: {
        ...process.env,
        NODE_ENV: 'test',
        DATA_DIR: options.dataDir,
        LOG_LEVEL: 'debug',
        DATABASE_URL: '',
        ...halt,
        ...options.env,
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    },
  );
  every.push(child);
  const listeners = new Set<() => void>();
  const append = (chunk: Buffer) => {
    output += chunk;
    for (const listener of listeners) listener();
  };
  child.stdout!.on('data', append);
  child.stderr!.on('data', append);
  const exit = new Promise<number | NodeJS.Signals | null>((resolve) =>
    child.once('exit', (code, signal) => {
      resolve(signal ?? code);
      for (const listener of listeners) listener();
    }),
  );
  const waitFor = (pattern: RegExp, what: string) =>
    new Promise<string>((resolve, reject) => {
      const check = () => {
        const match = output.match(pattern);
        if (match) {
          listeners.delete(check);
          resolve(match[0]);
        } else if (child.exitCode !== null || child.signalCode !== null) {
          listeners.delete(check);
          reject(new Error(`the worker exited before ${what}:\n${output}`));
        }
      };
      listeners.add(check);
      check();
    });
  return {
    child,
    output: () => output,
    ready: () => waitFor(/is taking jobs/, 'taking jobs').then(() => {}),
    halted: () => waitFor(/^HALTED .*$/m, 'halting'),
    exited: () => exit,
    completedJobs: () =>
      output
        .split('\n')
        .filter((line) => line.startsWith('{') && line.includes('"job completed"'))
        .map((line) => JSON.parse(line) as { queue: string; jobId: string })
        .map((entry) => `${entry.queue}:${entry.jobId}`),
  };
}
