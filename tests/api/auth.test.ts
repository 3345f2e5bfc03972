import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { SESSION_CACHE_MS } from '../../server/auth/session';
import { PERSON_CACHE_MS } from '../../server/db/people';
import {
  afterMs,
  Browser,
  createTestApp,
  personWithRole,
  sessionCookie,
  signedIn,
  TEST_PASSWORD,
  type TestApp,
} from './support/test-app';

let test: TestApp;
beforeAll(async () => {
  test = await createTestApp();
});

const goodSignUp = {
  email: 'new.volunteer@example.com',
  displayName: 'New Volunteer',
  password: 'comet tails are long',
};

describe('POST /api/auth/sign-up', () => {
  it('when the e-mail is malformed, answers 400 naming the email field', async () => {
    const response = await new Browser(test.app).post('/api/auth/sign-up', {
      ...goodSignUp,
      email: 'not-an-email',
    });
    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('validation_failed');
    expect(Object.keys(response.body.error.fields)).toEqual(['email']);
  });

  it('when the password is shorter than 10 characters, answers 400 naming the password field', async () => {
    const response = await new Browser(test.app).post('/api/auth/sign-up', {
      ...goodSignUp,
      password: 'short1',
    });
    expect(response.status).toBe(400);
    expect(response.body.error.fields.password).toMatch(/10 characters/);
  });

  it('when the password is one of the most common, answers 400 naming the password field', async () => {
    // "1234567890" ranks near the top of the SecLists top-1M list that server/auth/common-passwords.txt comes from.
    const response = await new Browser(test.app).post('/api/auth/sign-up', {
      ...goodSignUp,
      email: 'common@example.com',
      password: '1234567890',
    });
    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('password_too_common');
    expect(response.body.error.fields.password).toBeDefined();
  });

  it('when the body is not JSON, answers 415; when it is broken JSON, answers 400', async () => {
    const browser = new Browser(test.app);
    const csrf = await browser.csrf();
    const asForm = await browser.agent
      .post('/api/auth/sign-up')
      .set('X-CSRF-Token', csrf)
      .type('form')
      .send('email=a@example.com');
    expect(asForm.status).toBe(415);
    const broken = await browser.agent
      .post('/api/auth/sign-up')
      .set('X-CSRF-Token', csrf)
      .set('Content-Type', 'application/json')
      .send('{"email": ');
    expect(broken.status).toBe(400);
    expect(broken.body.error.code).toBe('invalid_json');
  });

  it('creates a volunteer, signs them in, and leaves the newsletter off unless they opted in', async () => {
    const browser = new Browser(test.app);
    const response = await browser.post('/api/auth/sign-up', goodSignUp);
    expect(response.status).toBe(201);
    expect(response.body.person).toMatchObject({
      email: goodSignUp.email,
      displayName: 'New Volunteer',
      role: 'volunteer',
      newsletterOptIn: false,
      suspended: false,
    });
    expect(response.body.person).not.toHaveProperty('passwordHash');
    const me = await browser.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.person.email).toBe(goodSignUp.email);
  });

  it('stores a scrypt hash with its parameters, never the password', async () => {
    const row = await test.db('people').where({ email: goodSignUp.email }).first();
    expect(row.password_hash).toMatch(/^scrypt\$17\$8\$1\$/);
    expect(row.password_hash).not.toContain(goodSignUp.password);
  });

  it('when the e-mail is taken (in any letter case), answers 409 naming the email field', async () => {
    const response = await new Browser(test.app).post('/api/auth/sign-up', {
      ...goodSignUp,
      email: goodSignUp.email.toUpperCase(),
    });
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('email_taken');
    expect(response.body.error.fields.email).toBeDefined();
  });
});

describe('POST /api/auth/sign-in', () => {
  it('with a wrong password and with an unknown e-mail, answers the same 401 that does not say which part was wrong', async () => {
    const person = await personWithRole(test.db, 'volunteer');
    const wrongPassword = await new Browser(test.app).signIn(person.email!, 'not the password at all');
    const unknownEmail = await new Browser(test.app).signIn('nobody@example.com', TEST_PASSWORD);
    for (const response of [wrongPassword, unknownEmail]) {
      expect(response.status).toBe(401);
      expect(response.body.error.code).toBe('invalid_credentials');
      expect(response.body.error.message).toBe('E-mail or password is not right');
    }
    expect(wrongPassword.body).toEqual(unknownEmail.body);
  });

  it('gives a new session id at sign-in (no session fixation)', async () => {
    const person = await personWithRole(test.db, 'volunteer');
    const browser = new Browser(test.app);
    const before = sessionCookie(await browser.get('/api/auth/csrf'));
    const signIn = await browser.signIn(person.email!);
    expect(signIn.status).toBe(200);
    const after = sessionCookie(signIn);
    expect(before).toBeDefined();
    expect(after).toBeDefined();
    expect(after).not.toBe(before);
  });

  it('sets the session cookie httpOnly and SameSite=Lax', async () => {
    const person = await personWithRole(test.db, 'volunteer');
    const response = await new Browser(test.app).signIn(person.email!);
    const cookie = ([] as string[]).concat(response.headers['set-cookie'] ?? []).join(';');
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it('refuses a suspended account with 403', async () => {
    const person = await personWithRole(test.db, 'volunteer');
    await test.db('people').where({ id: person.id }).update({ suspended_at: new Date().toISOString() });
    const response = await new Browser(test.app).signIn(person.email!);
    expect(response.status).toBe(403);
    expect(response.body.error.code).toBe('account_suspended');
  });
});

describe('sessions', () => {
  it('GET /api/auth/me without a session answers 401', async () => {
    const response = await request(test.app).get('/api/auth/me');
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('not_signed_in');
  });

  it('a POST without the X-CSRF-Token header answers 403, with it the same request goes through', async () => {
    const { browser } = await signedIn(test, 'volunteer');
    const withoutToken = await browser.agent.post('/api/auth/sign-out');
    expect(withoutToken.status).toBe(403);
    expect(withoutToken.body.error.code).toBe('csrf_invalid');
    expect((await browser.get('/api/auth/me')).status).toBe(200);
    const withToken = await browser.post('/api/auth/sign-out');
    expect(withToken.status).toBe(204);
    expect((await browser.get('/api/auth/me')).status).toBe(401);
  });

  it('a CSRF token from before sign-in no longer works after it', async () => {
    const person = await personWithRole(test.db, 'volunteer');
    const browser = new Browser(test.app);
    const oldToken = await browser.csrf();
    await browser.signIn(person.email!);
    const response = await browser.agent.post('/api/auth/sign-out').set('X-CSRF-Token', oldToken);
    expect(response.status).toBe(403);
  });

  it('ends a session whose sign-in is older than the absolute timeout', async () => {
    const { browser } = await signedIn(test, 'volunteer');
    const [row] = await test.db('sessions').orderBy('expired', 'desc').limit(1);
    const stored = typeof row.sess === 'string' ? JSON.parse(row.sess) : row.sess;
    stored.passport.user.signedInAt = new Date(
      Date.now() - test.config.sessionAbsoluteMs - 60_000,
    ).toISOString();
    await test
      .db('sessions')
      .where({ sid: row.sid })
      .update({ sess: JSON.stringify(stored) });
    // Changed behind this process's back, the row is read again within SESSION_CACHE_MS.
    await afterMs(SESSION_CACHE_MS, async () => {
      expect((await browser.get('/api/auth/me')).status).toBe(401);
    });
  });

  it('ends sessions begun before the person’s sessions were revoked', async () => {
    const { browser, person } = await signedIn(test, 'volunteer');
    expect((await browser.get('/api/auth/me')).status).toBe(200);
    await test
      .db('people')
      .where({ id: person.id })
      .update({ sessions_valid_after: new Date(Date.now() + 1000).toISOString() });
    // Written by another process (not through server/db/people.ts), it shows within PERSON_CACHE_MS.
    await afterMs(PERSON_CACHE_MS, async () => {
      expect((await browser.get('/api/auth/me')).status).toBe(401);
    });
  });
});

describe('PATCH /api/auth/me', () => {
  it('lets a person opt in and out of the newsletter and records each consent change', async () => {
    const { browser, person } = await signedIn(test, 'volunteer');
    const optIn = await browser.patch('/api/auth/me', { newsletterOptIn: true });
    expect(optIn.status).toBe(200);
    expect(optIn.body.person.newsletterOptIn).toBe(true);
    const row = await test.db('people').where({ id: person.id }).first();
    expect(row.newsletter_opt_in_at).toBeTruthy();
    const optOut = await browser.patch('/api/auth/me', { newsletterOptIn: false, displayName: 'Renamed' });
    expect(optOut.body.person).toMatchObject({ newsletterOptIn: false, displayName: 'Renamed' });
    const consents = await test
      .db('audit_log')
      .where({ entity_id: String(person.id), action: 'person.consent_changed' });
    expect(consents).toHaveLength(2);
  });

  it('refuses a visitor (401), an empty change and a change of role (400)', async () => {
    expect((await new Browser(test.app).patch('/api/auth/me', { newsletterOptIn: true })).status).toBe(401);
    const { browser } = await signedIn(test, 'volunteer');
    expect((await browser.patch('/api/auth/me', {})).status).toBe(400);
    const promote = await browser.patch('/api/auth/me', { role: 'admin' });
    expect(promote.status).toBe(400);
  });
});
