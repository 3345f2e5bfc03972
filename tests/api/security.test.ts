import { Writable } from 'node:stream';
import pino from 'pino';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createCampaign } from '../../seeds/factories/campaigns';
import { createApp } from '../../server/http/app';
import { INVALID_CREDENTIALS } from '../../server/services/auth/check-credentials';
import {
  Browser,
  createTestApp,
  personWithRole,
  signedIn,
  TEST_PASSWORD,
  type TestApp,
} from './support/test-app';

/** The app of `test`, with a logger whose lines the test can read. */
function withLogLines(test: TestApp, env: Record<string, string> = {}) {
  const lines: Record<string, unknown>[] = [];
  const sink = new Writable({
    write(chunk, _encoding, done) {
      for (const line of String(chunk).split('\n').filter(Boolean)) lines.push(JSON.parse(line));
      done();
    },
  });
  const config = { ...test.config, ...env };
  const { app } = createApp({ config, db: test.db, logger: pino({ level: 'info' }, sink) });
  return { app, lines, events: (name: string) => lines.filter((line) => line.event === name) };
}

function directives(header: string | undefined): Map<string, string[]> {
  const parsed = new Map<string, string[]>();
  for (const part of (header ?? '').split(';')) {
    const [name, ...values] = part.trim().split(/\s+/);
    if (name) parsed.set(name, values);
  }
  return parsed;
}

let test: TestApp;
beforeAll(async () => {
  test = await createTestApp();
});

describe('security headers', () => {
  it('send a Content-Security-Policy that runs only our own scripts and styles, and nothing inline', async () => {
    const response = await request(test.app).get('/api/health');
    const policy = directives(response.headers['content-security-policy']);
    expect(policy.get('default-src')).toEqual(["'self'"]);
    expect(policy.get('script-src')).toEqual(["'self'"]);
    expect(policy.get('script-src-attr')).toEqual(["'none'"]);
    expect(policy.get('style-src')).toEqual(["'self'"]);
    expect(policy.get('style-src-elem')).toEqual(["'self'"]);
    expect(policy.get('object-src')).toEqual(["'none'"]);
    expect(policy.get('frame-ancestors')).toEqual(["'none'"]);
    expect(policy.get('base-uri')).toEqual(["'self'"]);
    expect(policy.get('form-action')).toEqual(["'self'"]);
    for (const [name, values] of policy) {
      expect(values, name).not.toContain("'unsafe-eval'");
      if (name.startsWith('script')) expect(values, name).not.toContain("'unsafe-inline'");
      expect(
        values.filter((value) => /^https?:$|^\*$/.test(value)),
        name,
      ).toEqual([]);
    }
  });

  it('send no X-Powered-By, nosniff, a refusal to be framed, and no HSTS outside production', async () => {
    const response = await request(test.app).get('/api/health');
    expect(response.headers['x-powered-by']).toBeUndefined();
    expect(response.headers['x-content-type-options']).toBe('nosniff');
    expect(response.headers['x-frame-options']).toBe('DENY');
    expect(response.headers['referrer-policy']).toBe('no-referrer');
    expect(response.headers['strict-transport-security']).toBeUndefined();
  });

  it('in production: HSTS for a year with subdomains, and the upgrade of insecure requests', async () => {
    const { app } = withLogLines(test, { isProduction: true } as never);
    const response = await request(app).get('/api/health');
    expect(response.headers['strict-transport-security']).toBe('max-age=31536000; includeSubDomains');
    expect(directives(response.headers['content-security-policy']).has('upgrade-insecure-requests')).toBe(
      true,
    );
  });

  it('mark every signed-in API answer, downloads included, Cache-Control: no-store', async () => {
    const { browser } = await signedIn(test, 'scientist');
    const token = await browser.post('/api/tokens', { name: 'cache check' });
    const bearer = { Authorization: `Bearer ${token.body.secret}` };
    const answers = [
      await browser.get('/api/auth/me'),
      await browser.get('/api/campaigns'),
      await browser.get('/api/tokens'),
      await request(test.app).get('/api/auth/me').set(bearer),
      await browser.get(`/api/campaigns/${await createCampaign(test.db)}/consensus?format=csv`),
    ];
    expect(answers.map((answer) => answer.status)).toEqual([200, 200, 200, 200, 200]);
    for (const answer of answers) expect(answer.headers['cache-control']).toBe('no-store');
  });
});

describe('the session cookie', () => {
  it('is HttpOnly, SameSite=Lax and Path=/ with no Domain', async () => {
    const person = await personWithRole(test.db, 'volunteer');
    const response = await new Browser(test.app).signIn(person.email!);
    const cookie = ([] as string[]).concat(response.headers['set-cookie'] ?? []).join('\n');
    expect(cookie).toMatch(/^dipdeck\.sid=/);
    expect(cookie).toMatch(/; HttpOnly/);
    expect(cookie).toMatch(/; SameSite=Lax/);
    expect(cookie).toMatch(/; Path=\//);
    expect(cookie).not.toMatch(/; Domain=/i);
  });

  it('in production behind a TLS proxy is also Secure, under the __Host- prefix', async () => {
    const { app } = withLogLines(test, { isProduction: true, trustProxy: true } as never);
    const person = await personWithRole(test.db, 'volunteer');
    // A cookie jar keeps Secure cookies off plain http, so the test carries the session cookie by hand.
    const csrf = await request(app).get('/api/auth/csrf').set('X-Forwarded-Proto', 'https');
    const sessionCookie = String(csrf.headers['set-cookie']?.[0]).split(';')[0]!;
    const response = await request(app)
      .post('/api/auth/sign-in')
      .set('X-Forwarded-Proto', 'https')
      .set('Cookie', sessionCookie)
      .set('X-CSRF-Token', csrf.body.token)
      .send({ email: person.email, password: TEST_PASSWORD });
    expect(response.status).toBe(200);
    const cookie = ([] as string[]).concat(response.headers['set-cookie'] ?? []).join('\n');
    expect(cookie).toMatch(/^__Host-dipdeck\.sid=/);
    expect(cookie).toMatch(/; Secure/);
    expect(cookie).toMatch(/; HttpOnly/);
    expect(cookie).toMatch(/; Path=\//);
    expect(cookie).not.toMatch(/; Domain=/i);
  });
});

describe('security events in the log', () => {
  it('a failed sign-in is logged with its reason and a hash of the address, never the address or password', async () => {
    const { app, events, lines } = withLogLines(test);
    const person = await personWithRole(test.db, 'volunteer');
    const wrongPassword = await new Browser(app).signIn(person.email!, 'not the password at all');
    const unknown = await new Browser(app).signIn('nobody-here@example.com', 'not the password at all');
    // The same answer either way: nothing tells whether the account exists.
    expect(wrongPassword.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(unknown.body).toEqual(wrongPassword.body);
    expect(wrongPassword.body.error.message).toBe(INVALID_CREDENTIALS);

    const failures = events('sign_in_failed');
    expect(failures).toHaveLength(2);
    expect(failures.map((event) => event.reason)).toEqual(['invalid_credentials', 'invalid_credentials']);
    expect(failures[0]!.address).toMatch(/^[\w-]{22}$/);
    expect(failures[0]!.address).not.toBe(failures[1]!.address);
    const text = JSON.stringify(lines);
    expect(text).not.toContain(person.email!);
    expect(text).not.toContain('nobody-here');
    expect(text).not.toContain('not the password at all');
  });

  it('token use and refused tokens are logged; the secret never is', async () => {
    const { app, events, lines } = withLogLines(test);
    const { browser } = await signedIn(test, 'scientist');
    const made = await browser.post('/api/tokens', { name: 'log check' });
    await request(app).get('/api/auth/me').set('Authorization', `Bearer ${made.body.secret}`).expect(200);
    await request(app).get('/api/auth/me').set('Authorization', 'Bearer dd_not-a-real-token').expect(401);
    expect(events('token_used')).toEqual([
      expect.objectContaining({ tokenId: made.body.token.id, method: 'GET', path: '/auth/me' }),
    ]);
    expect(events('token_rejected')).toHaveLength(1);
    expect(JSON.stringify(lines)).not.toContain(made.body.secret);
  });

  it("an admin's change of role or suspension is logged besides the audit log", async () => {
    const { app, events } = withLogLines(test);
    const admin = await personWithRole(test.db, 'admin');
    const target = await personWithRole(test.db, 'volunteer');
    const browser = new Browser(app);
    await browser.signIn(admin.email!);
    await browser.patch(`/api/admin/people/${target.id}`, { role: 'moderator' }).then((r) => {
      expect(r.status).toBe(200);
    });
    await browser.patch(`/api/admin/people/${target.id}`, { suspended: true }).then((r) => {
      expect(r.status).toBe(200);
    });
    expect(events('person_changed')).toEqual([
      expect.objectContaining({
        actorId: admin.id,
        personId: target.id,
        role: 'moderator',
        suspended: false,
      }),
      expect.objectContaining({ actorId: admin.id, personId: target.id, role: 'moderator', suspended: true }),
    ]);
  });
});
