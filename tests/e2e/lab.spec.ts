import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { type AppServer, startAppServer } from './support/app-server';
import { type ExpectedFailure, launchBrowser, type TestBrowser, watchPageErrors } from './support/browser';

const demoPassword = 'dipdeck-demo';
const screenshotDir = path.resolve(import.meta.dirname, '../../test-results/screenshots');
const fixtures = path.resolve(import.meta.dirname, '../fixtures/reference');
const phone = { width: 375, height: 812 };
const desktop = { width: 1440, height: 900 };
// Reading a light curve runs in the server's own embedded worker; a FITS file of a few thousand points
// takes seconds, but a busy test machine may be slow.
const ingestTimeoutMs = 60_000;

// While nobody is signed in the app asks who is, and the API rightly answers 401.
const signedOutCheck: ExpectedFailure = { path: '/api/auth/me', status: 401 };

// The designations the fixtures observe: hot-jupiter.fits names DPD-0417-3021 in its OBJECT keyword;
// shallow-transit.csv names nothing, so the form says which target it is.
const catalogue = [
  'designation,ra,dec,magnitude,stellar_radius,stellar_mass,teff',
  'DPD-0417-3021,04:17:21.5,-30:21:08,11.2,1.05,1.02,5840',
  'DPD-1188-0754,118.8,-7.54,12.6,,,',
  ',10,10,12,1,1,5000',
].join('\n');

let server: AppServer;
let browser: TestBrowser;
let page: Page;
let expected: ExpectedFailure[];
let takeErrors: () => string[];
let workDir: string;

beforeAll(async () => {
  mkdirSync(screenshotDir, { recursive: true });
  workDir = mkdtempSync(path.join(tmpdir(), 'dipdeck-lab-e2e-'));
  server = await startAppServer();
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
  if (workDir) rmSync(workDir, { recursive: true, force: true });
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

/** Every button, select, area link and file input on screen is at least 44 × 44 px (WCAG 2.2, §2.5.5). */
async function expectTouchTargets() {
  const sizes = await page
    .locator('button:visible, select:visible, nav a:visible, summary:visible, input[type=file]:visible')
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

/** Nothing on the page is wider than the phone: a table that did not become cards would be. */
async function expectNoSideways() {
  const wide = await page.evaluate(() =>
    [...document.querySelectorAll('body *')]
      .filter((element) => element.getBoundingClientRect().right > window.innerWidth + 0.5)
      .filter((element) => !element.closest('pre, .u-wrap'))
      .slice(0, 5)
      .map((element) => `${element.tagName.toLowerCase()}.${element.className}`.slice(0, 160)),
  );
  expect(wide, 'elements wider than the phone').toEqual([]);
}

/** Saves the page at phone and desktop width, then leaves it at desktop width. */
async function screenshots(name: string, ready: () => Promise<void> = async () => {}) {
  for (const viewport of [phone, desktop]) {
    await page.setViewportSize(viewport);
    await page.evaluate(() => window.scrollTo(0, 0));
    await page.evaluate(() => document.fonts.ready);
    await ready();
    // uPlot follows its container's width on the next frame.
    await page.waitForTimeout(250);
    if (viewport === phone) {
      await expectTouchTargets();
      await expectNoSideways();
    }
    await page.screenshot({
      path: path.join(screenshotDir, `${name}-${viewport.width}.png`),
      fullPage: true,
    });
  }
}

async function expectPlotDrawn() {
  const plot = page.locator('.light-curve-plot canvas').first();
  await plot.waitFor();
  const box = await plot.boundingBox();
  expect(box?.width ?? 0, 'plot width').toBeGreaterThan(150);
  expect(box?.height ?? 0, 'plot height').toBeGreaterThan(100);
}

async function uploadLightCurve(filePath: string, target: string) {
  const form = page.getByRole('region', { name: 'Light curves' });
  await form.getByLabel('Light-curve files').setInputFiles(filePath);
  if (target) await form.getByRole('combobox', { name: 'Target' }).fill(target);
  await form.getByRole('button', { name: 'Upload light curves' }).click();
  await page.getByRole('progressbar', { name: `Progress of ${path.basename(filePath)}` }).waitFor();
}

describe('the Lab', () => {
  it('a scientist creates a campaign, uploads targets and light curves, watches them read, opens a target and sets the campaign live', async () => {
    await signIn('scientist@demo.dipdeck.test');
    await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Lab', exact: true })
      .click();
    await page.getByRole('heading', { level: 1, name: 'Campaigns' }).waitFor();
    await page.getByRole('table', { name: 'Campaigns, newest first' }).waitFor();
    await screenshots('lab-campaigns');

    // A name is required: the form says so beside the field, without asking the server.
    await page.getByRole('link', { name: 'New campaign' }).first().click();
    await page.getByRole('heading', { level: 1, name: 'New campaign' }).waitFor();
    await page.getByRole('button', { name: 'Create campaign' }).click();
    expect(await page.getByRole('textbox', { name: 'Name' }).getAttribute('aria-invalid')).toBe('true');

    const name = `Southern dwarfs ${Date.now()}`;
    await page.getByRole('textbox', { name: 'Name' }).fill(name);
    await page.getByLabel('Description').fill('Two invented stars observed for the browser test.');
    await page.getByRole('button', { name: 'Create campaign' }).click();
    await page.getByRole('heading', { level: 1, name }).waitFor();
    expect(new URL(page.url()).pathname).toMatch(/^\/lab\/campaigns\/\d+$/);
    await page
      .getByText('Changing the settings of a live campaign affects only snippets made afterwards')
      .waitFor();

    // The catalogue: two stars, one with the stellar parameters left out, and one row without a name.
    const cataloguePath = path.join(workDir, 'targets.csv');
    writeFileSync(cataloguePath, catalogue);
    const catalogueSection = page.getByRole('region', { name: 'Target catalogue' });
    await catalogueSection.getByLabel('Catalogue file').setInputFiles(cataloguePath);
    await catalogueSection.getByRole('button', { name: 'Upload catalogue' }).click();
    const report = page.getByRole('table', { name: 'Row by row report on targets.csv' });
    await report.waitFor();
    expect(await report.getByRole('row').filter({ hasText: 'Accepted' }).count()).toBe(2);
    expect(await report.getByRole('row').filter({ hasText: 'Rejected' }).count()).toBe(1);
    await report
      .getByRole('row')
      .filter({ hasText: 'DPD-1188-0754' })
      .getByText('stellar radius assumed')
      .waitFor();
    const targets = page.getByRole('table', { name: 'Targets in this campaign' });
    await targets.getByRole('link', { name: 'DPD-0417-3021' }).waitFor();
    await targets.getByRole('link', { name: 'DPD-1188-0754' }).waitFor();

    // One target a request: the FITS file names its star, the CSV gets one from the form.
    await uploadLightCurve(path.join(fixtures, 'hot-jupiter.fits'), '');
    await uploadLightCurve(path.join(fixtures, 'shallow-transit.csv'), 'DPD-1188-0754');
    for (const file of ['hot-jupiter.fits', 'shallow-transit.csv']) {
      const bar = page.getByRole('progressbar', { name: `Progress of ${file}` });
      await page.waitForFunction(
        (label) => {
          const element = document.querySelector(`[role="progressbar"][aria-label="${label}"]`);
          const now = element?.getAttribute('aria-valuenow');
          const item = element?.closest('[data-status]');
          if (item?.getAttribute('data-status') === 'failed') throw new Error(`${label} failed`);
          return now === '100' && item?.getAttribute('data-status') === 'done';
        },
        `Progress of ${file}`,
        { timeout: ingestTimeoutMs, polling: 250 },
      );
      expect(await bar.getAttribute('aria-valuetext')).toMatch(/^Done/);
    }
    const recent = page.getByRole('table', { name: 'Recent light-curve uploads, newest first' });
    await recent.getByRole('row').filter({ hasText: 'hot-jupiter.fits' }).getByText('Done').waitFor();
    await recent
      .getByRole('row')
      .filter({ hasText: 'shallow-transit.csv' })
      .getByText('DPD-1188-0754')
      .waitFor();
    await screenshots('lab-campaign');

    // The snippet browser: the campaign's snippets, and a light-curve preview of the one chosen.
    const campaignPath = new URL(page.url()).pathname;
    await page.getByRole('link', { name: /^Browse .* snippets$/ }).click();
    await page.getByRole('heading', { level: 1, name: `Snippets of ${name}` }).waitFor();
    const snippetTable = page.getByRole('table', { name: 'Snippets of this campaign' });
    await snippetTable.waitFor();
    await page.getByLabel('Kind').selectOption('planted');
    await page.waitForFunction(() =>
      [...document.querySelectorAll('tbody tr')].every((row) => row.textContent?.includes('Planted')),
    );
    await snippetTable
      .getByRole('button', { name: /^Preview snippet/ })
      .first()
      .click();
    await page.getByText('Planted transit (staff only)').waitFor();
    await expectPlotDrawn();
    await screenshots('lab-snippets', expectPlotDrawn);

    // The target page: the whole light curve, zoomable, with the snippets cut from it.
    await page.goto(url(campaignPath));
    await page
      .getByRole('table', { name: 'Targets in this campaign' })
      .getByRole('link', { name: 'DPD-0417-3021' })
      .click();
    await page.getByRole('heading', { level: 1, name: 'DPD-0417-3021' }).waitFor();
    await expectPlotDrawn();
    await page
      .getByRole('img', { name: /^Light curve of DPD-0417-3021: .* snippet windows shaded/ })
      .waitFor();
    await page.getByRole('table', { name: 'Snippets of this target' }).waitFor();
    await screenshots('lab-target', expectPlotDrawn);

    await page.getByRole('link', { name: 'The campaign' }).click();
    await page.getByRole('heading', { level: 1, name }).waitFor();

    // Settings that fit their ranges but not each other: the server's message lands beside the field.
    expected.push({ path: '/api/campaigns/', status: 400 });
    const upper = page.getByRole('textbox', { name: 'Upper threshold (consensus score)' });
    const lower = page.getByRole('textbox', { name: 'Lower threshold (consensus score)' });
    await upper.fill('0.5');
    await lower.fill('0.5');
    await page.getByRole('button', { name: 'Save settings' }).click();
    await page.getByText('Must be below the upper threshold').waitFor();
    expect(await lower.getAttribute('aria-invalid')).toBe('true');
    await upper.fill('0.9');
    await lower.fill('0.1');
    await page.getByRole('button', { name: 'Save settings' }).click();
    await page.getByRole('status').filter({ hasText: 'Settings saved' }).waitFor();

    // Going live: the campaign's snippets go to the Deck.
    await page.getByRole('button', { name: 'Set live' }).click();
    await page
      .getByRole('status')
      .filter({ hasText: `${name} is live` })
      .waitFor();
    await page.getByRole('button', { name: 'Pause' }).waitFor();
    await page.getByRole('button', { name: 'Close campaign' }).waitFor();
  });

  it('a scientist makes an API token, sees its secret once, and reads the API reference', async () => {
    await signIn('scientist@demo.dipdeck.test');
    await page.goto(url('/lab/tokens'));
    await page.getByRole('heading', { level: 1, name: 'API tokens' }).waitFor();
    await page.getByRole('textbox', { name: 'Name' }).fill('nightly export');
    await page.getByRole('button', { name: 'Create token' }).click();
    await page.getByRole('heading', { name: /Copy the secret of “nightly export” now/ }).waitFor();
    expect((await page.getByTestId('token-secret').textContent())?.length ?? 0).toBeGreaterThan(16);
    await page.getByRole('button', { name: 'I have stored it' }).click();
    expect(await page.getByTestId('token-secret').count()).toBe(0);
    await page.getByRole('table', { name: 'Your API tokens' }).getByText('nightly export').waitFor();
    await screenshots('lab-tokens');

    await page
      .getByRole('navigation', { name: 'Lab sections' })
      .getByRole('link', { name: 'API reference' })
      .click();
    await page.getByRole('heading', { level: 1, name: 'API reference' }).waitFor();
    await page.getByRole('heading', { name: '/api/campaigns/{id}/light-curves' }).waitFor();
    await page.getByText('Authorization: Bearer $DIPDECK_TOKEN').first().waitFor();
    await screenshots('lab-api-reference');
  });

  it('a volunteer who opens a campaign page is told the Lab is not for their role', async () => {
    await signIn('volunteer@demo.dipdeck.test');
    await page.goto(url('/lab/campaigns/1'));
    await page.getByRole('heading', { name: 'The Lab is not for your role' }).waitFor();
  });
});
