import { describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, setUpBrowserJourney } from './support/journey';

const journey = setUpBrowserJourney({});

const areaLinks = ['Deck', 'My record', 'Desk', 'Lab', 'Admin'] as const;

function mainNav() {
  return journey.page.getByRole('navigation', { name: 'Main' });
}

async function expectNavigation(allowed: readonly (typeof areaLinks)[number][]) {
  await mainNav().getByRole('link', { name: 'Deck', exact: true }).waitFor();
  for (const name of areaLinks) {
    const count = await mainNav().getByRole('link', { name, exact: true }).count();
    expect(count, `link "${name}"`).toBe(allowed.includes(name) ? 1 : 0);
  }
}

async function signOut() {
  await journey.page.getByRole('button', { name: 'Sign out' }).click();
  await journey.page.getByRole('link', { name: 'Sign in' }).first().waitFor();
}

describe('signing up, in and out', () => {
  it('a newcomer signs up with the newsletter unticked, gets the volunteer areas, and signs out', async () => {
    await journey.page.goto(journey.url('/'));
    await journey.page
      .getByRole('heading', { level: 1, name: /find planets crossing their stars/ })
      .waitFor();
    await journey.screenshots('home');

    await journey.page.getByRole('link', { name: 'Create an account' }).first().click();
    const newsletter = journey.page.getByRole('checkbox', { name: /newsletter/ });
    expect(await newsletter.isChecked()).toBe(false);

    // The server's field message for a taken address is shown beside the field.
    journey.expected.push({ path: '/api/auth/sign-up', status: 409 });
    await journey.page.getByLabel('E-mail').fill('volunteer@demo.dipdeck.test');
    await journey.page.getByLabel('Display name').fill('Nova Newcomer');
    await journey.page.getByLabel('Password', { exact: true }).fill('a long enough password');
    await journey.page.getByRole('button', { name: 'Create account' }).click();
    const emailField = journey.page.getByRole('textbox', { name: 'E-mail' });
    await journey.page.locator('[aria-invalid="true"]').first().waitFor();
    expect(await emailField.getAttribute('aria-invalid')).toBe('true');

    const email = `nova-${Date.now()}@example.test`;
    await emailField.fill(email);
    await journey.page.getByRole('button', { name: 'Create account' }).click();
    await journey.page.getByRole('heading', { name: 'Judge snippets' }).waitFor();
    expect(new URL(journey.page.url()).pathname).toBe('/deck');
    await expectNavigation(['Deck', 'My record']);

    await mainNav().getByRole('link', { name: 'My record', exact: true }).click();
    await journey.page.locator('dl').getByText(email).waitFor();
    // The address is not confirmed yet: the confirmation link was mailed at sign-up.
    await journey.page.getByText('Not confirmed').first().waitFor();
    await journey.page.getByText('Not opted in').waitFor();
    // Consent can be given later, on My record, and takes effect at once.
    await journey.page.getByText('Send me the newsletter').click();
    await journey.page.getByText('Opted in', { exact: true }).waitFor();
    await journey.screenshots('record');

    await signOut();
    expect(await mainNav().count()).toBe(0);
    expect(new URL(journey.page.url()).pathname).toBe('/');
  });

  it('signing in with a wrong password shows the server’s message', async () => {
    journey.expected.push({ path: '/api/auth/sign-in', status: 401 });
    await journey.page.goto(journey.url('/sign-in'));
    await journey.page.getByLabel('E-mail').fill('volunteer@demo.dipdeck.test');
    await journey.page.getByLabel('Password').fill('not-the-password');
    await journey.page.getByRole('button', { name: 'Sign in' }).click();
    await journey.page.getByRole('alert').filter({ hasText: 'E-mail or password is not right' }).waitFor();
    await journey.screenshots('sign-in');
  });

  it.each([
    ['volunteer', ['Deck', 'My record']],
    ['moderator', ['Deck', 'My record', 'Desk']],
    ['scientist', ['Deck', 'My record', 'Desk', 'Lab']],
    ['admin', ['Deck', 'My record', 'Desk', 'Lab', 'Admin']],
  ] as const)('the demo %s sees only the areas of that role', async (role, allowed) => {
    await journey.signIn(`${role}@demo.dipdeck.test`);
    await expectNavigation(allowed);
    if (role === 'volunteer') {
      await journey.page.getByRole('heading', { level: 1, name: 'Judge snippets' }).waitFor();
      await journey.screenshots('deck');
    }
    await signOut();
  });

  it('a signed-out visitor to the Desk is sent to sign in and then back to the Desk', async () => {
    await journey.page.goto(journey.url('/desk'));
    await journey.page.getByRole('heading', { name: 'Sign in' }).waitFor();
    expect(new URL(journey.page.url()).searchParams.get('redirectTo')).toBe('/desk');
    await journey.page.getByLabel('E-mail').fill('moderator@demo.dipdeck.test');
    await journey.page.getByLabel('Password').fill(DEMO_PASSWORD);
    await journey.page.getByRole('button', { name: 'Sign in' }).click();
    await journey.page.getByRole('heading', { level: 1, name: 'Split snippets' }).waitFor();
    expect(new URL(journey.page.url()).pathname).toBe('/desk');
  });

  it('a volunteer who opens the Lab is told it is not for their role', async () => {
    await journey.signIn('volunteer@demo.dipdeck.test');
    await journey.page.goto(journey.url('/lab'));
    await journey.page.getByRole('heading', { name: 'The Lab is not for your role' }).waitFor();
  });

  it('an unknown address shows the 404 page', async () => {
    await journey.page.goto(journey.url('/no-such-page'));
    await journey.page.getByRole('heading', { name: 'Nothing at this address' }).waitFor();
  });
});

describe('Admin', () => {
  it('the admin changes a person’s role, suspends and restores them, and cannot demote themself', async () => {
    await journey.signIn('admin@demo.dipdeck.test');
    await mainNav().getByRole('link', { name: 'Admin', exact: true }).click();
    await journey.page.getByRole('heading', { name: 'People and roles' }).waitFor();
    await journey.page.getByRole('table').waitFor();
    await journey.screenshots('admin');

    await journey.page.getByLabel('Search people').fill('volunteer@demo');
    const row = journey.page.getByRole('row').filter({ hasText: 'volunteer@demo.dipdeck.test' });
    await journey.page.waitForFunction(() => document.querySelectorAll('tbody tr').length === 1);

    await row.getByRole('combobox').selectOption('moderator');
    await journey.page.getByRole('status').filter({ hasText: 'is now a moderator' }).waitFor();
    await journey.page.reload();
    await journey.page.getByLabel('Search people').fill('volunteer@demo');
    await journey.page.waitForFunction(() => document.querySelectorAll('tbody tr').length === 1);
    expect(await row.getByRole('combobox').inputValue()).toBe('moderator');

    await row.getByRole('button', { name: /^Suspend/ }).click();
    await row.getByText('Suspended', { exact: true }).waitFor();
    await row.getByRole('button', { name: /^Restore/ }).click();
    await row.getByText('Active', { exact: true }).waitFor();
    await row.getByRole('combobox').selectOption('volunteer');
    await journey.page.getByRole('status').filter({ hasText: 'is now a volunteer' }).waitFor();

    journey.expected.push({ path: '/api/admin/people/', status: 409 });
    await journey.page.getByLabel('Search people').fill('admin@demo');
    const self = journey.page.getByRole('row').filter({ hasText: 'admin@demo.dipdeck.test' });
    await journey.page.waitForFunction(() => document.querySelectorAll('tbody tr').length === 1);
    await self.getByRole('combobox').selectOption('volunteer');
    await journey.page
      .getByRole('alert')
      .filter({ hasText: /Could not change/ })
      .waitFor();
    expect(await self.getByRole('combobox').inputValue()).toBe('admin');
  });
});
