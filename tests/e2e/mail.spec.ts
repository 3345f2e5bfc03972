import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { createDb } from '../../server/db/knex';
import { mailMessagesTo } from '../../server/db/mail-messages';
import { eventually } from '../support/eventually';
import { setUpBrowserJourney } from './support/journey';

const journey = setUpBrowserJourney({ checkSideways: true });

const EMAIL = 'crowd-05@demo.dipdeck.test';
const NEW_PASSWORD = 'a fresh passphrase for crowd five';

/** The reset link the app mailed to an address, read from what the embedded mail catcher kept. */
async function mailedLink(address: string): Promise<{ link: URL; subject: string }> {
  const db = createDb({
    databaseUrl: undefined,
    sqliteFile: path.join(journey.server.dataDir, 'dipdeck.sqlite'),
  });
  try {
    await eventually(async () => (await mailMessagesTo(db, address)).length > 0, `mail to ${address}`);
    const [message] = await mailMessagesTo(db, address);
    const link = message!.text?.match(/https?:\/\/\S+\/password-reset\/confirm\?token=[\w-]+/)?.[0];
    expect(link, message!.text ?? '').toBeTruthy();
    return { link: new URL(link!), subject: message!.subject };
  } finally {
    await db.destroy();
  }
}

describe('mail', () => {
  it('a volunteer who forgot their password asks for a link, follows it, chooses a new one and signs in; an admin reads the mail in the outbox', async () => {
    const { page } = journey;
    await page.goto(journey.url('/sign-in'));
    await page.getByRole('link', { name: 'Forgot your password?' }).click();
    await page.getByLabel('E-mail').fill(EMAIL);
    await page.getByRole('button', { name: 'Send the link' }).click();
    await page.getByText('Check your inbox').waitFor();
    await journey.screenshots('mail-reset-request');

    const { link, subject } = await mailedLink(EMAIL);
    await page.goto(journey.url(`${link.pathname}${link.search}`));
    await page.getByLabel('New password', { exact: true }).fill(NEW_PASSWORD);
    await page.getByLabel('New password again').fill(NEW_PASSWORD);
    await journey.screenshots('mail-reset-confirm');
    await page.getByRole('button', { name: 'Save the new password' }).click();
    await page.getByText('Your password is changed').waitFor();

    // The link works once.
    await page.goto(journey.url(`${link.pathname}${link.search}`));
    await page.getByLabel('New password', { exact: true }).fill('yet another fresh passphrase');
    await page.getByLabel('New password again').fill('yet another fresh passphrase');
    journey.expected.push({ path: '/api/auth/password-reset/confirm', status: 400 });
    await page.getByRole('button', { name: 'Save the new password' }).click();
    await page.getByText('This link no longer works').waitFor();

    await journey.signIn(EMAIL, NEW_PASSWORD);
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('link', { name: 'Sign in' }).first().waitFor();

    await journey.signIn('admin@demo.dipdeck.test');
    await page.goto(journey.url('/admin/outbox'));
    await page.getByRole('table', { name: /Messages the mail catcher received/ }).waitFor();
    await journey.screenshots('mail-outbox');
    await page.getByRole('link', { name: subject }).first().click();
    const frame = page.locator('iframe[sandbox=""]');
    await frame.waitFor();
    expect(await frame.getAttribute('srcdoc')).toContain('password');
    await journey.screenshots('mail-outbox-message');
  });
});
