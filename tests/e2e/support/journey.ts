import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, beforeEach, expect } from 'vitest';
import { type AppServer, startAppServer } from './app-server';
import { type ExpectedFailure, launchBrowser, type TestBrowser, watchPageErrors } from './browser';

// What every browser journey shares: one app server and browser per file, a fresh page per test that
// fails the test on any console error the test did not expect, and the common steps.

export const DEMO_PASSWORD = 'dipdeck-demo';
export const PHONE = { width: 375, height: 812 };
export const DESKTOP = { width: 1440, height: 900 };
export const SCREENSHOT_DIR = path.resolve(import.meta.dirname, '../../../test-results/screenshots');
const FAILURE_DIR = path.resolve(import.meta.dirname, '../../../test-results/failures');

// While nobody is signed in the app asks who is, and the API rightly answers 401.
const SIGNED_OUT_CHECK: ExpectedFailure = { path: '/api/auth/me', status: 401 };

export interface JourneyOptions {
  /** Console errors to ignore, such as the ones Chromium logs while a test cuts the network. */
  ignoreErrors?: RegExp;
  /** The elements that must be 44 × 44 px at phone width. */
  touchSelector?: string;
  /** Also check at phone width that nothing is wider than the screen. */
  checkSideways?: boolean;
  /** Time to let charts follow a new viewport width before the screenshot (uPlot resizes next frame). */
  settleMs?: number;
}

export interface Journey {
  readonly server: AppServer;
  readonly browser: TestBrowser;
  readonly page: Page;
  /** Failures the running test expects; the signed-out check is always among them. */
  readonly expected: ExpectedFailure[];
  url(pathname: string): string;
  signIn(email: string, password?: string): Promise<void>;
  /** Every target on screen is at least 44 × 44 px (WCAG 2.2, §2.5.8; our own target, §2.5.5). */
  expectTouchTargets(): Promise<void>;
  /** Nothing on the page is wider than the screen: a table that did not become cards would be. */
  expectNoSideways(): Promise<void>;
  /** Saves the page at phone and desktop width (checking it at phone width), then leaves it at desktop. */
  screenshots(name: string, ready?: () => Promise<void>): Promise<void>;
}

export function setUpBrowserJourney(options: JourneyOptions = {}): Journey {
  const {
    touchSelector = 'button:visible, select:visible, nav a:visible',
    checkSideways = false,
    settleMs = 0,
  } = options;
  let server: AppServer;
  let browser: TestBrowser;
  let page: Page;
  let expected: ExpectedFailure[] = [];
  let takeErrors: () => string[];

  beforeAll(async () => {
    mkdirSync(SCREENSHOT_DIR, { recursive: true });
    server = await startAppServer();
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });
  beforeEach(async () => {
    const context = await browser.freshContext();
    expected = [SIGNED_OUT_CHECK];
    page = await context.newPage();
    await page.setViewportSize(DESKTOP);
    takeErrors = watchPageErrors(page, () => expected);
  });
  afterEach(async (context) => {
    if (context.task.result?.state === 'fail') await recordFailure(context.task.name);
    const errors = takeErrors().filter((error) => !options.ignoreErrors?.test(error));
    await page.close();
    expect(errors, 'the page logged errors').toEqual([]);
  });

  // A failed journey leaves what the browser showed and what the server said, so a failure that happens
  // only on a loaded CI machine can be read afterwards rather than guessed at.
  async function recordFailure(testName: string) {
    mkdirSync(FAILURE_DIR, { recursive: true });
    const base = path.join(FAILURE_DIR, testName.replace(/[^a-z0-9]+/gi, '-').slice(0, 80));
    await page.screenshot({ path: `${base}.png`, fullPage: true }).catch(() => {});
    writeFileSync(`${base}.log`, `page: ${page.url()}\n\nserver log (last 20 kB):\n${server.log()}`);
    process.stderr.write(`browser test failed on ${page.url()}; screenshot and server log in ${base}.*\n`);
  }

  const journey: Journey = {
    get server() {
      return server;
    },
    get browser() {
      return browser;
    },
    get page() {
      return page;
    },
    get expected() {
      return expected;
    },
    url: (pathname) => `${server.baseUrl}${pathname}`,
    async signIn(email, password = DEMO_PASSWORD) {
      await page.goto(journey.url('/sign-in'));
      await page.getByLabel('E-mail').fill(email);
      await page.getByLabel('Password').fill(password);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.getByRole('button', { name: 'Sign out' }).waitFor();
    },
    async expectTouchTargets() {
      const sizes = await page.locator(touchSelector).evaluateAll((elements) =>
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
    },
    async expectNoSideways() {
      const wide = await page.evaluate(() =>
        [...document.querySelectorAll('body *')]
          .filter((element) => element.getBoundingClientRect().right > window.innerWidth + 0.5)
          .filter((element) => !element.closest('pre, .u-wrap'))
          .slice(0, 5)
          .map((element) => `${element.tagName.toLowerCase()}.${element.className}`.slice(0, 160)),
      );
      expect(wide, 'elements wider than the phone').toEqual([]);
    },
    async screenshots(name, ready = async () => {}) {
      for (const viewport of [PHONE, DESKTOP]) {
        await page.setViewportSize(viewport);
        await page.evaluate(() => window.scrollTo(0, 0));
        await page.evaluate(() => document.fonts.ready);
        await ready();
        if (settleMs > 0) await page.waitForTimeout(settleMs);
        if (viewport === PHONE) {
          await journey.expectTouchTargets();
          if (checkSideways) await journey.expectNoSideways();
        }
        await page.screenshot({
          path: path.join(SCREENSHOT_DIR, `${name}-${viewport.width}.png`),
          fullPage: true,
        });
      }
    },
  };
  return journey;
}
