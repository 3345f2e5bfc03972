import { type ChildProcess, spawn } from 'node:child_process';
import path from 'node:path';

const repo = path.resolve(import.meta.dirname, '../../..');
const START_TIMEOUT_MS = 60_000;
/** The server forces its own exit 15 s after SIGTERM; a little more than that before we give up on it. */
const STOP_TIMEOUT_MS = 20_000;

export interface ServerProcess {
  baseUrl: string;
  /** Starts the server (again) on the same port and data directory; resolves once /api/health says 200. */
  start(): Promise<void>;
  /** Sends the signal and waits for the process to end; answers its exit code (null when killed). */
  stop(signal: 'SIGTERM' | 'SIGKILL'): Promise<number | null>;
  /** The last of what the server printed, for error messages. */
  output(): string;
}

/**
 * The real server (`server/index.ts`) as its own process, on SQLite in `dataDir`, with embedded queues,
 * so the consensus worker runs inside it as in a one-machine install. Node runs it directly (with tsx as
 * a loader, not the tsx wrapper) so that a signal reaches the server itself.
 */
export function serverProcess(options: { port: number; dataDir: string }): ServerProcess {
  const baseUrl = `http://127.0.0.1:${options.port}`;
  let child: ChildProcess | null = null;
  let log = '';
  const keep = (chunk: Buffer) => {
    log = (log + chunk.toString()).slice(-20_000);
  };
  // Without the inherited settings that would point the server elsewhere than this run's SQLite and queues.
  const inherited = Object.fromEntries(
    Object.entries(process.env).filter(
      ([name]) => !['DATABASE_URL', 'REDIS_URL', 'SESSION_SECRET'].includes(name),
    ),
  );

  async function start(): Promise<void> {
    if (child && child.exitCode === null && child.signalCode === null) {
      throw new Error('the server is already running');
    }
    // LOAD_CPU_PROFILE_DIR=dir writes the server's V8 CPU profile there when it stops (NODE_OPTIONS refuses --cpu-prof).
    const profile = process.env.LOAD_CPU_PROFILE_DIR
      ? ['--cpu-prof', `--cpu-prof-dir=${process.env.LOAD_CPU_PROFILE_DIR}`]
      : [];
    const started = spawn(process.execPath, [...profile, '--import', 'tsx', 'server/index.ts'], {
      cwd: repo,
      env: {
        ...inherited,
        NODE_ENV: 'test',
        DATA_DIR: options.dataDir,
        DIPDECK_DEMO: '0',
        PORT: String(options.port),
        LOG_LEVEL: 'warn',
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    started.stdout?.on('data', keep);
    started.stderr?.on('data', keep);
    child = started;
    const deadline = Date.now() + START_TIMEOUT_MS;
    while (Date.now() < deadline) {
      if (started.exitCode !== null) {
        throw new Error(`the server exited with code ${started.exitCode} before it was healthy:\n${log}`);
      }
      const healthy = await fetch(`${baseUrl}/api/health`).then(
        (response) => response.status === 200,
        () => false,
      );
      if (healthy) return;
      await new Promise((resolve) => setTimeout(resolve, 100));
    }
    started.kill('SIGKILL');
    throw new Error(`the server did not answer /api/health within ${START_TIMEOUT_MS} ms:\n${log}`);
  }

  async function stop(signal: 'SIGTERM' | 'SIGKILL'): Promise<number | null> {
    const running = child;
    if (!running || running.exitCode !== null || running.signalCode !== null)
      return running?.exitCode ?? null;
    const exited = new Promise<number | null>((resolve) => running.once('exit', (code) => resolve(code)));
    running.kill(signal);
    const timer = setTimeout(() => running.kill('SIGKILL'), STOP_TIMEOUT_MS);
    const code = await exited;
    clearTimeout(timer);
    return code;
  }

  return { baseUrl, start, stop, output: () => log };
}
