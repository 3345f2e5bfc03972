import { mkdirSync } from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { type AppServer, startAppServer } from './support/app-server';
import { type ExpectedFailure, launchBrowser, type TestBrowser, watchPageErrors } from './support/browser';

const demoPassword = 'dipdeck-demo';
const screenshotDir = path.resolve(import.meta.dirname, '../../test-results/screenshots');
const phone = { width: 375, height: 812 };
const desktop = { width: 1440, height: 900 };
// The queues of issue 3; the screen lists whatever the server reports, so this checks the two agree.
const queueNames = ['ingest', 'consensus', 'period-search', 'mail', 'housekeeping'] as const;

// While nobody is signed in the app asks who is, and the API rightly answers 401.
const signedOutCheck: ExpectedFailure = { path: '/api/auth/me', status: 401 };

let server: AppServer;
let browser: TestBrowser;
let page: Page;
let expected: ExpectedFailure[];
let takeErrors: () => string[];

beforeAll(async () => {
  mkdirSync(screenshotDir, { recursive: true });
  server = await startAppServer();
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

beforeEach(async () => {
  await browser.context.clearCookies();
  expected = [signedOutCheck];
  page = await browser.context.newPage();
  await page.setViewportSize(desktop);
  takeErrors = watchPageErrors(page, () => expected);
});

afterEach(async () => {
  const errors = takeErrors();
  await page.close();
  expect(errors, 'the page logged errors').toEqual([]);
});

function url(pathname: string): string {
  return `${server.baseUrl}${pathname}`;
}

async function signIn(email: string) {
  await page.goto(url('/sign-in'));
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(demoPassword);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('button', { name: 'Sign out' }).waitFor();
}

/** Every button, select, area link and disclosure on screen is at least 44 × 44 px (WCAG 2.2, §2.5.5). */
async function expectTouchTargets() {
  const sizes = await page
    .locator('button:visible, select:visible, nav a:visible, summary:visible')
    .evaluateAll((elements) =>
      elements.map((element) => {
        const box = element.getBoundingClientRect();
        return {
          name: element.textContent?.trim() || element.getAttribute('aria-label'),
          w: box.width,
          h: box.height,
        };
      }),
    );
  for (const size of sizes) {
    expect(size.h, `height of ${size.name}`).toBeGreaterThanOrEqual(44);
    expect(size.w, `width of ${size.name}`).toBeGreaterThanOrEqual(44);
  }
}

/** Saves the page at phone and desktop width, then leaves it at desktop width. */
async function screenshots(name: string) {
  for (const viewport of [phone, desktop]) {
    await page.setViewportSize(viewport);
    await page.evaluate(() => window.scrollTo(0, 0));
    await page.evaluate(() => document.fonts.ready);
    if (viewport === phone) await expectTouchTargets();
    await page.screenshot({
      path: path.join(screenshotDir, `${name}-${viewport.width}.png`),
      fullPage: true,
    });
  }
}

describe('Admin queues', () => {
  it('the admin opens Admin, then Queues, and sees the backend and the counts of every queue', async () => {
    await signIn('admin@demo.dipdeck.test');
    await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Admin', exact: true })
      .click();
    await page.getByRole('heading', { name: 'People and roles' }).waitFor();

    const sections = page.getByRole('navigation', { name: 'Admin sections' });
    await sections.getByRole('link', { name: 'Queues', exact: true }).click();
    await page.getByRole('heading', { level: 1, name: 'Queues and jobs' }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/admin/queues');
    expect(await sections.getByRole('link', { name: 'Queues' }).getAttribute('aria-current')).toBe('page');

    const backend = page.getByRole('region', { name: /Jobs run/ });
    await backend.waitFor();
    expect(await backend.textContent()).toMatch(
      /inside the server process|separate workers, queued in Redis/,
    );

    const counts = page.getByRole('table', { name: 'Jobs in each queue, by state' });
    await counts.waitFor();
    for (const name of queueNames) {
      expect(await counts.getByRole('row').filter({ hasText: name }).count(), `row of ${name}`).toBe(1);
    }

    // A fresh server may or may not have failed jobs by now; either way the section must have settled.
    await page
      .getByRole('heading', { name: /^No failed jobs/ })
      .or(page.getByRole('table', { name: 'Latest failed jobs, newest first' }))
      .waitFor();
    await screenshots('admin-queues');
  });

  it('a volunteer who goes to /admin/queues is told Admin is not for their role', async () => {
    await signIn('volunteer@demo.dipdeck.test');
    const asked: string[] = [];
    page.on('request', (request) => {
      if (request.url().includes('/api/admin/')) asked.push(request.url());
    });
    await page.goto(url('/admin/queues'));
    await page.getByRole('heading', { name: 'Admin is not for your role' }).waitFor();
    expect(await page.getByRole('navigation', { name: 'Admin sections' }).count()).toBe(0);
    expect(asked, 'the guard asks the API for nothing of Admin').toEqual([]);
  });
});
