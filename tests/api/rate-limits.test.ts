import { randomUUID } from 'node:crypto';
import type { Redis } from 'ioredis';
import pino from 'pino';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/http/app';
import { RATE_LIMITS, type RateLimitName } from '../../server/http/rate-limits';
import { createRedisClient } from '../../worker/redis-connection';
import { TEST_REDIS_URL } from '../worker/support/backends';
import { Browser, createTestApp, personWithRole, signedIn, type TestApp } from './support/test-app';

type Overrides = Partial<Record<RateLimitName, { windowMs: number; limit: number }>>;

// Each scrypt costs about a second here, so the behaviour is tested on small limits; the real numbers
// are checked through the RateLimit-Policy header the server sends (IETF draft-8 of RateLimit headers).
const small = (limit: number) => ({ windowMs: 60_000, limit });

let test: TestApp;
beforeAll(async () => {
  // With queues: the password-reset route hands its work to the mail queue.
  test = await createTestApp({ queues: true });
});

function appWith(overrides: Overrides, options: { redis?: Redis; prefix?: string } = {}) {
  const config = { ...test.config, trustProxy: true, queuePrefix: options.prefix ?? test.config.queuePrefix };
  return createApp({
    config,
    db: test.db,
    queues: test.queues,
    logger: pino({ level: 'silent' }),
    rateLimitOverrides: overrides,
    rateLimitRedis: options.redis,
  }).app;
}

/** A browser at its own IP address (through X-Forwarded-For, which the app trusts here). */
function browserAt(app: ReturnType<typeof appWith>, ip: string): Browser {
  const browser = new Browser(app);
  const agent = browser.agent;
  for (const method of ['get', 'post', 'patch', 'delete'] as const) {
    const original = agent[method].bind(agent);
    agent[method] = ((url: string) => original(url).set('X-Forwarded-For', ip)) as never;
  }
  return browser;
}

const policyQuota = (header: unknown): number => Number(/q=(\d+)/.exec(String(header))?.[1]);

describe('abuse limits on sign-in', () => {
  it('refuses the 4th failed sign-in of an address from one IP with 429, Retry-After and a clear message', async () => {
    const app = appWith({ signInPerAddressAndIp: small(3) });
    const person = await personWithRole(test.db, 'volunteer');
    const browser = browserAt(app, '203.0.113.10');
    for (let attempt = 0; attempt < 3; attempt += 1) {
      expect((await browser.signIn(person.email!, 'a wrong passphrase')).status).toBe(401);
    }
    const refused = await browser.signIn(person.email!, 'a wrong passphrase');
    expect(refused.status).toBe(429);
    expect(refused.body.error).toMatchObject({ code: 'rate_limited', message: /try again in a minute/ });
    expect(Number(refused.headers['retry-after'])).toBeGreaterThan(0);
    // Even the right password waits: otherwise the limit would only slow the guessing down.
    expect((await browser.signIn(person.email!)).status).toBe(429);
    // Another IP, and the same IP for another address, are not held up by it.
    expect((await browserAt(app, '203.0.113.11').signIn(person.email!)).status).toBe(200);
    const other = await personWithRole(test.db, 'volunteer');
    expect((await browser.signIn(other.email!)).status).toBe(200);
  });

  it('does not count successful sign-ins', async () => {
    const app = appWith({
      signInPerAddressAndIp: small(2),
      signInPerIp: small(2),
      signInPerAddress: small(2),
    });
    const person = await personWithRole(test.db, 'volunteer');
    for (let attempt = 0; attempt < 5; attempt += 1) {
      expect((await browserAt(app, '203.0.113.20').signIn(person.email!)).status).toBe(200);
    }
  });

  it('counts failures on one address from many IPs, and failures from one IP on many addresses', async () => {
    const app = appWith({ signInPerAddress: small(2), signInPerIp: small(3) });
    const person = await personWithRole(test.db, 'volunteer');
    expect((await browserAt(app, '198.51.100.1').signIn(person.email!, 'wrong one')).status).toBe(401);
    expect((await browserAt(app, '198.51.100.2').signIn(person.email!, 'wrong two')).status).toBe(401);
    expect((await browserAt(app, '198.51.100.3').signIn(person.email!)).status).toBe(429);

    const sprayer = browserAt(app, '198.51.100.9');
    for (const name of ['ann', 'bo', 'cy']) {
      expect((await sprayer.signIn(`${name}@example.com`, 'Summer2026!')).status).toBe(401);
    }
    expect((await sprayer.signIn('dee@example.com', 'Summer2026!')).status).toBe(429);
  });

  it('answers an unknown address and a known one alike when their limit is reached', async () => {
    const app = appWith({ signInPerAddressAndIp: small(1) });
    const person = await personWithRole(test.db, 'volunteer');
    const browser = browserAt(app, '192.0.2.44');
    await browser.signIn(person.email!, 'wrong');
    await browser.signIn('unknown-person@example.com', 'wrong');
    const known = await browser.signIn(person.email!, 'wrong');
    const unknown = await browser.signIn('unknown-person@example.com', 'wrong');
    expect([known.status, unknown.status]).toEqual([429, 429]);
    expect(unknown.body).toEqual(known.body);
  });

  it('uses the real numbers by default, and says them in RateLimit-Policy', async () => {
    const response = await new Browser(test.app).signIn('policy-check@example.com', 'wrong');
    const policies = String(response.headers['ratelimit-policy']);
    expect(policies).toContain(`"signInPerIp"; q=${RATE_LIMITS.signInPerIp.limit}; w=900`);
    expect(policies).toContain(`"signInPerAddress"; q=${RATE_LIMITS.signInPerAddress.limit}; w=3600`);
    expect(policyQuota(/"signInPerAddressAndIp"[^,]*/.exec(policies)?.[0])).toBe(
      RATE_LIMITS.signInPerAddressAndIp.limit,
    );
  });
});

describe('abuse limits on sign-up, password reset and confirmation mail', () => {
  it('refuses the 3rd sign-up from one IP, not one from another IP', async () => {
    const app = appWith({ signUpPerIp: small(2) });
    const signUp = (ip: string) =>
      browserAt(app, ip).post('/api/auth/sign-up', {
        email: `new-${randomUUID().slice(0, 8)}@example.com`,
        displayName: 'New volunteer',
        password: 'a long enough passphrase',
      });
    expect((await signUp('203.0.113.50')).status).toBe(201);
    expect((await signUp('203.0.113.50')).status).toBe(201);
    expect((await signUp('203.0.113.50')).status).toBe(429);
    expect((await signUp('203.0.113.51')).status).toBe(201);
  });

  it('limits reset links per address whether or not it has an account, and per IP', async () => {
    const app = appWith({ passwordResetPerAddress: small(2), passwordResetPerIp: small(5) });
    const person = await personWithRole(test.db, 'volunteer');
    const ask = (ip: string, email: string) => browserAt(app, ip).post('/api/auth/password-reset', { email });
    for (const email of [person.email!, 'no-account@example.com']) {
      expect((await ask('203.0.113.60', email)).status).toBe(202);
      expect((await ask('203.0.113.61', email)).status).toBe(202);
      expect((await ask('203.0.113.62', email)).status).toBe(429);
    }
    for (let i = 0; i < 5; i += 1) expect((await ask('203.0.113.70', `p${i}@example.com`)).status).toBe(202);
    expect((await ask('203.0.113.70', 'p9@example.com')).status).toBe(429);
  });

  it('limits refused reset and confirmation tokens per IP', async () => {
    const app = appWith({ emailTokenFailuresPerIp: small(2) });
    const browser = browserAt(app, '203.0.113.80');
    const guess = 'x'.repeat(40);
    expect((await browser.post('/api/auth/confirm-email', { token: guess })).status).toBe(400);
    expect(
      (await browser.post('/api/auth/password-reset/confirm', { token: guess, password: 'a new passphrase' }))
        .status,
    ).toBe(400);
    expect((await browser.post('/api/auth/confirm-email', { token: guess })).status).toBe(429);
  });

  it('limits how often one person asks for the confirmation mail again', async () => {
    const app = appWith({ confirmationResendPerPerson: small(1) });
    const person = await personWithRole(test.db, 'volunteer');
    const browser = browserAt(app, '203.0.113.90');
    await browser.signIn(person.email!);
    const first = await browser.post('/api/auth/confirm-email/resend');
    expect(first.status).not.toBe(429);
    expect((await browser.post('/api/auth/confirm-email/resend')).status).toBe(429);
  });
});

describe('abuse limits on API tokens', () => {
  it('limits requests per token, each token on its own', async () => {
    const app = appWith({ tokenUsePerToken: small(3) });
    const { browser } = await signedIn(test, 'scientist');
    const first = (await browser.post('/api/tokens', { name: 'limit one' })).body.secret as string;
    const second = (await browser.post('/api/tokens', { name: 'limit two' })).body.secret as string;
    const me = (secret: string) => request(app).get('/api/auth/me').set('Authorization', `Bearer ${secret}`);
    for (let i = 0; i < 3; i += 1) expect((await me(first)).status).toBe(200);
    expect((await me(first)).status).toBe(429);
    expect((await me(second)).status).toBe(200);
  });

  it('limits refused tokens per IP, and does not count requests without a token', async () => {
    const app = appWith({ tokenFailuresPerIp: small(2) });
    const guess = (ip: string) =>
      request(app).get('/api/auth/me').set('X-Forwarded-For', ip).set('Authorization', 'Bearer dd_guess');
    expect((await guess('203.0.113.100')).status).toBe(401);
    expect((await guess('203.0.113.100')).status).toBe(401);
    expect((await guess('203.0.113.100')).status).toBe(429);
    expect((await guess('203.0.113.101')).status).toBe(401);
    for (let i = 0; i < 3; i += 1) {
      const plain = await request(app).get('/api/auth/me').set('X-Forwarded-For', '203.0.113.102');
      expect(plain.status).toBe(401);
    }
  });
});

describe.runIf(TEST_REDIS_URL)('abuse limits kept in Redis', () => {
  const clients: Redis[] = [];
  afterAll(async () => {
    await Promise.all(clients.map((client) => client.quit().catch(() => client.disconnect())));
  });
  // The server's own kind of client; it fails commands while it is not connected, so wait for that.
  const client = async () => {
    const made = createRedisClient(TEST_REDIS_URL!, () => {});
    clients.push(made);
    if (made.status !== 'ready') await new Promise((resolve) => made.once('ready', resolve));
    return made;
  };

  it('hold across server processes that share the Redis and the prefix', async () => {
    const prefix = `rl-${randomUUID().slice(0, 8)}`;
    const one = appWith({ signInPerAddressAndIp: small(2) }, { redis: await client(), prefix });
    const two = appWith({ signInPerAddressAndIp: small(2) }, { redis: await client(), prefix });
    const other = appWith(
      { signInPerAddressAndIp: small(2) },
      { redis: await client(), prefix: `${prefix}-x` },
    );
    const person = await personWithRole(test.db, 'volunteer');
    expect((await browserAt(one, '203.0.113.120').signIn(person.email!, 'wrong')).status).toBe(401);
    expect((await browserAt(two, '203.0.113.120').signIn(person.email!, 'wrong')).status).toBe(401);
    expect((await browserAt(one, '203.0.113.120').signIn(person.email!, 'wrong')).status).toBe(429);
    expect((await browserAt(two, '203.0.113.120').signIn(person.email!, 'wrong')).status).toBe(429);
    // A deployment with another prefix counts on its own.
    expect((await browserAt(other, '203.0.113.120').signIn(person.email!, 'wrong')).status).toBe(401);
    const keys = await clients[0]!.keys(`${prefix}:rate:*`);
    expect(keys.length).toBeGreaterThan(0);
    // Counted by a hash: no address is kept in Redis.
    expect(keys.join(' ')).not.toContain(person.email!);
    await clients[0]!.del(...keys);
  });

  it('let requests through rather than refuse everyone when Redis cannot be reached', async () => {
    const unreachable = createRedisClient('redis://127.0.0.1:1', () => {});
    clients.push(unreachable);
    const app = appWith({ signInPerAddressAndIp: small(1) }, { redis: unreachable });
    const person = await personWithRole(test.db, 'volunteer');
    expect((await browserAt(app, '203.0.113.130').signIn(person.email!, 'wrong')).status).toBe(401);
    expect((await browserAt(app, '203.0.113.130').signIn(person.email!)).status).toBe(200);
  });
});
