import { readFileSync } from 'node:fs';
import path from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readCsvLightCurve } from '../../../../../server/science/readers/csv';
import { readFitsLightCurve } from '../../../../../server/science/readers/fits';
import {
  detectLightCurveFormat,
  readLightCurve,
} from '../../../../../server/science/readers/read-light-curve';
import { ReaderError } from '../../../../../server/science/readers/reader-error';
import { ScienceInputError } from '../../../../../server/science/types';
import { binTableHdu, card, fitsFile, imageHdu, lightCurveFits, primaryHdu } from './support/fits-writer';

const encode = (text: string) => new TextEncoder().encode(text);
const TIME = Array.from({ length: 40 }, (_, i) => 1 + i / 720);
const FLUX = TIME.map((_, i) => 1 + (i % 7) * 1e-4);
const VALID_FITS = lightCurveFits(
  TIME,
  FLUX,
  FLUX.map(() => 5e-4),
  { objectName: 'Invented Star 6' },
);
const SCALED_FITS = new Uint8Array(
  readFileSync(path.resolve(__dirname, '../../../../fixtures/readers/lightcurve-scaled.fits')),
);
const VALID_CSV = `# TIMESYS = TDB\ntime,flux,flux_err,quality\n${TIME.map((t, i) => `${t},${FLUX[i]},0.0005,0`).join('\n')}\n`;

describe('readLightCurve', () => {
  it('reads FITS when the file starts with "SIMPLE  =", and text otherwise', () => {
    expect(detectLightCurveFormat(VALID_FITS)).toBe('fits');
    expect(detectLightCurveFormat(encode(VALID_CSV))).toBe('csv');
    const fromFits = readLightCurve(VALID_FITS);
    expect(fromFits.objectName).toBe('Invented Star 6');
    expect(Array.from(fromFits.timeDays)).toEqual(TIME);
    const fromCsv = readLightCurve(encode(VALID_CSV));
    expect(Array.from(fromCsv.timeDays)).toEqual(TIME);
    expect(fromCsv.timeSystem.timesys).toBe('TDB');
  });

  it('passes the EXTNAME, the column choice and the caps through', () => {
    const file = fitsFile(
      primaryHdu(),
      binTableHdu(
        [
          { name: 'TIME', form: 'D', values: [1, 2] },
          { name: 'FLUX', form: 'E', values: [1, 1] },
        ],
        { extname: 'A' },
      ),
      binTableHdu(
        [
          { name: 'T', form: 'D', values: [3, 4] },
          { name: 'RATE', form: 'E', values: [5, 6] },
        ],
        { extname: 'B' },
      ),
    );
    expect(Array.from(readLightCurve(file, { extname: 'B', columns: { flux: 'RATE' } }).flux)).toEqual([
      5, 6,
    ]);
    expect(() => readLightCurve(file, { maxRows: 1 })).toThrow('at most 1 rows are allowed');
    expect(
      Array.from(readLightCurve(encode('a;b\n1;2\n'), { columns: { time: 'b', flux: 'a' } }).flux),
    ).toEqual([1]);
  });

  it('reads as the format the caller names, whatever the bytes look like', () => {
    expect(() => readLightCurve(VALID_FITS, { format: 'csv' })).toThrow(
      'not a text table: the file holds binary data',
    );
    expect(() => readLightCurve(encode(VALID_CSV), { format: 'fits' })).toThrow('not a FITS file');
  });

  it('refuses gzip-compressed files, an unknown format and an EXTNAME for a text file', () => {
    expect(() => readLightCurve(new Uint8Array([0x1f, 0x8b, 8, 0]))).toThrow(
      'the file is gzip-compressed; upload it uncompressed',
    );
    expect(() => readLightCurve(VALID_FITS, { format: 'votable' as never })).toThrow(
      "format must be 'csv' or 'fits', got 'votable'",
    );
    expect(() => readLightCurve(encode(VALID_CSV), { extname: 'LIGHTCURVE' })).toThrow(
      'extname applies to FITS files only',
    );
  });

  it('throws ReaderError, a ScienceInputError, so callers can show its message', () => {
    let caught: unknown;
    try {
      readLightCurve(new Uint8Array(0));
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(ReaderError);
    expect(caught).toBeInstanceOf(ScienceInputError);
    expect((caught as Error).name).toBe('ReaderError');
  });
});

// Safety: whatever the bytes, a reader returns a light curve or throws ReaderError, and soon.
// Not a speed target (those are benchmarks): a bound far above any real read (well under 1 ms), so
// only a hang or a blow-up with input size fails it, even on a loaded machine.
const TIME_LIMIT_MS = 2_000;

function readsSafely(read: () => unknown): void {
  const start = performance.now();
  try {
    read();
  } catch (error) {
    if (!(error instanceof ReaderError)) throw error;
  }
  expect(performance.now() - start).toBeLessThan(TIME_LIMIT_MS);
}

const DANGEROUS_CARDS = [
  card('NAXIS2', 1e12),
  card('NAXIS2', 5_000_000),
  card('NAXIS1', 0),
  card('NAXIS1', 2 ** 40),
  card('NAXIS', 999),
  card('NAXIS', -1),
  card('BITPIX', 7),
  card('TFIELDS', 999),
  card('TFIELDS', 0),
  card('TFORM1', '0D'),
  card('TFORM1', '1000000000D'),
  card('TFORM2', '9999999999999999999999A'),
  card('TFORM2', 'Q'),
  card('TSCAL2', 'abc'),
  card('TNULL1', 1.5),
  card('PCOUNT', 1e15),
  card('GCOUNT', 0),
  card('XTENSION', 'IMAGE'),
  card('EXTNAME', "O''Neil"),
  card('TIMEUNIT', 'fortnight'),
  card('BJDREFI', 'x'),
  "OBJECT  = 'unterminated".padEnd(80),
  'END'.padEnd(80),
  ''.padEnd(80, '\u0001'),
];

function withCard(bytes: Uint8Array, cardIndex: number, text: string): Uint8Array {
  const copy = bytes.slice();
  const offset = cardIndex * 80;
  if (offset + 80 > copy.length) return copy;
  for (let i = 0; i < 80; i += 1) copy[offset + i] = text.charCodeAt(i) & 0xff;
  return copy;
}

describe('readers on random and mutated bytes', () => {
  it('random bytes: only ReaderError, quickly', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 6000 }), (bytes) => {
        readsSafely(() => readLightCurve(bytes));
        readsSafely(() => readLightCurve(bytes, { format: 'fits' }));
        readsSafely(() => readLightCurve(bytes, { format: 'csv' }));
      }),
      { numRuns: 300 },
    );
  });

  it('random bytes after a FITS start, or after whole valid headers: only ReaderError', () => {
    const primaryHeader = VALID_FITS.slice(0, 2880);
    const bothHeaders = VALID_FITS.slice(0, 5760);
    fc.assert(
      fc.property(
        fc.constantFrom(encode('SIMPLE  =                    T'), primaryHeader, bothHeaders),
        fc.uint8Array({ maxLength: 6000 }),
        (prefix, tail) => {
          const bytes = new Uint8Array(prefix.length + tail.length);
          bytes.set(prefix);
          bytes.set(tail, prefix.length);
          readsSafely(() => readFitsLightCurve(bytes));
        },
      ),
      { numRuns: 300 },
    );
  });

  it('valid FITS files with bytes flipped: only ReaderError', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(VALID_FITS, SCALED_FITS),
        fc.array(fc.tuple(fc.nat(), fc.integer({ min: 0, max: 255 })), { minLength: 1, maxLength: 12 }),
        (file, flips) => {
          const bytes = file.slice();
          for (const [position, value] of flips) bytes[position % bytes.length] = value;
          readsSafely(() => readLightCurve(bytes));
        },
      ),
      { numRuns: 400 },
    );
  });

  it('valid FITS files with header bytes flipped: only ReaderError', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 0, max: 5759 }), fc.integer({ min: 0x20, max: 0x7e })), {
          minLength: 1,
          maxLength: 6,
        }),
        (flips) => {
          const bytes = VALID_FITS.slice();
          for (const [position, value] of flips) bytes[position] = value;
          readsSafely(() => readLightCurve(bytes));
        },
      ),
      { numRuns: 400 },
    );
  });

  it('valid FITS files truncated anywhere: only ReaderError, and never a light curve from a cut table', () => {
    fc.assert(
      fc.property(fc.constantFrom(VALID_FITS, SCALED_FITS), fc.nat(), (file, cut) => {
        const length = cut % file.length;
        readsSafely(() => readLightCurve(file.slice(0, length)));
      }),
      { numRuns: 300 },
    );
    // Every cut inside the table data is refused as truncated.
    const dataStart = 5760;
    const rowBytes = 8 + 4 + 4 + 4;
    for (let length = dataStart; length < dataStart + TIME.length * rowBytes; length += 37) {
      expect(() => readLightCurve(VALID_FITS.slice(0, length))).toThrow(/^truncated data/);
    }
  });

  it('valid FITS files with a header card replaced by a dangerous one: only ReaderError', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(VALID_FITS, SCALED_FITS),
        fc.integer({ min: 0, max: 36 * 8 }),
        fc.constantFrom(...DANGEROUS_CARDS),
        (file, cardIndex, text) => {
          readsSafely(() => readLightCurve(withCard(file, cardIndex, text)));
        },
      ),
      { numRuns: 500 },
    );
  });

  it('a header claiming 10^12 rows behind two image HDUs is refused at once, by the byte cap or as truncated', () => {
    const file = fitsFile(
      primaryHdu({ image: { bitpix: 16, axes: [4, 4] } }),
      imageHdu({ bitpix: 8, axes: [10] }),
      binTableHdu(
        [
          { name: 'TIME', form: 'D', values: [1] },
          { name: 'FLUX', form: 'E', values: [1] },
        ],
        { naxis2: 1e12 },
      ),
    );
    readsSafely(() => readLightCurve(file));
    expect(() => readLightCurve(file)).toThrow('claims 12000000000000 bytes of data');
    expect(() => readLightCurve(file, { maxBytes: 10 ** 14, maxRows: 10 ** 13 })).toThrow(/truncated data/);
  });

  it('valid CSV text with characters inserted, deleted or replaced: only ReaderError', () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.tuple(
            fc.nat(),
            fc.constantFrom('insert', 'delete', 'replace'),
            fc.constantFrom(
              ',',
              ';',
              '\t',
              ' ',
              '\n',
              '"',
              '#',
              'x',
              '=',
              '(',
              '[',
              '\u0000',
              '\u00e9',
              '1',
              '.',
            ),
          ),
          { minLength: 1, maxLength: 10 },
        ),
        (edits) => {
          let text = VALID_CSV;
          for (const [position, kind, character] of edits) {
            const at = position % (text.length + 1);
            if (kind === 'insert') text = text.slice(0, at) + character + text.slice(at);
            else if (kind === 'delete') text = text.slice(0, at) + text.slice(at + 1);
            else text = text.slice(0, at) + character + text.slice(at + 1);
          }
          readsSafely(() => readLightCurve(encode(text)));
          readsSafely(() => readCsvLightCurve(text));
        },
      ),
      { numRuns: 400 },
    );
  });

  it('hostile text: very long lines, names and cells finish in time linear in their length', () => {
    const long = 200_000;
    const cases = [
      `${'('.repeat(long)},flux\n1,2\n`,
      `${"'".repeat(long)}x,flux\n1,2\n`,
      `time,flux\n1,${'1'.repeat(long)}x\n`,
      `# ${'time '.repeat(long / 5)}\n1 2\n`,
      `time,flux\n${'1,'.repeat(long)}\n`,
      `"${'a'.repeat(long)}`,
      `${'#'.repeat(long)}=\n`,
    ];
    for (const text of cases) readsSafely(() => readCsvLightCurve(text));
  });
});
