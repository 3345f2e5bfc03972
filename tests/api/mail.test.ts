// Transactional mail through the real local SMTP catcher (smtp-server, parsed with mailparser), and
// what a person does with its links: confirm the address, reset the password, delete the account.
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createCampaign } from '../../seeds/factories/campaigns';
import { createSnippetFixtures } from '../../seeds/factories/snippets';
import { mailMessagesTo } from '../../server/db/mail-messages';
import { RESET_REQUESTED } from '../../server/services/auth/account-mail';
import { eventually } from '../support/eventually';
import {
  Browser,
  createTestApp,
  personWithRole,
  signedIn,
  TEST_PASSWORD,
  type TestApp,
} from './support/test-app';

let test: TestApp;
const PUBLIC_URL = 'https://dipdeck.example.org';

beforeAll(async () => {
  test = await createTestApp({ queues: true, env: { PUBLIC_URL } });
});

/** The newest message to an address once it has arrived, and the token of its link. */
async function mailTo(address: string, count = 1) {
  await eventually(
    async () => (await mailMessagesTo(test.db, address)).length >= count,
    `mail to ${address}`,
  );
  const messages = await mailMessagesTo(test.db, address);
  const message = messages[messages.length - 1]!;
  const link = message.text?.match(/https:\/\/dipdeck\.example\.org\/[^\s)]+/)?.[0] ?? '';
  return { message, link, token: new URL(link || PUBLIC_URL).searchParams.get('token') ?? '' };
}

describe('address confirmation', () => {
  it('mails a link after sign-up that confirms the address once, within 24 hours', async () => {
    const browser = new Browser(test.app);
    const signUp = await browser.post('/api/auth/sign-up', {
      email: 'new.volunteer@example.org',
      displayName: 'Nova Volunteer',
      password: TEST_PASSWORD,
    });
    expect(signUp.status).toBe(201);
    expect(signUp.body.person.emailConfirmed).toBe(false);
    browser.forgetCsrf();

    const { message, link, token } = await mailTo('new.volunteer@example.org');
    expect(link.startsWith(`${PUBLIC_URL}/confirm-email?token=`)).toBe(true);
    expect(message.html).toContain(link.replace(/&/g, '&amp;'));
    expect(message.subject.length).toBeGreaterThan(0);
    expect(message.text).toMatch(/24 hours/);

    const confirmed = await browser.post('/api/auth/confirm-email', { token });
    expect(confirmed.status).toBe(200);
    expect(confirmed.body.person.emailConfirmed).toBe(true);
    expect((await browser.get('/api/auth/me')).body.person.emailConfirmed).toBe(true);
    const again = await browser.post('/api/auth/confirm-email', { token });
    expect(again.status).toBe(400);
    expect(again.body.error.code).toBe('token_invalid');
    expect(again.body.error.fields).toHaveProperty('token');
    // Confirmed people get no second link.
    expect((await browser.post('/api/auth/confirm-email/resend')).status).toBe(409);
  });

  it('sends a new link on request; the old one stops working, and an expired one never works', async () => {
    const person = await personWithRole(test.db, 'volunteer');
    const browser = new Browser(test.app);
    await browser.signIn(person.email!);
    expect((await browser.post('/api/auth/confirm-email/resend')).status).toBe(202);
    const first = await mailTo(person.email!);
    expect((await browser.post('/api/auth/confirm-email/resend')).status).toBe(202);
    const second = await mailTo(person.email!, 2);
    expect(second.token).not.toBe(first.token);
    expect((await browser.post('/api/auth/confirm-email', { token: first.token })).status).toBe(400);
    await test.db('email_tokens').update({ expires_at: new Date(Date.now() - 1_000).toISOString() });
    expect((await browser.post('/api/auth/confirm-email', { token: second.token })).status).toBe(400);
  });

  it('answers 400 for a malformed token', async () => {
    const answer = await new Browser(test.app).post('/api/auth/confirm-email', { token: 'short' });
    expect(answer.status).toBe(400);
    expect(answer.body.error.fields).toHaveProperty('token');
  });
});

describe('password reset', () => {
  it('answers the same for an unknown address, and mails only a known one', async () => {
    const person = await personWithRole(test.db, 'volunteer');
    const browser = new Browser(test.app);
    const known = await browser.post('/api/auth/password-reset', { email: person.email });
    const unknown = await browser.post('/api/auth/password-reset', { email: 'nobody@example.org' });
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(unknown.body).toEqual(known.body);
    expect(known.body).toEqual({ message: RESET_REQUESTED });
    const { link } = await mailTo(person.email!);
    expect(link.startsWith(`${PUBLIC_URL}/password-reset/confirm?token=`)).toBe(true);
    // The unknown address's job ran too (it came after), and mailed nobody.
    await eventually(
      async () => (await test.queues!.byKey.mail.getJobCounts()).active === 0,
      'the mail jobs finish',
    );
    expect(await mailMessagesTo(test.db, 'nobody@example.org')).toEqual([]);
    expect((await browser.post('/api/auth/password-reset', { email: 'not an address' })).status).toBe(400);
  });

  it('sets a new password once, ends every session of the account, and refuses a reused or expired link', async () => {
    const { browser: oldSession, person } = await signedIn(test, 'volunteer');
    expect((await oldSession.get('/api/auth/me')).status).toBe(200);
    const visitor = new Browser(test.app);
    await visitor.post('/api/auth/password-reset', { email: person.email });
    const { token } = await mailTo(person.email!);

    // A refused password does not use the link up.
    const weak = await visitor.post('/api/auth/password-reset/confirm', { token, password: 'password123' });
    expect(weak.status).toBe(400);
    expect(weak.body.error.fields).toHaveProperty('password');
    const short = await visitor.post('/api/auth/password-reset/confirm', { token, password: 'short' });
    expect(short.status).toBe(400);

    const newPassword = 'a brand new passphrase';
    const done = await visitor.post('/api/auth/password-reset/confirm', { token, password: newPassword });
    expect(done.status).toBe(200);
    expect((await oldSession.get('/api/auth/me')).status).toBe(401);
    expect((await new Browser(test.app).signIn(person.email!, TEST_PASSWORD)).status).toBe(401);
    expect((await new Browser(test.app).signIn(person.email!, newPassword)).status).toBe(200);

    const reused = await visitor.post('/api/auth/password-reset/confirm', {
      token,
      password: 'yet another passphrase',
    });
    expect(reused.status).toBe(400);
    expect(reused.body.error.code).toBe('token_invalid');

    await visitor.post('/api/auth/password-reset', { email: person.email });
    const late = await mailTo(person.email!, 2);
    await test
      .db('email_tokens')
      .where({ person_id: person.id })
      .update({
        expires_at: new Date(Date.now() - 1_000).toISOString(),
      });
    const expired = await visitor.post('/api/auth/password-reset/confirm', {
      token: late.token,
      password: 'one more new passphrase',
    });
    expect(expired.status).toBe(400);
    expect(expired.body.error.code).toBe('token_invalid');
    const audit = await test
      .db('audit_log')
      .where({ action: 'person.password_reset', entity_id: String(person.id) });
    expect(audit).toHaveLength(1);
  });
});

describe('a moderator’s warning', () => {
  it('is recorded and e-mailed to the volunteer with the note', async () => {
    const { browser } = await signedIn(test, 'moderator');
    const volunteer = await personWithRole(test.db, 'volunteer');
    const answer = await browser.post(`/api/desk/volunteers/${volunteer.id}/warning`, {
      note: 'Your last 200 verdicts came less than half a second apart. <b>Slow down</b>, please.',
    });
    expect(answer.status).toBe(201);
    expect(answer.body).toEqual({ recorded: true, emailed: true });
    const { message } = await mailTo(volunteer.email!);
    expect(message.text).toContain('less than half a second apart');
    // The note is the moderator's words, shown as text: no markup of theirs reaches the HTML.
    expect(message.html).not.toContain('<b>Slow down</b>');
    expect(message.html).toContain('&lt;b&gt;Slow down&lt;/b&gt;');
  });
});

describe('deleting one’s own account', () => {
  it('needs the password, removes the e-mail and name, keeps the verdicts anonymously, and ends the session', async () => {
    const { browser, person } = await signedIn(test, 'volunteer');
    const campaignId = await createCampaign(test.db, { status: 'live' });
    const [snippetId] = (await createSnippetFixtures(test.db, campaignId, { targets: 1, real: 1 })).snippetIds
      .real;
    await test.db('verdicts').insert({
      client_id: randomUUID(),
      snippet_id: snippetId,
      person_id: person.id,
      answer: 'dip',
      created_at: new Date().toISOString(),
      updated_at: new Date().toISOString(),
    });
    const wrong = await browser.delete('/api/auth/me', { password: 'not my password' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.fields).toHaveProperty('password');
    expect((await browser.delete('/api/auth/me', {})).status).toBe(400);

    const deleted = await browser.delete('/api/auth/me', { password: TEST_PASSWORD });
    expect(deleted.status).toBe(200);
    expect(deleted.body).toEqual({ deleted: true });
    expect((await browser.get('/api/auth/me')).status).toBe(401);
    const row = await test.db('people').where({ id: person.id }).first();
    expect(row).toMatchObject({ email: null, password_hash: null, display_name: 'Deleted account' });
    expect(row.deleted_at).not.toBeNull();
    expect(Boolean(row.newsletter_opt_in)).toBe(false);
    // The verdict stays in the science record, tied to the anonymous row.
    const [kept] = await test.db('verdicts').where({ person_id: person.id }).count({ n: '*' });
    expect(Number(kept?.n)).toBe(1);
    expect((await new Browser(test.app).signIn(person.email!)).status).toBe(401);
    // No link mailed to the old address can bring the account back.
    expect(
      (await new Browser(test.app).post('/api/auth/password-reset', { email: person.email })).status,
    ).toBe(202);
  });
});

describe('the Admin outbox', () => {
  it('lists what the catcher received, newest first, and shows one message with headers, text and HTML', async () => {
    const { browser } = await signedIn(test, 'admin');
    const list = await browser.get('/api/admin/outbox?limit=5');
    expect(list.status).toBe(200);
    expect(list.body.total).toBeGreaterThan(0);
    expect(list.body.messages.length).toBeLessThanOrEqual(5);
    const times = list.body.messages.map((message: { receivedAt: string }) => Date.parse(message.receivedAt));
    expect([...times].sort((a, b) => b - a)).toEqual(times);
    const [newest] = list.body.messages;
    const one = await browser.get(`/api/admin/outbox/${newest.id}`);
    expect(one.status).toBe(200);
    const { message } = one.body;
    expect(message.headers.find((header: { key: string }) => header.key === 'subject').value).toBe(
      message.subject,
    );
    expect(message.headers.find((header: { key: string }) => header.key === 'from').value).toMatch(/Dipdeck/);
    expect(message.text.length).toBeGreaterThan(0);
    expect(message.html).toMatch(/<html|<div|<p/i);
    expect((await browser.get('/api/admin/outbox/999999')).status).toBe(404);
    expect((await browser.get('/api/admin/outbox?limit=0')).status).toBe(400);
    const scientist = (await signedIn(test, 'scientist')).browser;
    expect((await scientist.get('/api/admin/outbox')).status).toBe(403);
    expect((await request(test.app).get('/api/admin/outbox')).status).toBe(401);
  });
});
