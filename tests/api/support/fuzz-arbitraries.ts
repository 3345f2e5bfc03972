import fc from 'fast-check';
import { z } from 'zod';

// Generators of hostile input for the API fuzz test (tests/api/fuzz.test.ts).

/** Keys that reach Object.prototype when a parser or merge assigns them naively. */
export const PROTOTYPE_KEYS = ['__proto__', 'constructor', 'prototype'] as const;

/** An object with these own, enumerable properties, `__proto__` included (a literal would set the prototype). */
export function ownObject(entries: readonly (readonly [string, unknown])[]): Record<string, unknown> {
  const object: Record<string, unknown> = {};
  for (const [key, value] of entries) {
    Object.defineProperty(object, key, { value, enumerable: true, writable: true, configurable: true });
  }
  return object;
}

// Strings that other parsers read as numbers, booleans, null or paths; markup and SQL; the characters
// that break storage (NUL), rendering (bidi override, BOM) or UTF-16 (a lone surrogate).
const TRICKY_STRINGS = [
  '',
  ' ',
  'NaN',
  'nan',
  'Infinity',
  '-Infinity',
  '1e999',
  '-0',
  '0x1F',
  '1_000',
  ' 42 ',
  '\u0664\u0662',
  '1,5',
  'null',
  'undefined',
  'true',
  '[]',
  '{}',
  '__proto__',
  '../../etc/passwd',
  '<script>alert(1)</script>',
  "'; drop table people; --",
  '\u0000',
  'a\u0000b',
  '\ud800',
  '\u202eevil',
  '\ufeff',
  '\u{1fa90}\u{1f30c}',
  'e\u0301',
  '2147483648',
  '9007199254740993',
  '99999999999999999999999',
];

export const hostileString: fc.Arbitrary<string> = fc.oneof(
  fc.constantFrom(...TRICKY_STRINGS),
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.string({ unit: 'grapheme', maxLength: 40 }),
  fc.constantFrom(255, 4_097, 100_001).map((length) => 'x'.repeat(length)),
  fc.integer({ min: 1, max: 3_000 }).map((count) => '\u{1fa90}'.repeat(count)),
);

export const hostileNumber: fc.Arbitrary<number> = fc.oneof(
  fc.constantFrom(
    0,
    -0,
    1,
    -1,
    0.5,
    1e308,
    -1e308,
    5e-324,
    1e21,
    2 ** 31 - 1,
    2 ** 31,
    -(2 ** 31) - 1,
    2 ** 32,
    Number.MAX_SAFE_INTEGER,
    Number.MAX_SAFE_INTEGER + 2,
  ),
  fc.integer(),
  // NaN and ±Infinity become null in JSON: the wire cannot carry them (see malformedJson for 1e999).
  fc.double(),
);

const hostileLeaf: fc.Arbitrary<unknown> = fc.oneof(
  hostileString,
  hostileNumber,
  fc.boolean(),
  fc.constant(null),
);

/** A value built to nest: `depth` arrays or objects around a leaf. */
const deeplyNested = fc
  .tuple(fc.integer({ min: 2, max: 300 }), fc.boolean(), hostileLeaf)
  .map(([depth, asArray, leaf]) => {
    let value: unknown = leaf;
    for (let i = 0; i < depth; i += 1) value = asArray ? [value] : { a: value };
    return value;
  });

const prototypeObject = fc
  .array(fc.tuple(fc.constantFrom(...PROTOTYPE_KEYS, 'toString', 'hasOwnProperty'), hostileLeaf), {
    minLength: 1,
    maxLength: 3,
  })
  .map((entries) => ownObject([...entries, ['polluted', true]]));

export const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 4, arbitrary: hostileLeaf },
  { weight: 1, arbitrary: fc.array(hostileLeaf, { maxLength: 5 }) },
  { weight: 1, arbitrary: fc.dictionary(fc.string({ maxLength: 8 }), hostileLeaf, { maxKeys: 4 }) },
  { weight: 1, arbitrary: deeplyNested },
  { weight: 1, arbitrary: prototypeObject },
  { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 3 }) },
);

type Shape = Record<string, z.ZodType>;

/**
 * The keys of an object schema, looking through optional, nullable, default, pipe and refine, and
 * across the options of a union; null when the schema is not an object.
 */
export function objectShape(schema: z.ZodType): Shape | null {
  let current: z.ZodType | undefined = schema;
  for (let depth = 0; current && depth < 10; depth += 1) {
    if (current instanceof z.ZodObject) return current.shape as Shape;
    const def = current._zod.def as { innerType?: z.ZodType; in?: z.ZodType; options?: z.ZodType[] };
    if (def.options) {
      const merged: Shape = {};
      for (const option of def.options) Object.assign(merged, objectShape(option) ?? {});
      return merged;
    }
    current = def.innerType ?? def.in;
  }
  return null;
}

/** Objects holding some of the schema's own keys (nested objects too), with hostile values, and prototype keys. */
export function keyedObject(schema: z.ZodType, depth = 0): fc.Arbitrary<Record<string, unknown>> {
  const shape = objectShape(schema) ?? {};
  const keys = Object.keys(shape);
  const valueFor = (key: string): fc.Arbitrary<unknown> => {
    const inner = shape[key];
    const nested = inner && depth < 2 ? objectShape(inner) : null;
    return nested ? fc.oneof(keyedObject(inner!, depth + 1), hostileValue) : hostileValue;
  };
  const entry =
    keys.length > 0
      ? fc.oneof(
          {
            weight: 5,
            arbitrary: fc
              .constantFrom(...keys)
              .chain((key) => valueFor(key).map((value) => [key, value] as const)),
          },
          { weight: 1, arbitrary: fc.tuple(fc.constantFrom(...PROTOTYPE_KEYS), hostileValue) },
        )
      : fc.tuple(fc.constantFrom(...PROTOTYPE_KEYS), hostileValue);
  return fc.array(entry, { maxLength: keys.length + 2 }).map((entries) => ownObject(entries));
}

type Path = string[];

function pathsOf(value: unknown, prefix: Path = [], depth = 0): Path[] {
  if (value === null || typeof value !== 'object' || depth > 2) return [];
  const paths: Path[] = [];
  for (const key of Object.keys(value)) {
    const path = [...prefix, key];
    paths.push(path, ...pathsOf((value as Record<string, unknown>)[key], path, depth + 1));
  }
  return paths;
}

function parentOf(root: unknown, path: Path): Record<string, unknown> {
  let node = root as Record<string, unknown>;
  for (const key of path.slice(0, -1)) node = node[key] as Record<string, unknown>;
  return node;
}

/** A value of another type carrying the same content: 5 → "5", "5" → 5, true → "true", x → [x]. */
function retyped(value: unknown): unknown {
  if (typeof value === 'number') return String(value);
  if (typeof value === 'string') return Number.isNaN(Number(value)) ? [value] : Number(value);
  if (typeof value === 'boolean') return String(value);
  if (value === null) return {};
  if (Array.isArray(value)) return { ...value };
  return [value];
}

function stretched(value: unknown, factor: number): unknown {
  if (typeof value === 'number') return value * factor;
  if (typeof value === 'string')
    return factor > 1 ? value.repeat(Math.min(Math.abs(factor), 2_000)) : `${value}\u0000`;
  return value;
}

type Mutation =
  | { kind: 'delete'; pick: number }
  | { kind: 'set'; pick: number; value: unknown }
  | { kind: 'add'; key: string; value: unknown }
  | { kind: 'retype'; pick: number }
  | { kind: 'stretch'; pick: number; factor: number }
  | { kind: 'wrap'; how: 'array' | 'object' | 'string' };

const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ kind: fc.constant('delete' as const), pick: fc.nat() }),
  fc.record({ kind: fc.constant('set' as const), pick: fc.nat(), value: hostileValue }),
  fc.record({
    kind: fc.constant('add' as const),
    key: fc.oneof(fc.constantFrom(...PROTOTYPE_KEYS), fc.string({ maxLength: 12 })),
    value: hostileValue,
  }),
  fc.record({ kind: fc.constant('retype' as const), pick: fc.nat() }),
  fc.record({
    kind: fc.constant('stretch' as const),
    pick: fc.nat(),
    factor: fc.constantFrom(-1, 0, 1e-3, 1.5, 10, 1e3, 1e300),
  }),
  {
    weight: 1,
    arbitrary: fc.record({
      kind: fc.constant('wrap' as const),
      how: fc.constantFrom('array' as const, 'object' as const, 'string' as const),
    }),
  },
);

function applyMutation(root: unknown, change: Mutation): unknown {
  if (change.kind === 'wrap') {
    if (change.how === 'array') return [root];
    if (change.how === 'object') return { body: root };
    return JSON.stringify(root);
  }
  if (change.kind === 'add') {
    if (root === null || typeof root !== 'object') return root;
    Object.defineProperty(root, change.key, {
      value: change.value,
      enumerable: true,
      writable: true,
      configurable: true,
    });
    return root;
  }
  const paths = pathsOf(root);
  if (paths.length === 0) return root;
  const path = paths[change.pick % paths.length]!;
  const parent = parentOf(root, path);
  const key = path.at(-1)!;
  if (change.kind === 'delete') delete parent[key];
  else if (change.kind === 'set') parent[key] = change.value;
  else if (change.kind === 'retype') parent[key] = retyped(parent[key]);
  else parent[key] = stretched(parent[key], change.factor);
  return root;
}

/** One to three mutations of a valid example: keys deleted, values replaced, retyped or stretched, keys added. */
export function mutated(example: unknown): fc.Arbitrary<unknown> {
  return fc.array(mutation, { minLength: 1, maxLength: 3 }).map((changes) => {
    let value: unknown = structuredClone(example);
    for (const change of changes) value = applyMutation(value, change);
    return value;
  });
}

/** JSON text as a client might botch it: cut short, a character changed, JS literals, numbers beyond a double. */
export function malformedJson(example: unknown): fc.Arbitrary<string> {
  const text = JSON.stringify(example);
  return fc.oneof(
    fc.nat({ max: text.length - 1 }).map((at) => text.slice(0, at)),
    fc
      .tuple(fc.nat({ max: text.length }), fc.constantFrom('"', ',', '}', ']', ':', '\\', '\u0000', 'x'))
      .map(([at, character]) => text.slice(0, at) + character + text.slice(at)),
    fc.constantFrom(
      '{"a":NaN}',
      '{"a":Infinity}',
      '{a:1}',
      "{'a':1}",
      '{"a":1,}',
      '[1,]',
      '{"a":1} trailing',
      '{"a":1}{"b":2}',
      '// comment\n{}',
      '{"a":"\\x41"}',
      '{"a":"\\ud800"}',
      '\ufeff{}',
      '"just a string"',
      '42',
      'null',
      'true',
      '',
      '   ',
    ),
    fc
      .constantFrom('1e999', '-1e999', '1e-999', '123456789012345678901234567890', '-0.0e0')
      .map((number) => text.replace(/:(-?\d+(\.\d+)?|"[^"]*"|true|false|null)/, `:${number}`)),
    fc.integer({ min: 1_000, max: 50_000 }).map((depth) => '['.repeat(depth) + ']'.repeat(depth)),
  );
}

/** A query string with some of the schema's keys (repeated, bracketed, empty) and hostile values. */
export function hostileQuery(schema: z.ZodType): fc.Arbitrary<string> {
  const keys = Object.keys(objectShape(schema) ?? {});
  const key = fc.oneof(
    { weight: 4, arbitrary: fc.constantFrom(...keys) },
    { weight: 1, arbitrary: fc.constantFrom(...PROTOTYPE_KEYS, 'page[size]', 'a[]', '') },
    { weight: 1, arbitrary: fc.string({ unit: 'grapheme', maxLength: 10 }) },
  );
  const value = fc.oneof(
    hostileString.filter((text) => text.length < 2_000),
    hostileNumber.map(String),
  );
  // Node's HTTP server answers 431 itself to a request line over 16 KB: keep to what reaches the app.
  const pair = fc
    .tuple(key, value)
    .map(([name, text]) => `${encode(name)}=${encode(text)}`)
    .filter((text) => text.length <= 2_000);
  const raw = fc.constantFrom(
    '%',
    '%zz',
    '%E0%A4%A',
    '=',
    '&&&',
    '==1',
    `${keys[0] ?? 'a'}=%00`,
    `${keys[0] ?? 'a'}`,
  );
  return fc
    .array(fc.oneof({ weight: 4, arbitrary: pair }, { weight: 1, arbitrary: raw }), {
      minLength: 1,
      maxLength: 6,
    })
    .map((pairs) => pairs.join('&'));
}

/** encodeURIComponent, with a lone surrogate (which it refuses) written as the replacement character. */
export function encode(text: string): string {
  return encodeURIComponent(
    text.replace(/[\ud800-\udfff]/g, (unit, at: number, whole: string) => {
      const code = unit.charCodeAt(0);
      const next = whole.charCodeAt(at + 1);
      const previous = whole.charCodeAt(at - 1);
      const paired =
        code < 0xdc00 ? next >= 0xdc00 && next <= 0xdfff : previous >= 0xd800 && previous < 0xdc00;
      return paired ? unit : '\ufffd';
    }),
  );
}

/** A path segment: hostile text percent-encoded, or raw percent sequences that do not decode. */
export const hostileSegment: fc.Arbitrary<string> = fc
  .oneof(
    {
      weight: 3,
      arbitrary: hostileString
        .filter((text) => text.length > 0)
        .map(encode)
        .filter((segment) => segment.length <= 4_000),
    },
    { weight: 2, arbitrary: hostileNumber.map((number) => encode(String(number))) },
    {
      weight: 1,
      arbitrary: fc.constantFrom('%', '%zz', '%E0%A4%A', '%C0%AF', '%ff', '%00', '%2F', '%20', '1%'),
    },
  )
  .filter((segment) => {
    // A URL parser collapses "." and ".." segments (and their percent-encodings) into another path.
    const lowered = segment.toLowerCase().replaceAll('%2e', '.');
    return lowered !== '.' && lowered !== '..';
  });
