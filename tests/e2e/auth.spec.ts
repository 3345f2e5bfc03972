import { mkdirSync } from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { type AppServer, startAppServer } from './support/app-server';
import { type ExpectedFailure, launchBrowser, type TestBrowser, watchPageErrors } from './support/browser';

const demoPassword = 'dipdeck-demo';
const screenshotDir = path.resolve(import.meta.dirname, '../../test-results/screenshots');
const areaLinks = ['Deck', 'My record', 'Desk', 'Lab', 'Admin'] as const;
const phone = { width: 375, height: 812 };
const desktop = { width: 1440, height: 900 };

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

function mainNav() {
  return page.getByRole('navigation', { name: 'Main' });
}

async function expectNavigation(allowed: readonly (typeof areaLinks)[number][]) {
  await mainNav().getByRole('link', { name: 'Deck', exact: true }).waitFor();
  for (const name of areaLinks) {
    const count = await mainNav().getByRole('link', { name, exact: true }).count();
    expect(count, `link "${name}"`).toBe(allowed.includes(name) ? 1 : 0);
  }
}

async function signIn(email: string, password = demoPassword) {
  await page.goto(url('/sign-in'));
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('button', { name: 'Sign out' }).waitFor();
}

async function signOut() {
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.getByRole('link', { name: 'Sign in' }).first().waitFor();
}

/** Every button, select and area link on screen is at least 44 × 44 px (WCAG 2.2, §2.5.5 Target Size). */
async function expectTouchTargets() {
  const sizes = await page.locator('button:visible, select:visible, nav a:visible').evaluateAll((elements) =>
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

describe('signing up, in and out', () => {
  it('a newcomer signs up with the newsletter unticked, gets the volunteer areas, and signs out', async () => {
    await page.goto(url('/'));
    await page.getByRole('heading', { level: 1, name: /find planets crossing their stars/ }).waitFor();
    await screenshots('home');

    await page.getByRole('link', { name: 'Create an account' }).first().click();
    const newsletter = page.getByRole('checkbox', { name: /newsletter/ });
    expect(await newsletter.isChecked()).toBe(false);

    // The server's field message for a taken address is shown beside the field.
    expected.push({ path: '/api/auth/sign-up', status: 409 });
    await page.getByLabel('E-mail').fill('volunteer@demo.dipdeck.test');
    await page.getByLabel('Display name').fill('Nova Newcomer');
    await page.getByLabel('Password', { exact: true }).fill('a long enough password');
    await page.getByRole('button', { name: 'Create account' }).click();
    const emailField = page.getByRole('textbox', { name: 'E-mail' });
    await page.locator('[aria-invalid="true"]').first().waitFor();
    expect(await emailField.getAttribute('aria-invalid')).toBe('true');

    const email = `nova-${Date.now()}@example.test`;
    await emailField.fill(email);
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.getByRole('heading', { name: 'Judge snippets' }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/deck');
    await expectNavigation(['Deck', 'My record']);

    await mainNav().getByRole('link', { name: 'My record', exact: true }).click();
    await page.getByText(email).waitFor();
    await page.getByText('Not opted in').waitFor();
    // Consent can be given later, on My record, and takes effect at once.
    await page.getByText('Send me the newsletter').click();
    await page.getByText('Opted in', { exact: true }).waitFor();
    await screenshots('record');

    await signOut();
    expect(await mainNav().count()).toBe(0);
    expect(new URL(page.url()).pathname).toBe('/');
  });

  it('signing in with a wrong password shows the server’s message', async () => {
    expected.push({ path: '/api/auth/sign-in', status: 401 });
    await page.goto(url('/sign-in'));
    await page.getByLabel('E-mail').fill('volunteer@demo.dipdeck.test');
    await page.getByLabel('Password').fill('not-the-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('alert').filter({ hasText: 'E-mail or password is not right' }).waitFor();
    await screenshots('sign-in');
  });

  it.each([
    ['volunteer', ['Deck', 'My record']],
    ['moderator', ['Deck', 'My record', 'Desk']],
    ['scientist', ['Deck', 'My record', 'Desk', 'Lab']],
    ['admin', ['Deck', 'My record', 'Desk', 'Lab', 'Admin']],
  ] as const)('the demo %s sees only the areas of that role', async (role, allowed) => {
    await signIn(`${role}@demo.dipdeck.test`);
    await expectNavigation(allowed);
    if (role === 'volunteer') {
      await page.getByRole('heading', { level: 1, name: 'Judge snippets' }).waitFor();
      await screenshots('deck');
    }
    await signOut();
  });

  it('a signed-out visitor to the Desk is sent to sign in and then back to the Desk', async () => {
    await page.goto(url('/desk'));
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    expect(new URL(page.url()).searchParams.get('redirectTo')).toBe('/desk');
    await page.getByLabel('E-mail').fill('moderator@demo.dipdeck.test');
    await page.getByLabel('Password').fill(demoPassword);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('heading', { name: 'Settle split snippets' }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/desk');
  });

  it('a volunteer who opens the Lab is told it is not for their role', async () => {
    await signIn('volunteer@demo.dipdeck.test');
    await page.goto(url('/lab'));
    await page.getByRole('heading', { name: 'The Lab is not for your role' }).waitFor();
  });

  it('an unknown address shows the 404 page', async () => {
    await page.goto(url('/no-such-page'));
    await page.getByRole('heading', { name: 'Nothing at this address' }).waitFor();
  });
});

describe('Admin', () => {
  it('the admin changes a person’s role, suspends and restores them, and cannot demote themself', async () => {
    await signIn('admin@demo.dipdeck.test');
    await mainNav().getByRole('link', { name: 'Admin', exact: true }).click();
    await page.getByRole('heading', { name: 'People and roles' }).waitFor();
    await page.getByRole('table').waitFor();
    await screenshots('admin');

    await page.getByLabel('Search people').fill('volunteer@demo');
    const row = page.getByRole('row').filter({ hasText: 'volunteer@demo.dipdeck.test' });
    await page.waitForFunction(() => document.querySelectorAll('tbody tr').length === 1);

    await row.getByRole('combobox').selectOption('moderator');
    await page.getByRole('status').filter({ hasText: 'is now a moderator' }).waitFor();
    await page.reload();
    await page.getByLabel('Search people').fill('volunteer@demo');
    await page.waitForFunction(() => document.querySelectorAll('tbody tr').length === 1);
    expect(await row.getByRole('combobox').inputValue()).toBe('moderator');

    await row.getByRole('button', { name: /^Suspend/ }).click();
    await row.getByText('Suspended', { exact: true }).waitFor();
    await row.getByRole('button', { name: /^Restore/ }).click();
    await row.getByText('Active', { exact: true }).waitFor();
    await row.getByRole('combobox').selectOption('volunteer');
    await page.getByRole('status').filter({ hasText: 'is now a volunteer' }).waitFor();

    expected.push({ path: '/api/admin/people/', status: 409 });
    await page.getByLabel('Search people').fill('admin@demo');
    const self = page.getByRole('row').filter({ hasText: 'admin@demo.dipdeck.test' });
    await page.waitForFunction(() => document.querySelectorAll('tbody tr').length === 1);
    await self.getByRole('combobox').selectOption('volunteer');
    await page
      .getByRole('alert')
      .filter({ hasText: /Could not change/ })
      .waitFor();
    expect(await self.getByRole('combobox').inputValue()).toBe('admin');
  });
});
