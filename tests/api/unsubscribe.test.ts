// One-click unsubscribe (RFC 8058) and its page: no sign-in, no CSRF token, at once.
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { resolveSessionSecret } from '../../server/auth/session-secret';
import { updatePerson } from '../../server/db/people';
import { signUnsubscribeToken } from '../../server/mail/unsubscribe-token';
import { createTestApp, personWithRole, type TestApp } from './support/test-app';

let test: TestApp;
let secret: string;

beforeAll(async () => {
  test = await createTestApp();
  secret = resolveSessionSecret(test.config.sessionSecret, test.config.dataDir);
});

async function subscriber() {
  const person = await personWithRole(test.db, 'volunteer');
  await updatePerson(test.db, person.id, { newsletterOptIn: true });
  return { person, token: signUnsubscribeToken(secret, person.id) };
}

const optedIn = async (id: number) =>
  Boolean((await test.db('people').where({ id }).first('newsletter_opt_in')).newsletter_opt_in);

describe('unsubscribe', () => {
  it('shows a page with one button, and unsubscribes only when it is pressed', async () => {
    const { person, token } = await subscriber();
    const shown = await request(test.app).get(`/api/unsubscribe?token=${encodeURIComponent(token)}`);
    expect(shown.status).toBe(200);
    expect(shown.type).toBe('text/html');
    expect(shown.text).toContain('Stop the Dipdeck newsletter?');
    expect(shown.text).toMatch(/<form method="post"/);
    // Opening the link (a mail scanner may) changes nothing.
    expect(await optedIn(person.id)).toBe(true);
  });

  it('takes a one-click POST with no session and no CSRF token, at once, and says so', async () => {
    const { person, token } = await subscriber();
    const clicked = await request(test.app)
      .post(`/api/unsubscribe?token=${encodeURIComponent(token)}`)
      .type('form')
      .send('List-Unsubscribe=One-Click');
    expect(clicked.status).toBe(200);
    expect(clicked.text).toContain('You are unsubscribed');
    expect(await optedIn(person.id)).toBe(false);
    const audit = await test
      .db('audit_log')
      .where({ action: 'person.unsubscribed', entity_id: String(person.id) });
    expect(audit).toHaveLength(1);
    // Again: still unsubscribed, nothing new on the record; the page says there is nothing to do.
    const again = await request(test.app)
      .post(`/api/unsubscribe?token=${encodeURIComponent(token)}`)
      .set('Accept', 'application/json');
    expect(again.body).toEqual({ unsubscribed: true });
    expect(
      await test.db('audit_log').where({ action: 'person.unsubscribed', entity_id: String(person.id) }),
    ).toHaveLength(1);
    const page = await request(test.app).get(`/api/unsubscribe?token=${encodeURIComponent(token)}`);
    expect(page.text).toContain('You do not get the newsletter');
  });

  it('refuses a token that was changed, made for someone else, or made with another secret', async () => {
    const { person, token } = await subscriber();
    const other = await subscriber();
    const [, mac] = token.split('.');
    for (const bad of [
      `${other.person.id}.${mac}`,
      `${token}x`,
      token.replace(/.$/, (c) => (c === 'A' ? 'B' : 'A')),
      signUnsubscribeToken('another secret that is long enough to be one', person.id),
      '',
    ]) {
      const answer = await request(test.app)
        .post(`/api/unsubscribe?token=${encodeURIComponent(bad)}`)
        .set('Accept', 'application/json');
      expect(answer.status, bad).toBe(400);
      expect(answer.body.error.fields).toHaveProperty('token');
    }
    const page = await request(test.app).get(`/api/unsubscribe?token=${encodeURIComponent(`${token}x`)}`);
    expect(page.status).toBe(400);
    expect(page.text).toContain('This link does not work');
    expect(await optedIn(person.id)).toBe(true);
    expect(await optedIn(other.person.id)).toBe(true);
    expect((await request(test.app).post('/api/unsubscribe')).status).toBe(400);
  });
});
