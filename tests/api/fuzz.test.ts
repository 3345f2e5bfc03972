import fs from 'node:fs';
import querystring from 'node:querystring';
import fc from 'fast-check';
import type request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { isSqlite } from '../../server/db/knex';
import { createApp } from '../../server/http/app';
import type { AnyRouteDef } from '../../server/http/define-route';
import {
  incomingDir,
  MAX_CATALOGUE_BYTES,
  MAX_FILES_PER_REQUEST,
  MAX_LIGHT_CURVE_BYTES,
} from '../../server/http/multipart';
import { routeTable } from '../../server/http/route-table';
import { eventually } from '../support/eventually';
import {
  hostileQuery,
  hostileSegment,
  hostileString,
  keyedObject,
  malformedJson,
  mutated,
} from './support/fuzz-arbitraries';
import { exampleBodies, exampleParams } from './support/fuzz-examples';
import { buildFuzzWorld, type FuzzWorld } from './support/fuzz-world';
import { Browser, createTestApp, type TestApp } from './support/test-app';

// Every zod-validated route, called as someone allowed to call it, with random, hostile and mutated
// input: it never answers 500, refuses bad input with a JSON error and the right status (400 invalid,
// 413 too large, 415 wrong type; 429 when a rate limit answers first), and a refused request stores
// nothing. Runs are random; FUZZ_SEED=<seed> replays the one a failure prints, FUZZ_RUNS=<n> digs deeper.

const RUNS = Number(process.env.FUZZ_RUNS ?? 20);
const SEED = process.env.FUZZ_SEED === undefined ? undefined : Number(process.env.FUZZ_SEED);
const fuzz = (numRuns: number) => ({ numRuns, ...(SEED === undefined ? {} : { seed: SEED }) });

// Each valid body of these costs a full-strength scrypt (over a second here): the fuzzing sends them
// only bodies their schema refuses. Their schemas are what is fuzzed; the services have tests of their own.
const COSTLY = new Set(['POST /auth/sign-up', 'POST /auth/sign-in', 'DELETE /auth/me']);
// GET /unsubscribe answers a bad link with a page, for the person who clicked it in a mail client.
const PAGE_ROUTES = new Set(['GET /unsubscribe']);

const ONE_MB = 1024 * 1024;

let test: TestApp;
let world: FuzzWorld;
let routes: AnyRouteDef[];
let visitor: Browser;

beforeAll(async () => {
  test = await createTestApp({ queues: true });
  routes = routeTable(createApp({ config: test.config, db: test.db }).deps);
  world = await buildFuzzWorld(test);
  visitor = new Browser(test.app);
}, 60_000);

const keyOf = (route: AnyRouteDef) => `${route.method.toUpperCase()} ${route.path}`;
const bodyRoutes = () => routes.filter((route) => route.body && !route.multipart);
const multipartRoutes = () => routes.filter((route) => route.multipart);

function paramsOf(route: AnyRouteDef): Record<string, string | number> {
  const example = exampleParams[keyOf(route)];
  return route.params && example ? example(world) : {};
}

/** The route's URL with these (already encoded) segments for its parameters. */
function urlOf(
  route: AnyRouteDef,
  segments: Record<string, string | number> = paramsOf(route),
  query?: string,
) {
  const filled = route.path.replace(/:(\w+)/g, (_, name: string) => String(segments[name]));
  return `/api${filled}${query === undefined ? '' : `?${query}`}`;
}

function callerOf(route: AnyRouteDef): Browser {
  return route.access === 'public' ? visitor : world.admin;
}

interface Sent {
  url: string;
  contentType?: string;
  body?: string | Buffer;
  headers?: Record<string, string>;
}

async function send(route: AnyRouteDef, sent: Sent): Promise<request.Response> {
  const browser = callerOf(route);
  const token = await browser.csrf();
  let call = browser.agent[route.method](sent.url)
    .set('X-CSRF-Token', token)
    .set('Accept', 'application/json');
  for (const [name, value] of Object.entries(sent.headers ?? {})) call = call.set(name, value);
  if (sent.contentType !== undefined) call = call.set('Content-Type', sent.contentType);
  const response = await (sent.body === undefined ? call : call.send(sent.body));
  // Signing in, up or out gives the visitor a new session, and so a new CSRF token.
  if (route.path.startsWith('/auth/') && route.access === 'public' && response.status < 300) {
    visitor = new Browser(test.app);
  }
  return response;
}

function describeSent(route: AnyRouteDef, sent: Sent): string {
  const body = sent.body === undefined ? '' : ` ${String(sent.body).slice(0, 300)}`;
  return `${route.method.toUpperCase()} ${sent.url.slice(0, 300)} [${sent.contentType ?? 'no type'}]${body}`;
}

/** What a refusal must look like; 'any' when the input may be valid (then only "no 500" is asked). */
type Expected = { status: number; code?: string } | 'any';

function checkAnswer(route: AnyRouteDef, sent: Sent, response: request.Response, expected: Expected): void {
  const where = `${describeSent(route, sent)}\n  answered ${response.status} ${response.text.slice(0, 400)}`;
  if (response.status >= 500) throw new Error(`server error: ${where}`);
  if (response.status === 429) {
    checkErrorShape(response, where);
    return;
  }
  if (expected !== 'any') {
    const code = response.body?.error?.code;
    if (response.status !== expected.status || (expected.code && code !== expected.code)) {
      throw new Error(`expected ${expected.status} ${expected.code ?? ''}: ${where}`);
    }
  }
  if (response.status >= 400) {
    if (PAGE_ROUTES.has(keyOf(route)) && /^text\/html/.test(response.headers['content-type'] ?? '')) return;
    checkErrorShape(response, where);
  }
}

function checkErrorShape(response: request.Response, where: string): void {
  const error = response.body?.error;
  const fieldsOk =
    error?.fields === undefined ||
    (typeof error.fields === 'object' &&
      Object.values(error.fields).every((text) => typeof text === 'string'));
  if (
    !/^application\/json/.test(response.headers['content-type'] ?? '') ||
    typeof error?.code !== 'string' ||
    typeof error.message !== 'string' ||
    error.message === '' ||
    !fieldsOk
  ) {
    throw new Error(`not a JSON error {error: {code, message, fields?}}: ${where}`);
  }
}

const REFUSED: Expected = { status: 400, code: 'validation_failed' };

/** Whether a part passes its schema, and holds no NUL character in what passes (no database stores one). */
function acceptable(schema: z.ZodType, value: unknown): boolean {
  const result = schema.safeParse(value);
  return result.success && !holdsNul(result.data);
}

function holdsNul(value: unknown): boolean {
  const stack = [value];
  while (stack.length > 0) {
    const item = stack.pop();
    if (typeof item === 'string' && item.includes('\u0000')) return true;
    if (item !== null && typeof item === 'object') for (const inner of Object.values(item)) stack.push(inner);
  }
  return false;
}

/** The body as express.json reads it: absent, unreadable (strict mode takes objects and arrays only), or a value. */
function asServerReads(
  text: string,
): { kind: 'absent' } | { kind: 'unreadable' } | { kind: 'value'; value: unknown } {
  if (text.length === 0) return { kind: 'absent' };
  const withoutBom = text.replace(/^\ufeff/, '');
  const first = /^[ \t\n\r]*([^ \t\n\r])/.exec(withoutBom)?.[1];
  if (first !== '{' && first !== '[') return { kind: 'unreadable' };
  try {
    return { kind: 'value', value: JSON.parse(withoutBom) };
  } catch {
    return { kind: 'unreadable' };
  }
}

/** What a JSON body must be answered with: 400 invalid_json, 400 validation_failed, or anything but 500. */
function expectedForBody(route: AnyRouteDef, text: string): Expected {
  if (Buffer.byteLength(text) > ONE_MB) return { status: 413, code: 'body_too_large' };
  const read = asServerReads(text);
  if (read.kind === 'unreadable') return { status: 400, code: 'invalid_json' };
  // An empty body reaches the route as nothing or, sent chunked, as {} (body-parser's reading of it).
  const candidates = read.kind === 'absent' ? [undefined, {}] : [read.value];
  return candidates.some((value) => acceptable(route.body!, value)) ? 'any' : REFUSED;
}

async function sendJson(route: AnyRouteDef, text: string, expected = expectedForBody(route, text)) {
  // A valid body for a costly route would cost a scrypt: those get refused bodies only.
  if (expected === 'any' && COSTLY.has(keyOf(route))) return;
  const sent: Sent = { url: urlOf(route), contentType: 'application/json', body: text };
  checkAnswer(route, sent, await send(route, sent), expected);
}

const toJson = (value: unknown) => JSON.stringify(value) ?? 'null';

function expectedForQuery(route: AnyRouteDef, query: string): Expected {
  // Express 5's "simple" query parser is node:querystring.
  return acceptable(route.query!, { ...querystring.parse(query) }) ? 'any' : REFUSED;
}

function decodedSegment(segment: string): string | null {
  try {
    return decodeURIComponent(segment);
  } catch {
    return null;
  }
}

function expectedForParams(route: AnyRouteDef, segments: Record<string, string | number>): Expected {
  const decoded: Record<string, string> = {};
  for (const [name, segment] of Object.entries(segments)) {
    const value = decodedSegment(String(segment));
    if (value === null) return REFUSED;
    decoded[name] = value;
  }
  return acceptable(route.params!, decoded) ? 'any' : REFUSED;
}

function exampleBodyText(route: AnyRouteDef): string | undefined {
  const example = exampleBodies[keyOf(route)];
  return route.body && example ? toJson(example(world)) : undefined;
}

async function rowCounts(): Promise<Record<string, number>> {
  const { db } = test;
  const listed = isSqlite(db)
    ? await db.raw("select name from sqlite_master where type = 'table' and name not like 'sqlite_%'")
    : await db.raw(
        "select table_name as name from information_schema.tables where table_schema = current_schema() and table_type = 'BASE TABLE'",
      );
  const rowsOf = (result: unknown) => (Array.isArray(result) ? result : (result as { rows: unknown[] }).rows);
  // Sessions are written by every request (a visitor's first one makes one); rate-limit counts are not stored.
  const tables = (rowsOf(listed) as { name: string }[])
    .map(({ name }) => name)
    .filter((name) => name !== 'sessions' && !name.startsWith('knex_'))
    .sort();
  const counted = await db.raw(
    tables.map((name) => `select '${name}' as name, count(*) as n from "${name}"`).join(' union all '),
  );
  return Object.fromEntries(
    (rowsOf(counted) as { name: string; n: number | string }[]).map((row) => [row.name, Number(row.n)]),
  );
}

function incomingFiles(): string[] {
  const dir = incomingDir(test.dataDir);
  return fs.existsSync(dir) ? fs.readdirSync(dir) : [];
}

function prototypeUntouched(): void {
  expect(Object.keys(Object.prototype)).toEqual([]);
  expect(({} as Record<string, unknown>).polluted).toBeUndefined();
}

// A CSV light curve and a catalogue the uploads start from (invented stars).
const LIGHT_CURVE_CSV = `time,flux,flux_err\n${Array.from({ length: 40 }, (_, i) => `${(i * 0.05).toFixed(2)},${(1 + (i % 3) * 1e-4).toFixed(5)},0.0001`).join('\n')}\n`;
const CATALOGUE_CSV =
  'designation,ra,dec,magnitude,stellar_radius,stellar_mass,teff\nDPD-7001-0001,210.5,-12.25,11.5,0.9,0.95,5600\n';

interface FilePart {
  field: string;
  name: string;
  bytes: Uint8Array;
  type?: string;
}

/** A multipart/form-data body written by hand, so that it can also be written wrong. */
function multipartBody(boundary: string, parts: FilePart[], fields: Record<string, string> = {}): Buffer {
  const chunks: Buffer[] = [];
  for (const [name, value] of Object.entries(fields)) {
    chunks.push(
      Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${name}"\r\n\r\n${value}\r\n`),
    );
  }
  for (const part of parts) {
    chunks.push(
      Buffer.from(
        `--${boundary}\r\nContent-Disposition: form-data; name="${part.field}"; filename="${part.name}"\r\nContent-Type: ${part.type ?? 'application/octet-stream'}\r\n\r\n`,
      ),
      Buffer.from(part.bytes),
      Buffer.from('\r\n'),
    );
  }
  chunks.push(Buffer.from(`--${boundary}--\r\n`));
  return Buffer.concat(chunks);
}

const BOUNDARY = 'fuzz-boundary-7f3a';

async function sendMultipart(
  route: AnyRouteDef,
  body: Buffer,
  contentType = `multipart/form-data; boundary=${BOUNDARY}`,
) {
  const sent: Sent = { url: urlOf(route), contentType, body };
  return { sent, response: await send(route, sent) };
}

/** A body that passes whatever runs before the params are parsed: the valid example, or an empty multipart form. */
function bodyToReachParams(route: AnyRouteDef): Pick<Sent, 'contentType' | 'body'> {
  if (route.multipart)
    return { contentType: `multipart/form-data; boundary=${BOUNDARY}`, body: multipartBody(BOUNDARY, []) };
  const body = exampleBodyText(route);
  return body === undefined ? {} : { contentType: 'application/json', body };
}

function routeByKey(key: string): AnyRouteDef {
  const route = routes.find((candidate) => keyOf(candidate) === key);
  if (!route) throw new Error(`no route ${key} in the route table`);
  return route;
}

describe('the examples the fuzzing starts from', () => {
  it('cover every route with a body or params schema, and each is valid against its schema', () => {
    const problems: string[] = [];
    const keys = new Set(routes.map(keyOf));
    for (const route of routes) {
      const key = keyOf(route);
      for (const [part, table, schema] of [
        ['body', exampleBodies, route.body],
        ['params', exampleParams, route.params],
      ] as const) {
        if (!schema) continue;
        const example = table[key];
        if (!example) {
          problems.push(`${key}: no example ${part} in tests/api/support/fuzz-examples.ts`);
          continue;
        }
        const result = schema.safeParse(example(world));
        if (!result.success)
          problems.push(`${key}: the example ${part} is not valid: ${result.error.message}`);
      }
    }
    for (const key of [...Object.keys(exampleBodies), ...Object.keys(exampleParams)]) {
      if (!keys.has(key)) problems.push(`${key}: an example for a route the table does not have`);
    }
    expect(problems).toEqual([]);
  });
});

describe('a batch of refused requests', () => {
  it('is answered 400, 413 or 415 and changes nothing stored', async () => {
    const before = await rowCounts();
    const sample = <T>(arbitrary: fc.Arbitrary<T>, count: number) => fc.sample(arbitrary, fuzz(count));
    for (const route of bodyRoutes()) {
      const invalid = keyedObject(route.body!)
        .map(toJson)
        .filter((text) => expectedForBody(route, text) !== 'any');
      for (const text of sample(invalid, 6)) await sendJson(route, text);
      for (const text of ['{"a":', '{a:1}', '"text"']) await sendJson(route, text);
      const example = exampleBodyText(route)!;
      for (const contentType of ['text/plain', 'application/x-www-form-urlencoded']) {
        const sent: Sent = { url: urlOf(route), contentType, body: example };
        checkAnswer(route, sent, await send(route, sent), { status: 415 });
      }
    }
    for (const route of routes.filter((candidate) => candidate.query)) {
      const invalid = hostileQuery(route.query!).filter((query) => expectedForQuery(route, query) !== 'any');
      for (const query of sample(invalid, 4)) {
        const sent: Sent = { url: urlOf(route, paramsOf(route), query), ...bodyToReachParams(route) };
        checkAnswer(route, sent, await send(route, sent), expectedForQuery(route, query));
      }
    }
    for (const route of routes.filter((candidate) => candidate.params)) {
      const names = Object.keys(paramsOf(route));
      const invalid = fc
        .record(Object.fromEntries(names.map((name) => [name, hostileSegment])))
        .map((segments) => ({ ...paramsOf(route), ...segments }))
        .filter((segments) => expectedForParams(route, segments) !== 'any');
      for (const segments of sample(invalid, 4)) {
        const sent: Sent = { url: urlOf(route, segments), ...bodyToReachParams(route) };
        checkAnswer(route, sent, await send(route, sent), expectedForParams(route, segments));
      }
    }
    for (const route of multipartRoutes()) {
      const field = route.multipart!.fileField;
      const json: Sent = { url: urlOf(route), contentType: 'application/json', body: '{}' };
      checkAnswer(route, json, await send(route, json), { status: 415 });
      const wrongField = multipartBody(BOUNDARY, [
        { field: `${field}x`, name: 'a.csv', bytes: Buffer.from(LIGHT_CURVE_CSV) },
      ]);
      const { sent, response } = await sendMultipart(route, wrongField);
      checkAnswer(route, sent, response, { status: 400 });
    }
    prototypeUntouched();
    expect(await rowCounts()).toEqual(before);
    await eventually(
      async () => incomingFiles().length === 0,
      'refused uploads removed from the incoming folder',
    );
  }, 120_000);
});

describe('JSON bodies', () => {
  it('arbitrary JSON, on every route that takes a body, is refused with 400 or handled, never 500', async () => {
    for (const route of bodyRoutes()) {
      await fc.assert(
        fc.asyncProperty(fc.jsonValue(), async (value) => sendJson(route, toJson(value))),
        fuzz(RUNS),
      );
    }
    prototypeUntouched();
  }, 120_000);

  it('objects with the schema’s own keys holding hostile values (wrong types, extremes, unicode, prototype keys)', async () => {
    for (const route of bodyRoutes()) {
      await fc.assert(
        fc.asyncProperty(keyedObject(route.body!), async (value) => sendJson(route, toJson(value))),
        fuzz(RUNS),
      );
    }
    prototypeUntouched();
  }, 120_000);

  it('mutations of each route’s valid example', async () => {
    for (const route of bodyRoutes()) {
      const example = exampleBodies[keyOf(route)]!(world);
      await fc.assert(
        fc.asyncProperty(mutated(example), async (value) => sendJson(route, toJson(value))),
        fuzz(RUNS),
      );
    }
    prototypeUntouched();
  }, 120_000);

  it('malformed JSON text is refused 400 invalid_json, and odd but valid JSON is handled', async () => {
    for (const route of bodyRoutes()) {
      const example = exampleBodies[keyOf(route)]!(world);
      await fc.assert(
        fc.asyncProperty(malformedJson(example), async (text) => sendJson(route, text)),
        fuzz(Math.ceil(RUNS / 2)),
      );
    }
  }, 120_000);

  it('a body in another type than JSON is refused 415', async () => {
    const types = [
      'text/plain',
      'application/x-www-form-urlencoded',
      `multipart/form-data; boundary=${BOUNDARY}`,
      'application/xml',
      'application/vnd.api+json',
      'application/json; charset=latin1',
    ];
    for (const route of bodyRoutes()) {
      for (const contentType of types) {
        const sent: Sent = { url: urlOf(route), contentType, body: exampleBodyText(route)! };
        checkAnswer(route, sent, await send(route, sent), { status: 415 });
      }
      const sent: Sent = { url: urlOf(route), body: Buffer.from(exampleBodyText(route)!), contentType: '' };
      checkAnswer(route, sent, await send(route, sent), { status: 415 });
    }
  });

  it('a body over the 1 MB limit is refused 413', async () => {
    for (const route of bodyRoutes()) {
      const text = `{"name":"${'a'.repeat(ONE_MB)}"}`;
      const sent: Sent = { url: urlOf(route), contentType: 'application/json', body: text };
      checkAnswer(route, sent, await send(route, sent), { status: 413, code: 'body_too_large' });
    }
  });
});

describe('query strings', () => {
  it('hostile queries (the schema’s keys repeated, bracketed, with hostile values) are refused 400 or handled', async () => {
    for (const route of routes.filter((candidate) => candidate.query)) {
      await fc.assert(
        fc.asyncProperty(hostileQuery(route.query!), async (query) => {
          const sent: Sent = { url: urlOf(route, paramsOf(route), query) };
          checkAnswer(route, sent, await send(route, sent), expectedForQuery(route, query));
        }),
        fuzz(RUNS),
      );
    }
  }, 120_000);
});

describe('path parameters', () => {
  it('hostile segments (text, numbers out of range, percent sequences that do not decode) are refused 400 or handled', async () => {
    for (const route of routes.filter((candidate) => candidate.params)) {
      const names = Object.keys(paramsOf(route));
      const segments = fc
        .record(
          Object.fromEntries(names.map((name) => [name, fc.option(hostileSegment, { nil: undefined })])),
        )
        .map(
          (chosen): Record<string, string | number> => ({
            ...paramsOf(route),
            ...Object.fromEntries(
              Object.entries(chosen).filter((entry): entry is [string, string] => entry[1] !== undefined),
            ),
          }),
        );
      await fc.assert(
        fc.asyncProperty(segments, async (chosen) => {
          const sent: Sent = { url: urlOf(route, chosen), ...bodyToReachParams(route) };
          checkAnswer(route, sent, await send(route, sent), expectedForParams(route, chosen));
        }),
        fuzz(RUNS),
      );
    }
  }, 120_000);
});

describe('multipart uploads', () => {
  const fileName = fc.oneof(
    fc.constantFrom(
      'lc.csv',
      'lc.fits',
      'lc.txt',
      'lc',
      'lc.exe',
      '.csv',
      'a\u0000.csv',
      'a"b.csv',
      'a\r\nb.csv',
      '\u{1fa90}.csv',
    ),
    fc.string({ unit: 'grapheme', maxLength: 40 }),
  );
  const fileBytes = fc.oneof(
    fc.uint8Array({ maxLength: 3_000 }),
    fc.string({ unit: 'binary', maxLength: 2_000 }).map((text) => Buffer.from(text)),
    fc
      .tuple(fc.nat({ max: LIGHT_CURVE_CSV.length }), fc.uint8Array({ maxLength: 20 }))
      .map(([at, noise]) =>
        Buffer.concat([
          Buffer.from(LIGHT_CURVE_CSV.slice(0, at)),
          noise,
          Buffer.from(LIGHT_CURVE_CSV.slice(at)),
        ]),
      ),
    fc.constant(Buffer.alloc(0)),
  );

  it('light curves: random bytes, names and fields, and broken multipart, are answered 202 or refused 400/413/415', async () => {
    const route = routeByKey('POST /campaigns/:id/light-curves');
    const upload = fc.record({
      files: fc.array(fc.record({ name: fileName, bytes: fileBytes }), { maxLength: 3 }),
      fields: fc.dictionary(
        fc.constantFrom('target', 'quietReference', 'other', '__proto__'),
        hostileString.filter((text) => text.length < 2_000 && !/[\r\n"]/.test(text)),
        { maxKeys: 3 },
      ),
      cut: fc.option(fc.nat(), { nil: undefined }),
    });
    await fc.assert(
      fc.asyncProperty(upload, async ({ files, fields, cut }) => {
        let body = multipartBody(
          BOUNDARY,
          files.map((file) => ({ field: 'files', ...file })),
          fields,
        );
        if (cut !== undefined) body = body.subarray(0, cut % (body.length + 1));
        const { sent, response } = await sendMultipart(route, body);
        checkAnswer(route, sent, response, 'any');
        expect([202, 400, 409, 413, 415, 429], describeSent(route, sent)).toContain(response.status);
      }),
      fuzz(RUNS),
    );
    await eventually(async () => incomingFiles().length === 0, 'no upload left in the incoming folder');
  }, 120_000);

  it('a catalogue of random bytes, or a mutated catalogue, is answered 200 with a report or refused 400/415', async () => {
    const route = routeByKey('POST /campaigns/:id/targets');
    const catalogue = fc.oneof(
      fc.uint8Array({ maxLength: 3_000 }),
      fc.string({ unit: 'binary', maxLength: 3_000 }).map((text) => Buffer.from(text)),
      fc
        .tuple(fc.nat({ max: CATALOGUE_CSV.length }), hostileString)
        .map(([at, noise]) => Buffer.from(CATALOGUE_CSV.slice(0, at) + noise + CATALOGUE_CSV.slice(at))),
    );
    await fc.assert(
      fc.asyncProperty(catalogue, fileName, async (bytes, name) => {
        const { sent, response } = await sendMultipart(
          route,
          multipartBody(BOUNDARY, [{ field: 'file', name, bytes }]),
        );
        checkAnswer(route, sent, response, 'any');
        expect([200, 400, 415, 429], describeSent(route, sent)).toContain(response.status);
      }),
      fuzz(RUNS),
    );
  }, 120_000);

  it('wrong types, too many files, long fields and oversize files are refused 400, 413 or 415', async () => {
    const lightCurves = routeByKey('POST /campaigns/:id/light-curves');
    const catalogue = routeByKey('POST /campaigns/:id/targets');
    const csv = Buffer.from(LIGHT_CURVE_CSV);
    const cases: [AnyRouteDef, Buffer, string | undefined, number][] = [
      [lightCurves, Buffer.from('{}'), 'application/json', 415],
      [lightCurves, csv, 'text/csv', 415],
      [
        lightCurves,
        multipartBody(BOUNDARY, [{ field: 'files', name: 'a.csv', bytes: csv }]),
        'multipart/form-data',
        400,
      ],
      [lightCurves, multipartBody(BOUNDARY, []), undefined, 400],
      [
        lightCurves,
        multipartBody(
          BOUNDARY,
          Array.from({ length: MAX_FILES_PER_REQUEST + 1 }, (_, i) => ({
            field: 'files',
            name: `${i}.csv`,
            bytes: csv,
          })),
        ),
        undefined,
        400,
      ],
      [
        lightCurves,
        multipartBody(BOUNDARY, [{ field: 'files', name: 'a.csv', bytes: csv }], {
          target: 'x'.repeat(2_000),
        }),
        undefined,
        400,
      ],
      [
        lightCurves,
        multipartBody(
          BOUNDARY,
          [],
          Object.fromEntries(Array.from({ length: 11 }, (_, i) => [`field${i}`, 'x'])),
        ),
        undefined,
        400,
      ],
      [
        lightCurves,
        Buffer.from(
          `--${BOUNDARY}\r\nContent-Disposition: form-data; name="files"; filename="a.csv"\r\n\r\n1,2`,
        ),
        undefined,
        400,
      ],
      [lightCurves, Buffer.from('no multipart here'), undefined, 400],
      [catalogue, Buffer.from(CATALOGUE_CSV), 'text/csv', 415],
      [
        catalogue,
        multipartBody(BOUNDARY, [
          { field: 'file', name: 'a.csv', bytes: Buffer.from(CATALOGUE_CSV) },
          { field: 'file', name: 'b.csv', bytes: Buffer.from(CATALOGUE_CSV) },
        ]),
        undefined,
        400,
      ],
      [
        catalogue,
        multipartBody(BOUNDARY, [
          { field: 'file', name: 'a.csv', bytes: Buffer.alloc(MAX_CATALOGUE_BYTES + 1, 0x41) },
        ]),
        undefined,
        413,
      ],
      [
        lightCurves,
        multipartBody(BOUNDARY, [
          { field: 'files', name: 'a.csv', bytes: Buffer.alloc(MAX_LIGHT_CURVE_BYTES + 1, 0x41) },
        ]),
        undefined,
        413,
      ],
    ];
    for (const [route, body, contentType, status] of cases) {
      const { sent, response } = await sendMultipart(route, body, contentType);
      checkAnswer(route, sent, response, { status });
    }
    await eventually(
      async () => incomingFiles().length === 0,
      'refused uploads removed from the incoming folder',
    );
  }, 120_000);
});

// Each counterexample the fuzzing found, kept as a plain case.
describe('found by fuzzing', () => {
  async function answer(key: string, sent: Sent) {
    const route = routeByKey(key);
    return send(route, { ...sent, url: sent.url || urlOf(route) });
  }
  const json = (value: unknown) => ({ contentType: 'application/json', body: JSON.stringify(value) });

  it('a "%" that does not decode in a path parameter is a 400 naming the path, not a 500', async () => {
    const response = await answer('PATCH /admin/people/:id', {
      url: '/api/admin/people/%',
      ...json({ role: 'moderator' }),
    });
    expect(response.status).toBe(400);
    expect(response.body.error).toMatchObject({
      code: 'validation_failed',
      fields: { _: expect.stringContaining('%') },
    });
  });

  it('an id beyond the 32-bit id columns is a 400, in a path, a body and a query (PostgreSQL answered 500)', async () => {
    const inPath = await answer('PATCH /campaigns/:id', {
      url: '/api/campaigns/2147483648',
      ...json({ verdictsToSettle: 6 }),
    });
    expect(inPath.status).toBe(400);
    expect(inPath.body.error.fields).toHaveProperty('id');
    const inBody = await answer('POST /campaigns/:id/candidates', {
      url: `/api/campaigns/${world.campaignId}/candidates`,
      ...json({ targetId: 2 ** 31 }),
    });
    expect(inBody.status).toBe(400);
    expect(inBody.body.error.fields).toHaveProperty('targetId');
    const inQuery = await answer('GET /deck/next', { url: '/api/deck/next?exclude=1,99999999999' });
    expect(inQuery.status).toBe(400);
    expect(inQuery.body.error.fields).toHaveProperty('exclude.1');
  });

  it('text holding U+0000 is a 400 naming the field, in a body and a query (PostgreSQL answered 500)', async () => {
    const inBody = await answer('PATCH /campaigns/:id', {
      url: `/api/campaigns/${world.patchedCampaignId}`,
      ...json({ description: 'Changed by the fuzz test\u0000' }),
    });
    expect(inBody.status).toBe(400);
    expect(inBody.body.error).toMatchObject({
      code: 'validation_failed',
      fields: { description: expect.stringContaining('NUL') },
    });
    const inQuery = await answer('GET /admin/people', { url: '/api/admin/people?q=a%00b' });
    expect(inQuery.status).toBe(400);
    expect(inQuery.body.error.fields).toHaveProperty('q');
  });

  it('a multipart body that is empty, cut short or without a boundary is a 400, not a 500', async () => {
    const route = routeByKey('POST /campaigns/:id/light-curves');
    for (const [body, contentType] of [
      [Buffer.alloc(0), `multipart/form-data; boundary=${BOUNDARY}`],
      [
        Buffer.from(
          `--${BOUNDARY}\r\nContent-Disposition: form-data; name="files"; filename="a.csv"\r\n\r\n1,2`,
        ),
        `multipart/form-data; boundary=${BOUNDARY}`,
      ],
      [multipartBody(BOUNDARY, []), 'multipart/form-data'],
    ] as const) {
      const { response } = await sendMultipart(route, body, contentType);
      expect(response.status).toBe(400);
      expect(response.body.error.code).toBe('bad_multipart');
    }
  });

  it('a catalogue whose file name breaks the part header (CR LF) is a 400, not a 500', async () => {
    const route = routeByKey('POST /campaigns/:id/targets');
    const { response } = await sendMultipart(
      route,
      multipartBody(BOUNDARY, [{ field: 'file', name: 'a\r\nb.csv', bytes: new Uint8Array(0) }]),
    );
    expect(response.status).toBe(400);
  });

  it('an upload refused after its files were written (a target not in the catalogue, bad params) leaves none behind', async () => {
    const route = routeByKey('POST /campaigns/:id/light-curves');
    const file = [{ field: 'files', name: 'a.csv', bytes: Buffer.from(LIGHT_CURVE_CSV) }];
    const badField = await sendMultipart(route, multipartBody(BOUNDARY, file, { quietReference: 'maybe' }));
    expect(badField.response.status).toBe(400);
    const badParams = await send(route, {
      url: '/api/campaigns/0/light-curves',
      contentType: `multipart/form-data; boundary=${BOUNDARY}`,
      body: multipartBody(BOUNDARY, file),
    });
    expect(badParams.status).toBe(400);
    await eventually(async () => incomingFiles().length === 0, 'the refused files removed');
  });

  it('a light curve whose file name holds U+0000 is answered without a 500', async () => {
    const route = routeByKey('POST /campaigns/:id/light-curves');
    const { sent, response } = await sendMultipart(
      route,
      multipartBody(BOUNDARY, [
        { field: 'files', name: 'a\u0000.csv', bytes: Buffer.from(`${LIGHT_CURVE_CSV}\n`) },
      ]),
    );
    checkAnswer(route, sent, response, 'any');
  });
});
