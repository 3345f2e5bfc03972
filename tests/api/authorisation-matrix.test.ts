// Every API route, called by every kind of caller: the route table's rules are held to the product's
// (tests/api/support/expected-access.ts), and the app is held to the route table. Refusals must be
// exactly 401 or 403 with their code; anything allowed must never be a refusal or a crash.
import express, { type Router } from 'express';
import request from 'supertest';
import { beforeAll, describe, expect, it, vi } from 'vitest';
import { createCampaign } from '../../seeds/factories/campaigns';
import { createSnippetFixtures } from '../../seeds/factories/snippets';
import { generateApiToken } from '../../server/auth/api-tokens';
import type { Role } from '../../server/auth/roles';
import { insertApiToken, revokeApiToken } from '../../server/db/api-tokens';
import { insertMailMessage } from '../../server/db/mail-messages';
import { insertNewsletter } from '../../server/db/newsletters';
import { type PersonRow, updatePerson } from '../../server/db/people';
import { nowIso } from '../../server/db/rows';
import { createApp } from '../../server/http/app';
import type { Access, AnyRouteDef } from '../../server/http/define-route';
import { routeTable } from '../../server/http/route-table';
import { EXPECTED_ACCESS, REFUSES_SUSPENDED, routeKey } from './support/expected-access';
import { Browser, createTestApp, signedIn, type TestApp } from './support/test-app';

// The order of the roles, written here rather than read from server/auth/roles.ts, so that a change
// there shows up as refusals that differ from these expectations.
const ROLE_ORDER: Role[] = ['volunteer', 'moderator', 'scientist', 'admin'];
const atLeast = (role: Role, wanted: Role) => ROLE_ORDER.indexOf(role) >= ROLE_ORDER.indexOf(wanted);

const PLACEHOLDER_ID = '999999';
const PLACEHOLDER_JOB = 'housekeeping:999999';

interface Caller {
  name: string;
  role: Role | null;
  suspended: boolean;
  person?: PersonRow;
  browser?: Browser;
  secret?: string;
}

type Refusal = { status: 401 | 403; code: string };
type Expected = 'allowed' | Refusal;

function expectedFor(key: string, access: Access, caller: Caller): Expected {
  if (access === 'public') {
    return caller.suspended && REFUSES_SUSPENDED.has(key)
      ? { status: 403, code: 'account_suspended' }
      : 'allowed';
  }
  if (!caller.role) return { status: 401, code: 'not_signed_in' };
  if (access === 'signed-in') return 'allowed';
  if (caller.suspended) return { status: 403, code: 'account_suspended' };
  return atLeast(caller.role, access) ? 'allowed' : { status: 403, code: 'forbidden' };
}

let test: TestApp;
let routes: AnyRouteDef[];
const callers = new Map<string, Caller>();
// Real rows for the routes that read one, so that those handlers run through; changes go to placeholders.
const realIds = new Map<string, string>();

/** Fills a route's parameters: a real id for reading where one exists, else a placeholder. */
function urlOf(route: AnyRouteDef): string {
  const filled = route.path.replace(/:(\w+)/g, (_whole, name: string) => {
    if (name === 'clientId') return 'matrix-placeholder-verdict';
    if (name === 'code') return 'burst';
    if (name !== 'id') throw new Error(`${routeKey(route.method, route.path)}: no value for :${name}`);
    if (route.path.startsWith('/jobs/') || route.path.startsWith('/admin/jobs/')) return PLACEHOLDER_JOB;
    if (route.method !== 'get') return PLACEHOLDER_ID;
    const prefix = [...realIds.keys()].find((start) => route.path.startsWith(start));
    return prefix ? realIds.get(prefix)! : PLACEHOLDER_ID;
  });
  return `/api${filled}`;
}

// Bodies for routes whose handler would otherwise stop at validation before the check under test, or
// whose rate limit counts by the address sent (a new address each time, still refused by validation
// or unknown, so nothing is signed in or mailed).
let probe = 0;
const newAddress = () => `matrix-probe-${++probe}@example.com`;
const PROBE_BODIES: Record<string, () => object> = {
  'POST /verdicts': () => ({ clientId: `matrix-probe-${++probe}`, snippetId: 999_999, answer: 'flat' }),
  'POST /auth/password-reset': () => ({ email: newAddress() }),
  'POST /auth/sign-in': () => ({ email: newAddress() }),
};

async function call(caller: Caller, route: AnyRouteDef): Promise<request.Response> {
  const url = urlOf(route);
  const key = routeKey(route.method, route.path);
  const body = route.method === 'get' ? undefined : (PROBE_BODIES[key]?.() ?? {});
  if (caller.secret) {
    const sent = request(test.app)[route.method](url).set('Authorization', `Bearer ${caller.secret}`);
    return body === undefined ? sent : sent.send(body);
  }
  const browser = caller.browser!;
  if (route.method === 'get') return browser.get(url);
  const token = await browser.csrf();
  return browser.agent[route.method](url).set('X-CSRF-Token', token).send(body);
}

/** What is wrong with this answer, or null when it is what the rules say. */
function mismatch(expected: Expected, response: request.Response): string | null {
  const code = response.body?.error?.code as string | undefined;
  const got = `got ${response.status}${code ? ` ${code}` : ''}`;
  if (response.status === 429) return `rate limited (${got}): the matrix calls too often from one address`;
  if (expected === 'allowed') {
    if (response.status === 401 || response.status === 403 || response.status >= 500) {
      return `expected to be let in, ${got}`;
    }
    if (String(response.body?.error?.message ?? '').startsWith('No API route')) {
      return `expected to be let in, but no route answered (${got})`;
    }
    return null;
  }
  return response.status === expected.status && code === expected.code
    ? null
    : `expected ${expected.status} ${expected.code}, ${got}`;
}

// Sign-out ends the session the later calls use, so it comes last.
const inCallOrder = () =>
  [...routes].sort((a, b) => Number(a.path === '/auth/sign-out') - Number(b.path === '/auth/sign-out'));

/** Calls every route as this caller; answers each route's status, and the mismatches found. */
async function sweep(caller: Caller): Promise<{ statuses: Map<string, number>; problems: string[] }> {
  const statuses = new Map<string, number>();
  const problems: string[] = [];
  for (const route of inCallOrder()) {
    const key = routeKey(route.method, route.path);
    const access = EXPECTED_ACCESS[key];
    if (!access) continue; // reported by the table test
    const response = await call(caller, route);
    statuses.set(key, response.status);
    const problem = mismatch(expectedFor(key, access, caller), response);
    if (problem) problems.push(`${key} as ${caller.name}: ${problem}`);
  }
  return { statuses, problems };
}

async function tokenFor(person: PersonRow): Promise<string> {
  const { secret, hash, displayPrefix } = generateApiToken();
  await insertApiToken(test.db, {
    personId: person.id,
    name: 'matrix',
    tokenHash: hash,
    tokenPrefix: displayPrefix,
  });
  return secret;
}

beforeAll(async () => {
  test = await createTestApp({ queues: true });
  routes = routeTable(createApp({ config: test.config, db: test.db }).deps);

  const campaignId = await createCampaign(test.db, { status: 'live' });
  const { targetIds, snippetIds } = await createSnippetFixtures(test.db, campaignId, {
    targets: 2,
    real: 3,
    planted: 1,
    quiet: 1,
  });
  callers.set('anonymous', {
    name: 'anonymous',
    role: null,
    suspended: false,
    browser: new Browser(test.app),
  });
  for (const role of ROLE_ORDER) {
    const { browser, person } = await signedIn(test, role);
    callers.set(role, { name: role, role, suspended: false, browser, person });
  }
  // An admin suspended after signing in: everything but the role is what refuses them.
  const suspended = await signedIn(test, 'admin');
  await updatePerson(test.db, suspended.person.id, { suspendedAt: nowIso(), suspendedReason: 'matrix' });
  callers.set('suspended admin', {
    name: 'suspended admin',
    role: 'admin',
    suspended: true,
    browser: suspended.browser,
    person: suspended.person,
  });

  const author = callers.get('scientist')!.person!;
  const newsletter = await insertNewsletter(test.db, {
    authorId: author.id,
    headline: 'Matrix news',
    bodyMarkdown: 'Nothing to say',
    audience: { kind: 'opted-in' },
    allowRemoteImages: false,
  });
  const messageId = await insertMailMessage(test.db, {
    messageId: '<matrix@example.com>',
    from: 'dipdeck@example.com',
    to: [callers.get('volunteer')!.person!.email!],
    subject: 'Matrix mail',
    headers: [],
    text: 'Hello',
    html: null,
    sizeBytes: 5,
  });
  realIds.set('/campaigns/:id', String(campaignId));
  realIds.set('/targets/:id', String(targetIds[0]));
  realIds.set('/snippets/:id', String(snippetIds.real[0]));
  realIds.set('/desk/splits/:id', String(snippetIds.real[0]));
  realIds.set('/newsletters/:id', String(newsletter.id));
  realIds.set('/admin/outbox/:id', String(messageId));
}, 60_000);

describe('the route table and the expected access', () => {
  it('agree both ways: every route has an expectation, every expectation a route, with the same rule', () => {
    const problems: string[] = [];
    const inTable = new Set<string>();
    for (const route of routes) {
      const key = routeKey(route.method, route.path);
      if (inTable.has(key)) problems.push(`${key} is in the route table twice`);
      inTable.add(key);
      const expected = EXPECTED_ACCESS[key];
      if (!expected) {
        problems.push(
          `${key} (access '${route.access}') has no expectation: add it to tests/api/support/expected-access.ts`,
        );
      } else if (expected !== route.access) {
        problems.push(
          `${key} has access '${route.access}' in the route table, but '${expected}' is expected`,
        );
      }
    }
    for (const key of Object.keys(EXPECTED_ACCESS)) {
      if (!inTable.has(key)) problems.push(`${key} is expected but is not in the route table`);
    }
    for (const key of REFUSES_SUSPENDED) {
      if (EXPECTED_ACCESS[key] !== 'public')
        problems.push(`${key} refuses suspended accounts but is not public`);
    }
    expect(problems).toEqual([]);
  });

  it('is everything the app mounts: no route, and no handler under its own path, added around it', () => {
    // mountRoutes keeps its routers in a closure, out of reach of a walk over the router stack, so
    // every registration is watched instead while an app is built: each Express route, anywhere, goes
    // through Router#route, and each mount under a path through Router#use.
    const routerPrototype = prototypeWith(express.Router(), 'route');
    const registered: { path: string; route: { methods: Record<string, boolean> } }[] = [];
    const mounts: string[] = [];
    const route = routerPrototype.route;
    const use = routerPrototype.use;
    const routeSpy = vi.spyOn(routerPrototype, 'route').mockImplementation(function (this: Router, path) {
      const made = route.call(this, path);
      registered.push({ path: String(path), route: made as never });
      return made;
    });
    const useSpy = vi.spyOn(routerPrototype, 'use').mockImplementation(function (
      this: Router,
      ...args: unknown[]
    ) {
      // Express's app.use passes '/' when given no path.
      const path = args[0];
      const isPath =
        typeof path === 'string' ||
        path instanceof RegExp ||
        (Array.isArray(path) && typeof path[0] === 'string');
      if (isPath && String(path) !== '/') mounts.push(String(path));
      return use.apply(this, args as never);
    } as Router['use']);
    try {
      createApp({ config: test.config, db: test.db });
    } finally {
      routeSpy.mockRestore();
      useSpy.mockRestore();
    }

    const mounted = registered.flatMap(({ path, route }) =>
      Object.keys(route.methods).map((method) => routeKey(method, path)),
    );
    const table = routes.map((route) => routeKey(route.method, route.path));
    const extra = mounted.filter((key) => !table.includes(key));
    expect(extra, 'routes mounted outside the route table (define them with defineRoute)').toEqual([]);
    expect([...mounted].sort(), 'each route of the table mounted once').toEqual([...table].sort());
    expect(mounts, 'handlers mounted under a path of their own').toEqual(['/api']);
  });
});

describe('every route, called by each kind of caller, answers as the rules say', () => {
  const sessionStatuses = new Map<string, Map<string, number>>();

  for (const name of ['anonymous', ...ROLE_ORDER, 'suspended admin']) {
    it(`as ${name} (a browser session with its CSRF token)`, async () => {
      const { statuses, problems } = await sweep(callers.get(name)!);
      sessionStatuses.set(name, statuses);
      expect(problems).toEqual([]);
      expect(statuses.size).toBe(routes.length);
    });
  }

  for (const name of [...ROLE_ORDER, 'suspended admin']) {
    it(`with an API token of the ${name}: the same answers as their session`, async () => {
      const session = callers.get(name)!;
      const caller: Caller = {
        name: `${name}'s token`,
        role: session.role,
        suspended: session.suspended,
        secret: await tokenFor(session.person!),
      };
      const { statuses, problems } = await sweep(caller);
      const sessionAnswers = sessionStatuses.get(name);
      expect(sessionAnswers, 'the session sweep ran first').toBeDefined();
      for (const [key, status] of statuses) {
        if (sessionAnswers!.get(key) !== status) {
          problems.push(`${key}: ${status} with the token, ${sessionAnswers!.get(key)} in the session`);
        }
      }
      expect(problems).toEqual([]);
    });
  }

  it('refuses a revoked token with 401 invalid_token on a route of each rule, public ones too', async () => {
    const admin = callers.get('admin')!.person!;
    const secret = await tokenFor(admin);
    const row = await test.db('api_tokens').where({ person_id: admin.id }).orderBy('id', 'desc').first();
    expect(await revokeApiToken(test.db, admin.id, Number(row.id))).toBe(true);
    // One route per rule: refused tokens are rate limited per address, so not every route.
    const sample = new Map<string, AnyRouteDef>();
    for (const route of routes) {
      const access = route.access as string;
      if (!sample.has(access) && route.path !== '/auth/sign-out') sample.set(access, route);
    }
    expect([...sample.keys()].sort()).toEqual(['admin', 'moderator', 'public', 'scientist', 'signed-in']);
    const problems: string[] = [];
    for (const route of sample.values()) {
      const response = await call({ name: 'revoked token', role: 'admin', suspended: false, secret }, route);
      const problem = mismatch({ status: 401, code: 'invalid_token' }, response);
      if (problem) problems.push(`${routeKey(route.method, route.path)} with a revoked token: ${problem}`);
    }
    expect(problems).toEqual([]);
  });
});

/** The object on the prototype chain that owns `name` (Express routers are functions over a Router). */
function prototypeWith(object: object, name: string): Router {
  let current: object | null = object;
  while (current && !Object.hasOwn(current, name)) current = Object.getPrototypeOf(current);
  if (!current) throw new Error(`no prototype with ${name}`);
  return current as Router;
}
