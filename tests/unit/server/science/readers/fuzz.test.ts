import { readFileSync } from 'node:fs';
import path from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readCsvLightCurve } from '../../../../../server/science/readers/csv';
import { readFitsLightCurve } from '../../../../../server/science/readers/fits';
import { readLightCurve } from '../../../../../server/science/readers/read-light-curve';
import { ReaderError } from '../../../../../server/science/readers/reader-error';
import {
  binTableHdu,
  card,
  fitsFile,
  headerBytes,
  imageHdu,
  lightCurveFits,
  primaryHdu,
} from './support/fits-writer';

// Whatever the bytes, a reader returns a light curve or throws ReaderError; and the work it does is
// bounded by the input, not by what a header claims: no array it allocates is longer than the file
// has bytes (a row of any readable column takes at least one byte, a CSV row at least one line).
// That bound is checked by watching the array constructors, not a clock. Runs are random;
// FUZZ_SEED=<seed> replays the one a failure prints.

const SEED = process.env.FUZZ_SEED === undefined ? undefined : Number(process.env.FUZZ_SEED);
const runs = (numRuns: number) => ({ numRuns, ...(SEED === undefined ? {} : { seed: SEED }) });

const fixture = (name: string) =>
  new Uint8Array(readFileSync(path.resolve(__dirname, '../../../../fixtures/readers', name)));
const encode = (text: string) => new TextEncoder().encode(text);

const TIME = Array.from({ length: 30 }, (_, i) => 1 + i / 720);
const FLUX = TIME.map((_, i) => 1 + (i % 7) * 1e-4);
const WRITTEN_FITS = lightCurveFits(
  TIME,
  FLUX,
  FLUX.map(() => 5e-4),
  { objectName: 'Invented Star 9' },
);
// astropy-written files (tests/fixtures/readers, see astropy-readback.json).
const FITS_FILES = [WRITTEN_FITS, fixture('lightcurve-basic.fits'), fixture('lightcurve-scaled.fits')];
const CSV_TEXT = `# TIMESYS = TDB\n# BJDREFI = 2457000\ntime,flux,flux_err,quality,object\n${TIME.map((t, i) => `${t},${FLUX[i]},0.0005,0,Invented Star 9`).join('\n')}\n`;

// The constructors whose length a reader takes from its input.
const SIZED = ['Array', 'Float64Array', 'Float32Array', 'Int32Array'] as const;

/** Runs `read` and answers the longest array it asked for (elements). */
function longestAllocation(read: () => void): number {
  let longest = 0;
  const globals = globalThis as unknown as Record<string, unknown>;
  const originals = SIZED.map((name) => globals[name] as new (...args: unknown[]) => unknown);
  const note = (args: unknown[]) => {
    const first = args[0] as { length?: unknown } | number | undefined;
    const length = typeof first === 'number' ? first : typeof first?.length === 'number' ? first.length : 0;
    longest = Math.max(longest, length);
  };
  SIZED.forEach((name, i) => {
    const original = originals[i]!;
    const probe: unknown = new Proxy(original, {
      construct(target, args, newTarget) {
        note(args);
        return Reflect.construct(target, args, newTarget === probe ? target : newTarget);
      },
      apply(target, self, args) {
        if (args.length === 1) note(args);
        return Reflect.apply(target, self, args);
      },
    });
    globals[name] = probe;
  });
  try {
    read();
  } finally {
    SIZED.forEach((name, i) => {
      globals[name] = originals[i];
    });
  }
  return longest;
}

/** The outcome of a read: a light curve, or the ReaderError's message; anything else is thrown on. */
function outcome(read: () => unknown, inputBytes: number): { error: string | null } {
  let error: string | null = null;
  const longest = longestAllocation(() => {
    try {
      read();
    } catch (caught) {
      if (!(caught instanceof ReaderError)) throw caught;
      error = caught.message;
    }
  });
  if (longest > Math.max(inputBytes, 64)) {
    throw new Error(`allocated an array of ${longest} elements for an input of ${inputBytes} bytes`);
  }
  return { error };
}

function readsEveryWay(bytes: Uint8Array): void {
  outcome(() => readLightCurve(bytes), bytes.length);
  outcome(() => readLightCurve(bytes, { format: 'fits' }), bytes.length);
  outcome(() => readLightCurve(bytes, { format: 'csv' }), bytes.length);
}

type ByteEdit =
  | { kind: 'flip'; at: number; value: number }
  | { kind: 'insert'; at: number; bytes: Uint8Array }
  | { kind: 'delete'; at: number; length: number }
  | { kind: 'truncate'; at: number }
  | { kind: 'repeat'; at: number; length: number };

const byteEdit: fc.Arbitrary<ByteEdit> = fc.oneof(
  fc.record({ kind: fc.constant('flip' as const), at: fc.nat(), value: fc.integer({ min: 0, max: 255 }) }),
  fc.record({
    kind: fc.constant('insert' as const),
    at: fc.nat(),
    bytes: fc.uint8Array({ minLength: 1, maxLength: 100 }),
  }),
  fc.record({
    kind: fc.constant('delete' as const),
    at: fc.nat(),
    length: fc.integer({ min: 1, max: 3_000 }),
  }),
  fc.record({ kind: fc.constant('truncate' as const), at: fc.nat() }),
  fc.record({
    kind: fc.constant('repeat' as const),
    at: fc.nat(),
    length: fc.integer({ min: 1, max: 2_880 }),
  }),
);

function applyEdit(bytes: Uint8Array, edit: ByteEdit): Uint8Array {
  const at = edit.at % (bytes.length + 1);
  const join = (...parts: Uint8Array[]) => {
    const joined = new Uint8Array(parts.reduce((sum, part) => sum + part.length, 0));
    let offset = 0;
    for (const part of parts) {
      joined.set(part, offset);
      offset += part.length;
    }
    return joined;
  };
  switch (edit.kind) {
    case 'flip': {
      const copy = bytes.slice();
      if (copy.length > 0) copy[at % copy.length] = edit.value;
      return copy;
    }
    case 'insert':
      return join(bytes.subarray(0, at), edit.bytes, bytes.subarray(at));
    case 'delete':
      return join(bytes.subarray(0, at), bytes.subarray(at + edit.length));
    case 'truncate':
      return bytes.slice(0, at);
    case 'repeat':
      return join(bytes.subarray(0, at + edit.length), bytes.subarray(at));
  }
}

// Header values a mutated card may take: extremes, wrong types, and what no card may hold.
const FITS_VALUES = [
  '0',
  '-1',
  '1',
  '2',
  '3',
  '7',
  '999',
  '1000',
  '2147483648',
  '9007199254740993',
  '1000000000000',
  '99999999999999999999999999999999999999',
  '1.5',
  '1E300',
  '-1D-300',
  'T',
  'F',
  "'1D'",
  "'1000000000000D'",
  "'0D'",
  "'9999999999999999A'",
  "'2147483647E'",
  "'Q'",
  "'1PD(100)'",
  "''",
  "'BINTABLE'",
  "'IMAGE   '",
  '(1, 2)',
  '',
  'NaN',
  "'unterminated",
];

const CARD_KEYWORDS = [
  'SIMPLE',
  'BITPIX',
  'NAXIS',
  'NAXIS1',
  'NAXIS2',
  'NAXIS3',
  'PCOUNT',
  'GCOUNT',
  'THEAP',
  'TFIELDS',
  'TFORM1',
  'TFORM2',
  'TFORM3',
  'TFORM4',
  'TTYPE1',
  'TTYPE2',
  'TUNIT1',
  'TSCAL2',
  'TZERO2',
  'TNULL4',
  'XTENSION',
  'EXTNAME',
  'TIMEUNIT',
  'BJDREFI',
  'GROUPS',
];

/** The headers of a FITS file: offsets of each header's first card, as far as they can be found. */
function headerStarts(bytes: Uint8Array): number[] {
  const starts: number[] = [];
  for (let offset = 0; offset + 2880 <= bytes.length; offset += 2880) {
    const start = String.fromCharCode(...bytes.subarray(offset, offset + 8));
    if (start === 'SIMPLE  ' || start === 'XTENSION') starts.push(offset);
  }
  return starts;
}

/** The file with one card of one header set to `keyword = value` (added before END when absent). */
function withCardValue(bytes: Uint8Array, header: number, keyword: string, value: string): Uint8Array {
  const starts = headerStarts(bytes);
  const start = starts[header % Math.max(1, starts.length)];
  if (start === undefined) return bytes;
  const text = `${keyword.padEnd(8)}= ${value.padStart(20)}`.slice(0, 80).padEnd(80);
  const copy = bytes.slice();
  const cardAt = (offset: number) => String.fromCharCode(...copy.subarray(offset, offset + 8)).trimEnd();
  for (let offset = start; offset + 80 <= copy.length; offset += 80) {
    const found = cardAt(offset);
    if (found === keyword || found === 'END') {
      for (let i = 0; i < 80; i += 1) copy[offset + i] = text.charCodeAt(i);
      // Moving END down one card keeps the header whole when it still fits in its block.
      if (found === 'END' && (offset + 80) % 2880 !== 0) {
        const end = 'END'.padEnd(80);
        for (let i = 0; i < 80; i += 1) copy[offset + 80 + i] = end.charCodeAt(i);
      }
      break;
    }
  }
  return copy;
}

const cardChange = fc.record({
  header: fc.nat(),
  keyword: fc.constantFrom(...CARD_KEYWORDS),
  value: fc.oneof(
    { weight: 4, arbitrary: fc.constantFrom(...FITS_VALUES) },
    { weight: 1, arbitrary: fc.stringMatching(/^[ -~]{0,30}$/) },
  ),
});

describe('the allocation probe', () => {
  it('sees the arrays a read allocates: one per column, as long as the table', () => {
    const bytes = encode(CSV_TEXT);
    expect(longestAllocation(() => readCsvLightCurve(bytes))).toBe(TIME.length);
    expect(longestAllocation(() => readFitsLightCurve(WRITTEN_FITS))).toBe(TIME.length);
  });
});

describe('FITS reader on random and mutated files', () => {
  it('random bytes, and random bytes after a FITS start: only ReaderError, arrays no longer than the input', () => {
    const start = encode('SIMPLE  =                    T');
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 6_000 }), fc.boolean(), (tail, asFits) => {
        const bytes = asFits ? new Uint8Array([...start, ...tail]) : tail;
        readsEveryWay(bytes);
      }),
      runs(300),
    );
  });

  it('valid files with bytes flipped, inserted, deleted, repeated or cut off: only ReaderError', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...FITS_FILES),
        fc.array(byteEdit, { minLength: 1, maxLength: 4 }),
        (file, edits) => {
          const bytes = edits.reduce(applyEdit, file);
          outcome(() => readFitsLightCurve(bytes), bytes.length);
        },
      ),
      runs(400),
    );
  });

  it('valid files with header values changed (NAXISn, BITPIX, TFORMn, TFIELDS, PCOUNT, THEAP, …): only ReaderError', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...FITS_FILES),
        fc.array(cardChange, { minLength: 1, maxLength: 3 }),
        (file, changes) => {
          const bytes = changes.reduce(
            (changed, { header, keyword, value }) => withCardValue(changed, header, keyword, value),
            file,
          );
          outcome(() => readFitsLightCurve(bytes), bytes.length);
          outcome(() => readFitsLightCurve(bytes, { maxRows: 10 }), bytes.length);
        },
      ),
      runs(500),
    );
  });
});

describe('FITS sizes a header claims are checked before anything is allocated', () => {
  const table = (options: Parameters<typeof binTableHdu>[1], cards: string[] = []) =>
    fitsFile(
      primaryHdu(),
      binTableHdu(
        [
          { name: 'TIME', form: 'D', values: [1, 2, 3] },
          { name: 'FLUX', form: 'E', values: [1, 1, 1] },
        ],
        { ...options, cards },
      ),
    );
  const cases: {
    what: string;
    bytes: Uint8Array;
    options?: Parameters<typeof readFitsLightCurve>[1];
    refusal: RegExp;
  }[] = [
    {
      what: '10^12 rows in 3 KB',
      bytes: table({ naxis2: 1e12 }),
      refusal: /claims 12000000000000 bytes of data/,
    },
    {
      what: '10^12 rows in 3 KB, with caps raised past the claim',
      bytes: table({ naxis2: 1e12 }),
      options: { maxBytes: 10 ** 14, maxRows: 10 ** 13 },
      refusal: /^truncated data: .* expected 12000000000000 bytes of data, found 2880/,
    },
    {
      what: '5,000,000 rows (under both caps) in 3 KB',
      bytes: table({ naxis2: 5_000_000 }),
      refusal: /^truncated data: .* expected 60000000 bytes of data, found 2880/,
    },
    {
      what: 'a heap of 10^15 bytes (PCOUNT)',
      bytes: withCardValue(table({}), 1, 'PCOUNT', '1000000000000000'),
      refusal: /claims 1000000000000036 bytes of data/,
    },

    {
      what: 'a column of 10^12 doubles in one row',
      bytes: withCardValue(
        withCardValue(table({ naxis2: 1 }), 1, 'TFORM1', "'1000000000000D'"),
        1,
        'NAXIS1',
        '8000000000004',
      ),
      refusal: /claims 8000000000004 bytes of data/,
    },
    {
      what: 'an image of 4^999 pixels before the table',
      bytes: fitsFile(
        headerBytes([
          card('SIMPLE', true),
          card('BITPIX', 8),
          card('NAXIS', 999),
          ...Array.from({ length: 999 }, (_, i) => card(`NAXIS${i + 1}`, 4)),
        ]),
        binTableHdu([{ name: 'TIME', form: 'D', values: [1] }]),
      ),
      refusal: /HDU 1 claims more than 10\^308 bytes of data/,
    },
    {
      what: '10^12 rows of nothing (NAXIS1 = 0)',
      bytes: withCardValue(withCardValue(table({ naxis2: 1e12 }), 1, 'NAXIS1', '0'), 1, 'TFIELDS', '0'),
      refusal: /claims 1000000000000 rows; at most 5000000 rows are allowed/,
    },
    {
      what: 'an image extension of 10^12 pixels',
      bytes: fitsFile(
        primaryHdu(),
        withCardValue(imageHdu({ bitpix: 8, axes: [10] }), 0, 'NAXIS1', '1000000000000'),
      ),
      refusal: /claims 1000000000000 bytes of data/,
    },
  ];

  for (const { what, bytes, options, refusal } of cases) {
    it(`${what}: refused, no array longer than the file`, () => {
      const { error } = outcome(() => readFitsLightCurve(bytes, options), bytes.length);
      expect(error).toMatch(refusal);
    });
  }

  it('a heap said to start past the end of the file (THEAP) is never followed: a table without heap columns reads', () => {
    const bytes = withCardValue(table({}), 1, 'THEAP', '1000000000000');
    expect(outcome(() => readFitsLightCurve(bytes), bytes.length).error).toBeNull();
    expect(Array.from(readFitsLightCurve(bytes).timeDays)).toEqual([1, 2, 3]);
  });
});

// Each counterexample the fuzzing found, kept as a plain case.
describe('found by fuzzing', () => {
  it('a comment keyword padded with 300,000 spaces before a U+2028 is read at once (the pattern was quadratic)', () => {
    const text = `# TIMESYS =${' '.repeat(300_000)}TDB\u2028\ntime,flux\n1,1\n2,1\n`;
    expect(readCsvLightCurve(text).timeSystem.timesys).toBe('TDB');
  });

  it('a UTF-16 table holding the character U+0000 is refused as binary, not read into names and messages', () => {
    const text = '\ufefftime,flux,object\n1,1,Star\u0000\n';
    const bytes = new Uint8Array(text.length * 2);
    for (let i = 0; i < text.length; i += 1)
      new DataView(bytes.buffer).setUint16(i * 2, text.charCodeAt(i), true);
    expect(() => readCsvLightCurve(bytes)).toThrow(
      /^not a text table: the file holds binary data \(a NUL character at character \d+\)/,
    );
  });

  it('an unknown TIMEUNIT of a megabyte is quoted in the message by its first 40 characters', () => {
    const text = `# TIMEUNIT = ${'w'.repeat(1_000_000)}\ntime,flux\n1,1\n`;
    expect(() => readCsvLightCurve(text)).toThrow(/^TIMEUNIT 'w{40}' is not a time unit/);
  });

  it('a file of 1,000 tables none of which has a time column names 30 of them and the count', () => {
    const noTime = binTableHdu([{ name: 'RATE', form: 'E', values: [1] }]);
    const bytes = fitsFile(primaryHdu(), ...Array.from({ length: 1_000 }, () => noTime));
    let message = '';
    try {
      readFitsLightCurve(bytes);
    } catch (error) {
      message = (error as Error).message;
    }
    expect(message).toMatch(
      /^no table with a time column and a flux column; the file holds HDU 1 \(primary\); .*… \(1001 in all\)$/,
    );
    expect(message.length).toBeLessThan(2_000);
  });
});

// Cells as uploaders and accidents write them.
const csvCell = fc.oneof(
  { weight: 6, arbitrary: fc.double({ noNaN: true, noDefaultInfinity: true }).map(String) },
  {
    weight: 3,
    arbitrary: fc.constantFrom(
      '',
      'nan',
      'NaN',
      'inf',
      '-inf',
      '1,5',
      '1.5D-03',
      '"1"',
      '"a,b"',
      '""',
      '"',
      '"unbalanced',
      'x"y',
      '\u0000',
      '\ufeff1',
      '\u2028',
      'é',
      '\u{1fa90}',
      ' 1 ',
    ),
  },
  { weight: 1, arbitrary: fc.string({ unit: 'binary', maxLength: 12 }) },
  { weight: 1, arbitrary: fc.integer({ min: 1_000, max: 30_000 }).map((length) => '9'.repeat(length)) },
);

const csvHeader = fc.oneof(
  fc.constant(['time', 'flux', 'flux_err']),
  fc.constant(['BTJD', 'PDCSAP_FLUX', 'PDCSAP_FLUX_ERR', 'QUALITY', 'OBJECT']),
  fc.array(
    fc.oneof(
      fc.constantFrom('time', 'flux', 'TIME [h]', '"flux"', '', '#', 'time (s)'),
      fc.string({ maxLength: 10 }),
    ),
    {
      minLength: 1,
      maxLength: 8,
    },
  ),
  fc
    .integer({ min: 100, max: 3_000 })
    .map((count) => ['time', 'flux', ...Array.from({ length: count }, (_, i) => `c${i}`)]),
);

const csvFile = fc.record({
  encoding: fc.constantFrom('utf-8', 'utf-8 BOM', 'utf-16le BOM', 'utf-16be BOM', 'latin1'),
  delimiter: fc.constantFrom(',', ';', '\t', ' ', '|'),
  lineEnds: fc.array(fc.constantFrom('\n', '\r\n', '\r', '\n\n', '\u2028'), { minLength: 1, maxLength: 3 }),
  comments: fc.array(
    fc.oneof(
      fc.constantFrom(
        '# TIMESYS = TDB',
        '# TIMEUNIT = fortnight',
        '# BJDREFI = x',
        "# OBJECT = 'Star",
        '#',
        '## time flux',
      ),
      fc.integer({ min: 1, max: 5_000 }).map((spaces) => `# TIMESYS =${' '.repeat(spaces)}TDB\u2028x`),
    ),
    { maxLength: 3 },
  ),
  header: fc.option(csvHeader, { nil: undefined }),
  rows: fc.array(fc.array(csvCell, { minLength: 0, maxLength: 6 }), { maxLength: 30 }),
});

type CsvFile = typeof csvFile extends fc.Arbitrary<infer T> ? T : never;

function encodeCsv(file: CsvFile): Uint8Array {
  const lines = [
    ...file.comments,
    ...(file.header ? [file.header.join(file.delimiter)] : []),
    ...file.rows.map((row) => row.join(file.delimiter)),
  ];
  const text = lines.map((line, i) => line + file.lineEnds[i % file.lineEnds.length]).join('');
  switch (file.encoding) {
    case 'utf-8':
      return encode(text);
    case 'utf-8 BOM':
      return encode(`\ufeff${text}`);
    case 'latin1':
      return Uint8Array.from(text, (character) => character.charCodeAt(0) & 0xff);
    default: {
      const bigEndian = file.encoding === 'utf-16be BOM';
      const bytes = new Uint8Array(2 + text.length * 2);
      const view = new DataView(bytes.buffer);
      view.setUint16(0, 0xfeff, !bigEndian);
      for (let i = 0; i < text.length; i += 1) view.setUint16(2 + i * 2, text.charCodeAt(i), !bigEndian);
      return bytes;
    }
  }
}

describe('CSV reader on random and mutated text', () => {
  it('tables with BOMs, UTF-16, mixed line ends, many columns, huge cells, unbalanced quotes and NULs: only ReaderError', () => {
    fc.assert(
      fc.property(csvFile, (file) => {
        const bytes = encodeCsv(file);
        outcome(() => readCsvLightCurve(bytes), bytes.length);
        outcome(() => readCsvLightCurve(bytes, { columns: { time: 0, flux: 1 } }), bytes.length);
      }),
      runs(300),
    );
  });

  it('a valid table with bytes flipped, inserted, deleted, repeated or cut off: only ReaderError', () => {
    const valid = encode(CSV_TEXT);
    fc.assert(
      fc.property(fc.array(byteEdit, { minLength: 1, maxLength: 4 }), (edits) => {
        const bytes = edits.reduce(applyEdit, valid);
        outcome(() => readCsvLightCurve(bytes), bytes.length);
        outcome(() => readLightCurve(bytes), bytes.length);
      }),
      runs(400),
    );
  });

  it('hostile column choices and caps: only ReaderError', () => {
    const valid = encode(CSV_TEXT);
    const ref = fc.oneof(
      fc.integer({ min: -3, max: 8 }),
      fc.constantFrom(1.5, Number.NaN, 1e12, '', 'TIME', 'nope', '__proto__', 'flux (s)'),
    );
    const cap = fc.option(
      fc.oneof(fc.integer({ min: -2, max: 100 }), fc.constantFrom(0.5, Number.NaN, 2 ** 60)),
      { nil: undefined },
    );
    fc.assert(
      fc.property(
        fc.record({ time: ref, flux: ref }),
        fc.option(ref, { nil: null }),
        cap,
        cap,
        (columns, fluxErr, maxBytes, maxRows) => {
          const options = { columns: { ...columns, fluxErr }, maxBytes, maxRows };
          outcome(() => readCsvLightCurve(valid, options), valid.length);
          outcome(() => readFitsLightCurve(WRITTEN_FITS, options), WRITTEN_FITS.length);
        },
      ),
      runs(300),
    );
  });
});
