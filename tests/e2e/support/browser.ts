import { execFileSync } from 'node:child_process';
import { type BrowserContext, chromium, type Page } from 'playwright-core';

const chromiumArgs = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

function chromiumPath(): string {
  try {
    const found = execFileSync('sh', ['-c', 'command -v chromium'], { encoding: 'utf8' }).trim();
    if (found) return found;
  } catch {
    // Not on PATH: fall back to the Debian location.
  }
  return '/usr/bin/chromium';
}

export interface TestBrowser {
  /** The current test's context: its own cookies and storage, nothing left over from the test before. */
  readonly context: BrowserContext;
  /**
   * Closes the current context and opens a clean one. Clearing cookies on a shared context was not
   * enough: a late answer to the previous test's page (the session is rolling, so every answer sets the
   * cookie) could sign the next test in behind its back.
   */
  freshContext: () => Promise<BrowserContext>;
  close: () => Promise<void>;
}

/** The system Chromium; playwright's own browser downloads are never used. */
export async function launchBrowser(): Promise<TestBrowser> {
  const browser = await chromium.launch({
    executablePath: chromiumPath(),
    headless: true,
    args: chromiumArgs,
  });
  let context: BrowserContext | undefined;
  const freshContext = async () => {
    await context?.close();
    context = await browser.newContext({ viewport: { width: 1440, height: 900 } });
    return context;
  };
  await freshContext();
  return {
    get context() {
      if (!context) throw new Error('the browser has no open context');
      return context;
    },
    freshContext,
    close: async () => {
      await context?.close();
      await browser.close();
    },
  };
}

export interface ExpectedFailure {
  /** Path of the API call, e.g. `/api/auth/me`; one ending in `/` matches every path below it. */
  path: string;
  status: number;
}

/**
 * Collects what the page logs as an error. Chromium logs every 4xx answer as "Failed to load resource",
 * so the answers a journey expects (401 from /api/auth/me while signed out) are listed and let through.
 */
export function watchPageErrors(page: Page, expected: () => readonly ExpectedFailure[]): () => string[] {
  const problems: string[] = [];
  page.on('pageerror', (error) => problems.push(`uncaught: ${error.stack ?? error.message}`));
  page.on('console', (message) => {
    if (message.type() !== 'error') return;
    const text = message.text();
    const url = message.location().url;
    const failedLoad = /Failed to load resource: the server responded with a status of (\d+)/.exec(text);
    if (failedLoad && url) {
      const status = Number(failedLoad[1]);
      const { pathname } = new URL(url);
      const matches = (allowed: ExpectedFailure) =>
        allowed.status === status &&
        (allowed.path.endsWith('/') ? pathname.startsWith(allowed.path) : pathname === allowed.path);
      if (expected().some(matches)) return;
    }
    problems.push(`console.error: ${text}${url ? ` (${url})` : ''}`);
  });
  return () => problems.splice(0);
}
