import { existsSync, readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { readCsvLightCurve } from '../../../../../server/science/readers/csv';
import {
  listFitsHdus,
  looksLikeFits,
  readFitsColumn,
  readFitsLightCurve,
  readFitsTableLayout,
} from '../../../../../server/science/readers/fits';
import { ReaderError } from '../../../../../server/science/readers/reader-error';
import {
  binTableHdu,
  card,
  concat,
  fitsFile,
  headerBytes,
  imageHdu,
  lightCurveFits,
  primaryHdu,
  type TableColumnSpec,
} from './support/fits-writer';

const TIME = [1.0, 1.5, 2.0, 2.5];
const FLUX = [1.0, 0.99, 1.01, 1.0];

function tableFile(
  columns: TableColumnSpec[],
  options: Parameters<typeof binTableHdu>[1] = {},
  primaryCards: string[] = [],
) {
  return fitsFile(primaryHdu({ cards: primaryCards }), binTableHdu(columns, options));
}

function onlyTable(bytes: Uint8Array) {
  const hdu = listFitsHdus(bytes).find((item) => item.kind === 'bintable')!;
  return readFitsTableLayout(hdu);
}

function expectReaderError(run: () => unknown, message: string | RegExp) {
  let caught: unknown;
  try {
    run();
  } catch (error) {
    caught = error;
  }
  expect(caught).toBeInstanceOf(ReaderError);
  if (typeof message === 'string') expect((caught as Error).message).toContain(message);
  else expect((caught as Error).message).toMatch(message);
}

describe('readFitsColumn: every TFORM type', () => {
  const columns: TableColumnSpec[] = [
    { name: 'D_COL', form: 'D', values: [1.25, -2.5e-300, Number.NaN, 2459000.123456789] },
    { name: 'E_COL', form: 'E', values: [1.5, -0.25, Number.NaN, 3.0e38] },
    { name: 'J_COL', form: 'J', values: [0, -2147483648, 2147483647, 7] },
    { name: 'I_COL', form: 'I', values: [0, -32768, 32767, -1] },
    { name: 'K_COL', form: 'K', values: [0n, -(2n ** 53n), 2n ** 53n, 123456789012n] },
    { name: 'B_COL', form: 'B', values: [0, 255, 128, 1] },
    { name: 'L_COL', form: 'L', values: [true, false, null, true] },
    { name: 'A_COL', form: '6A', values: ['abc', 'six ch', '', 'x y'] },
    {
      name: 'V_COL',
      form: '3D',
      values: [
        [1, 2, 3],
        [4, 5, 6],
        [7, 8, 9],
        [10, 11, 12],
      ],
    },
    { name: 'P_COL', form: '1PE(5)', values: [0, 0, 0, 0] },
  ];
  const bytes = tableFile(columns);
  const table = onlyTable(bytes);
  const read = (name: string) =>
    readFitsColumn(bytes, table, table.columns.find((column) => column.name === name)!);

  it('lays the columns out as TFORM says: widths 8, 4, 4, 2, 8, 1, 1, 6, 24, 8', () => {
    // Widths from FITS Standard 4.0 §7.3.1, Table 18.
    expect(table.columns.map((column) => column.byteWidth)).toEqual([8, 4, 4, 2, 8, 1, 1, 6, 24, 8]);
    expect(table.rowBytes).toBe(66);
    expect(table.rows).toBe(4);
  });

  it('reads D and E as doubles, with IEEE NaN kept', () => {
    expect(Array.from(read('D_COL') as Float64Array)).toEqual([
      1.25,
      -2.5e-300,
      Number.NaN,
      2459000.123456789,
    ]);
    expect(Array.from(read('E_COL') as Float64Array)).toEqual([1.5, -0.25, Number.NaN, Math.fround(3.0e38)]);
  });

  it('reads J, I, K (big-endian, signed) and B (unsigned byte)', () => {
    expect(Array.from(read('J_COL') as Float64Array)).toEqual([0, -2147483648, 2147483647, 7]);
    expect(Array.from(read('I_COL') as Float64Array)).toEqual([0, -32768, 32767, -1]);
    expect(Array.from(read('K_COL') as Float64Array)).toEqual([0, -(2 ** 53), 2 ** 53, 123456789012]);
    expect(Array.from(read('B_COL') as Float64Array)).toEqual([0, 255, 128, 1]);
  });

  it('reads L as 1 for T, 0 for F and NaN for a null byte, and A as trimmed strings', () => {
    expect(Array.from(read('L_COL') as Float64Array)).toEqual([1, 0, Number.NaN, 1]);
    expect(read('A_COL')).toEqual(['abc', 'six ch', '', 'x y']);
  });

  it('reads the first element of a repeat-3 D column', () => {
    expect(Array.from(read('V_COL') as Float64Array)).toEqual([1, 4, 7, 10]);
  });

  it('refuses to read a variable-length (P) column, naming the readable types', () => {
    expectReaderError(
      () => read('P_COL'),
      "has TFORM '1PE(5)', which this reader does not read; readable types: L, B, I, J, K, A, E, D",
    );
  });
});

describe('readFitsColumn: scaling and nulls', () => {
  it('applies TSCAL and TZERO to an integer column: physical = TZERO + TSCAL × stored', () => {
    const bytes = tableFile([{ name: 'FLUX', form: 'J', scale: 1e-6, zero: 1, values: [0, 250, -1000, 1] }]);
    const table = onlyTable(bytes);
    const values = readFitsColumn(bytes, table, table.columns[0]!) as Float64Array;
    expect(Array.from(values)).toEqual([1, 1 + 1e-6 * 250, 1 + 1e-6 * -1000, 1 + 1e-6]);
  });

  it('reads the unsigned 16-bit convention (TZERO = 32768 on I) as 0 to 65535', () => {
    // FITS Standard 4.0 §7.3.2, Table 19: I with TZERO = 32768 holds unsigned 16-bit integers.
    const bytes = tableFile([{ name: 'COUNTS', form: 'I', zero: 32768, values: [-32768, 0, 32767] }]);
    const table = onlyTable(bytes);
    expect(Array.from(readFitsColumn(bytes, table, table.columns[0]!) as Float64Array)).toEqual([
      0, 32768, 65535,
    ]);
  });

  it('turns a stored value equal to TNULL into NaN before scaling, on J and B columns', () => {
    const bytes = tableFile([
      { name: 'FLUX', form: 'J', scale: 0.5, zero: 10, tnull: -1, values: [4, -1, 0] },
      { name: 'BACK', form: 'B', tnull: 255, values: [255, 3, 254] },
    ]);
    const table = onlyTable(bytes);
    expect(Array.from(readFitsColumn(bytes, table, table.columns[0]!) as Float64Array)).toEqual([
      12,
      Number.NaN,
      10,
    ]);
    expect(Array.from(readFitsColumn(bytes, table, table.columns[1]!) as Float64Array)).toEqual([
      Number.NaN,
      3,
      254,
    ]);
  });

  it('refuses a column with repeat count 0', () => {
    const bytes = tableFile([
      { name: 'TIME', form: '0D', values: [] },
      { name: 'FLUX', form: 'E', values: [1, 2] },
    ]);
    const table = onlyTable(bytes);
    expectReaderError(
      () => readFitsColumn(bytes, table, table.columns[0]!),
      "column 'TIME' of HDU 2 (BINTABLE) has repeat count 0",
    );
  });
});

describe('readFitsLightCurve', () => {
  it('reads TIME, PDCSAP_FLUX, PDCSAP_FLUX_ERR and QUALITY with the time keywords and OBJECT', () => {
    const bytes = lightCurveFits(TIME, FLUX, [0.001, 0.001, 0.002, 0.001], { objectName: 'Invented Star 9' });
    const curve = readFitsLightCurve(bytes);
    expect(Array.from(curve.timeDays)).toEqual(TIME);
    expect(Array.from(curve.flux)).toEqual(FLUX.map(Math.fround));
    expect(Array.from(curve.fluxErr!)).toEqual([0.001, 0.001, 0.002, 0.001].map(Math.fround));
    expect(Array.from(curve.quality!)).toEqual([1, 0, 0, 0]);
    expect(curve.objectName).toBe('Invented Star 9');
    expect(curve.timeSystem).toEqual({
      timesys: 'TDB',
      timeref: 'SOLARSYSTEM',
      timeunit: 'd',
      bjdRefDays: 2457000,
    });
  });

  it('skips a primary image and an IMAGE extension before the table', () => {
    const bytes = fitsFile(
      primaryHdu({ image: { bitpix: 16, axes: [7, 5] } }),
      imageHdu({ bitpix: -32, axes: [30, 40] }, { extname: 'APERTURE' }),
      binTableHdu([
        { name: 'TIME', form: 'D', values: TIME },
        { name: 'FLUX', form: 'E', values: FLUX },
      ]),
    );
    expect(listFitsHdus(bytes).map((hdu) => hdu.kind)).toEqual(['primary', 'image', 'bintable']);
    expect(Array.from(readFitsLightCurve(bytes).timeDays)).toEqual(TIME);
  });

  it('skips an unknown extension and a table without a flux column, and reads the first table with both', () => {
    const bytes = fitsFile(
      primaryHdu(),
      imageHdu({ bitpix: 8, axes: [100] }, { cards: [] }).map((byte, i) =>
        i < 20 ? "XTENSION= 'FOREIGN '".charCodeAt(i) : byte,
      ),
      binTableHdu([{ name: 'TIME', form: 'D', values: TIME }], { extname: 'TIMES_ONLY' }),
      binTableHdu(
        [
          { name: 'TIME', form: 'D', values: [9, 10] },
          { name: 'SAP_FLUX', form: 'E', values: [5, 6] },
        ],
        { extname: 'SECOND' },
      ),
    );
    expect(listFitsHdus(bytes).map((hdu) => hdu.kind)).toEqual(['primary', 'other', 'bintable', 'bintable']);
    expect(Array.from(readFitsLightCurve(bytes).flux)).toEqual([5, 6]);
  });

  it('reads the table named by EXTNAME, case-insensitively, when the caller asks', () => {
    const bytes = fitsFile(
      primaryHdu(),
      binTableHdu(
        [
          { name: 'TIME', form: 'D', values: TIME },
          { name: 'FLUX', form: 'E', values: FLUX },
        ],
        { extname: 'FIRST' },
      ),
      binTableHdu(
        [
          { name: 'TIME', form: 'D', values: [7, 8] },
          { name: 'FLUX', form: 'E', values: [3, 4] },
        ],
        { extname: 'Second' },
      ),
    );
    expect(Array.from(readFitsLightCurve(bytes).timeDays)).toEqual(TIME);
    expect(Array.from(readFitsLightCurve(bytes, { extname: 'SECOND' }).timeDays)).toEqual([7, 8]);
    expectReaderError(
      () => readFitsLightCurve(bytes, { extname: 'THIRD' }),
      "no binary table has EXTNAME 'THIRD'; the file holds HDU 1 (primary); HDU 2 (BINTABLE 'FIRST') with columns TIME, FLUX; HDU 3 (BINTABLE 'Second') with columns TIME, FLUX",
    );
  });

  it('takes the time keywords and OBJECT from the primary header when the table has none', () => {
    const bytes = tableFile(
      [
        { name: 'TIME', form: 'D', values: TIME },
        { name: 'FLUX', form: 'E', values: FLUX },
      ],
      {},
      [
        card('OBJECT', 'Invented Star 3'),
        card('TIMESYS', 'TDB'),
        card('TIMEREF', 'SOLARSYSTEM'),
        card('BJDREF', { raw: '2454833.0' }),
      ],
    );
    const curve = readFitsLightCurve(bytes);
    expect(curve.objectName).toBe('Invented Star 3');
    expect(curve.timeSystem).toEqual({
      timesys: 'TDB',
      timeref: 'SOLARSYSTEM',
      timeunit: null,
      bjdRefDays: 2454833,
    });
  });

  it("prefers the table's keywords to the primary header's, and adds BJDREFI and BJDREFF", () => {
    const bytes = tableFile(
      [
        { name: 'TIME', form: 'D', values: TIME },
        { name: 'FLUX', form: 'E', values: FLUX },
      ],
      { cards: [card('TIMESYS', 'TDB'), card('BJDREFI', 2454833), card('BJDREFF', { raw: '0.5D0' })] },
      [card('TIMESYS', 'UTC'), card('TIMEREF', 'LOCAL'), card('BJDREF', { raw: '2400000.0' })],
    );
    expect(readFitsLightCurve(bytes).timeSystem).toEqual({
      timesys: 'TDB',
      timeref: 'LOCAL',
      timeunit: null,
      bjdRefDays: 2454833.5,
    });
  });

  it('gives null time-system fields when no header says anything', () => {
    const bytes = tableFile([
      { name: 'TIME', form: 'D', values: TIME },
      { name: 'FLUX', form: 'E', values: FLUX },
    ]);
    expect(readFitsLightCurve(bytes)).toMatchObject({
      timeSystem: { timesys: null, timeref: null, timeunit: null, bjdRefDays: null },
      objectName: null,
      fluxErr: null,
      quality: null,
    });
  });

  it('converts times to days by TIMEUNIT, and by the time column TUNIT when it names a unit', () => {
    const seconds = tableFile(
      [
        { name: 'TIME', form: 'D', values: [0, 86400, 43200] },
        { name: 'FLUX', form: 'E', values: [1, 1, 1] },
      ],
      { cards: [card('TIMEUNIT', 's')] },
    );
    expect(Array.from(readFitsLightCurve(seconds).timeDays)).toEqual([0, 1, 0.5]);
    const hours = tableFile(
      [
        { name: 'TIME', form: 'D', unit: 'h', values: [0, 24, 12] },
        { name: 'FLUX', form: 'E', values: [1, 1, 1] },
      ],
      {
        cards: [card('TIMEUNIT', 'd')],
      },
    );
    expect(Array.from(readFitsLightCurve(hours).timeDays)).toEqual([0, 1, 0.5]);
    const unknown = tableFile(
      [
        { name: 'TIME', form: 'D', values: [0] },
        { name: 'FLUX', form: 'E', values: [1] },
      ],
      {
        cards: [card('TIMEUNIT', 'fortnight')],
      },
    );
    expectReaderError(
      () => readFitsLightCurve(unknown),
      "TIMEUNIT 'fortnight' is not a time unit this reader knows",
    );
  });

  it('reads columns the uploader chose by name or 0-based index', () => {
    const bytes = tableFile([
      { name: 'T_OBS', form: 'D', values: TIME },
      { name: 'RATE', form: 'E', values: FLUX },
      { name: 'RATE_UNC', form: 'E', values: [1, 2, 3, 4] },
      { name: 'FLAGS_A', form: 'L', values: [true, false, false, true] },
    ]);
    expectReaderError(() => readFitsLightCurve(bytes), 'no table with a time column and a flux column');
    const curve = readFitsLightCurve(bytes, {
      columns: { time: 't_obs', flux: 1, fluxErr: 'RATE_UNC', quality: 3 },
    });
    expect(Array.from(curve.timeDays)).toEqual(TIME);
    expect(Array.from(curve.fluxErr!)).toEqual([1, 2, 3, 4]);
    expect(Array.from(curve.quality!)).toEqual([1, 0, 0, 1]);
  });

  it('refuses a text column chosen as flux', () => {
    const bytes = tableFile([
      { name: 'TIME', form: 'D', values: TIME },
      { name: 'FLUX', form: '4A', values: ['a', 'b', 'c', 'd'] },
    ]);
    expectReaderError(
      () => readFitsLightCurve(bytes),
      "column 'FLUX' of HDU 2 (BINTABLE), chosen for flux, holds text (TFORM '4A'), not numbers",
    );
  });

  it('when no table has a flux column, names the tables and their columns', () => {
    const bytes = tableFile(
      [
        { name: 'TIME', form: 'D', values: TIME },
        { name: 'BKG', form: 'E', values: FLUX },
      ],
      { extname: 'EXTRA' },
    );
    expectReaderError(
      () => readFitsLightCurve(bytes),
      "no table with a time column and a flux column; the file holds HDU 1 (primary); HDU 2 (BINTABLE 'EXTRA') with columns TIME, BKG",
    );
  });

  it('when the file has no binary table at all, says so and lists the HDUs', () => {
    const bytes = fitsFile(
      primaryHdu({ image: { bitpix: 8, axes: [4, 4] } }),
      imageHdu({ bitpix: 16, axes: [3] }),
    );
    expectReaderError(
      () => readFitsLightCurve(bytes),
      "no binary table (XTENSION = 'BINTABLE') in the file; it holds HDU 1 (primary); HDU 2 (IMAGE)",
    );
  });

  it('reads a file whose last HDU lacks the fill to a whole block', () => {
    const bytes = fitsFile(
      primaryHdu(),
      binTableHdu(
        [
          { name: 'TIME', form: 'D', values: TIME },
          { name: 'FLUX', form: 'E', values: FLUX },
        ],
        { pad: false },
      ),
    );
    expect(bytes.length % 2880).not.toBe(0);
    expect(Array.from(readFitsLightCurve(bytes).timeDays)).toEqual(TIME);
  });

  it('ignores special records after the last HDU that do not start with XTENSION', () => {
    const bytes = concat(lightCurveFits(TIME, FLUX, FLUX), new Uint8Array(2880).fill(0x41));
    expect(readFitsLightCurve(bytes).timeDays).toHaveLength(4);
  });
});

describe('readFitsLightCurve: broken and hostile files', () => {
  const good = lightCurveFits(TIME, FLUX, FLUX);

  it('refuses a file that is not FITS', () => {
    expectReaderError(
      () => readFitsLightCurve(new TextEncoder().encode('time,flux\n1,2\n')),
      'not a FITS file',
    );
    expect(looksLikeFits(new TextEncoder().encode('SIMPLE  = T'))).toBe(true);
    expect(looksLikeFits(new Uint8Array(0))).toBe(false);
  });

  it('refuses SIMPLE = F', () => {
    const bytes = good.slice();
    bytes[29] = 'F'.charCodeAt(0);
    expectReaderError(
      () => readFitsLightCurve(bytes),
      'SIMPLE = F: the file says it does not conform to the FITS Standard',
    );
  });

  it('refuses a file truncated inside the table data, saying how many bytes it expected and found', () => {
    // Header: 1 primary block + 1 table block; 4 rows × 20 bytes = 80 bytes of data.
    const truncated = good.slice(0, 2 * 2880 + 50);
    expectReaderError(
      () => readFitsLightCurve(truncated),
      "truncated data: HDU 2 (BINTABLE 'LIGHTCURVE') expected 80 bytes of data, found 50",
    );
  });

  it('refuses a file truncated inside an extension header', () => {
    expectReaderError(
      () => readFitsLightCurve(good.slice(0, 2880 + 1000)),
      'truncated header: HDU 2 needs at least one 2880-byte block, found 1000 bytes',
    );
  });

  it('refuses a header claiming 10^12 rows before allocating anything', () => {
    const bytes = fitsFile(
      primaryHdu(),
      binTableHdu(
        [
          { name: 'TIME', form: 'D', values: TIME },
          { name: 'FLUX', form: 'E', values: FLUX },
        ],
        { naxis2: 1e12 },
      ),
    );
    // Refused from the header alone: the message names the claimed size, which was never allocated.
    expectReaderError(
      () => readFitsLightCurve(bytes),
      'claims 12000000000000 bytes of data; at most 209715200 bytes are allowed',
    );
  });

  it('refuses more rows than maxRows, and more claimed bytes than the file holds', () => {
    expectReaderError(
      () => readFitsLightCurve(good, { maxRows: 3 }),
      "the table in HDU 2 (BINTABLE 'LIGHTCURVE') claims 4 rows; at most 3 rows are allowed",
    );
    const bytes = fitsFile(
      primaryHdu(),
      binTableHdu(
        [
          { name: 'TIME', form: 'D', values: TIME },
          { name: 'FLUX', form: 'E', values: FLUX },
        ],
        { naxis2: 4000 },
      ),
    );
    expectReaderError(
      () => readFitsLightCurve(bytes),
      'truncated data: HDU 2 (BINTABLE) expected 48000 bytes of data, found 2880',
    );
  });

  it('refuses an input over maxBytes, and a cap that is not a positive whole number', () => {
    expectReaderError(
      () => readFitsLightCurve(good, { maxBytes: 1000 }),
      `the file is ${good.length} bytes; at most 1000 bytes are allowed`,
    );
    expectReaderError(
      () => readFitsLightCurve(good, { maxRows: -1 }),
      'maxRows must be a positive whole number, got -1',
    );
  });

  it('refuses an image whose size overflows, and a BITPIX the standard does not allow', () => {
    const big = { raw: '1'.padEnd(60, '0') }; // 10^59, an integer card value
    const axes = (third: number | { raw: string }) =>
      [1, 2, 3, 4, 5, 6].map((n) => card(`NAXIS${n}`, n === 3 ? third : big));
    const empty = fitsFile(
      headerBytes([card('SIMPLE', true), card('BITPIX', -64), card('NAXIS', 6), ...axes(0)]),
    );
    // NAXIS3 = 0 makes the product 0: no data, whatever the other axes say.
    expectReaderError(() => readFitsLightCurve(empty), "no binary table (XTENSION = 'BINTABLE') in the file");
    const overflow = fitsFile(
      headerBytes([card('SIMPLE', true), card('BITPIX', -64), card('NAXIS', 6), ...axes(big)]),
    );
    expectReaderError(
      () => readFitsLightCurve(overflow),
      'HDU 1 claims more than 10^308 bytes of data; at most 209715200 bytes are allowed',
    );
    const bitpix = fitsFile(headerBytes([card('SIMPLE', true), card('BITPIX', 12), card('NAXIS', 0)]));
    expectReaderError(
      () => readFitsLightCurve(bitpix),
      'BITPIX in HDU 1 must be one of 8, 16, 32, 64, -32, -64, got 12',
    );
  });

  it('refuses a missing mandatory keyword, a bad TFORM and widths that do not add up to NAXIS1', () => {
    const noNaxis = fitsFile(headerBytes([card('SIMPLE', true), card('BITPIX', 8)]));
    expectReaderError(
      () => readFitsLightCurve(noNaxis),
      'HDU 1 has no NAXIS keyword, which the FITS Standard requires',
    );
    const badForm = tableFile([
      { name: 'TIME', form: 'D', values: TIME },
      { name: 'FLUX', form: 'E', values: FLUX },
    ]);
    const text = new TextDecoder('latin1').decode(badForm);
    const at = text.indexOf("TFORM2  = 'E");
    badForm[at + 11] = 'Z'.charCodeAt(0);
    expectReaderError(
      () => readFitsLightCurve(badForm),
      "TFORM2 'Z' in HDU 2 (BINTABLE) is not a binary-table format",
    );
    const wide = tableFile([
      { name: 'TIME', form: 'D', values: TIME },
      { name: 'FLUX', form: 'E', values: FLUX },
    ]);
    const naxis1 = new TextDecoder('latin1').decode(wide).indexOf('NAXIS1  =');
    wide.set(new TextEncoder().encode(card('NAXIS1', 13)), naxis1);
    expectReaderError(
      () => readFitsLightCurve(wide),
      'the columns of HDU 2 (BINTABLE) take 12 bytes per row, but NAXIS1 says 13',
    );
  });

  it('names the header card that is not valid', () => {
    const bytes = good.slice();
    const offset = 2880 + 5 * 80; // HDU 2, card 6 (PCOUNT)
    bytes.set(new TextEncoder().encode(`PCOUNT  = zero`.padEnd(80)), offset);
    expectReaderError(
      () => readFitsLightCurve(bytes),
      "HDU 2, header card 6 (PCOUNT) is not valid: 'zero' is not a FITS value",
    );
  });
});

// Fixtures written by astropy 5.2.1 astropy.io.fits (tests/reference/make_reader_fixtures.py): our
// reader must give astropy's numbers. astropy does not apply TNULL to scaled columns, so where the
// stored value equals TNULL we expect NaN (FITS Standard 4.0 §7.3.3) instead of astropy's number.
describe('readers compared with astropy 5.2.1 astropy.io.fits', () => {
  const directory = path.resolve(__dirname, '../../../../fixtures/readers');
  interface Readback {
    source: string;
    files: Record<
      string,
      {
        hdus: { number: number; kind: string; header: Record<string, string | number> }[];
        tables: Record<
          string,
          {
            number: number;
            rows: number;
            columns: Record<
              string,
              { format: string; tnull: number | null; values: (number | boolean | string | null)[] }
            >;
            stored: Record<string, number[]>;
          }
        >;
      }
    >;
  }
  const readback = JSON.parse(
    readFileSync(path.join(directory, 'astropy-readback.json'), 'utf8'),
  ) as Readback;

  it('was written by astropy 5.2.1', () => {
    expect(readback.source).toBe('astropy 5.2.1 astropy.io.fits');
  });

  for (const [file, expected] of Object.entries(readback.files)) {
    const bytes = new Uint8Array(readFileSync(path.join(directory, file)));

    it(`${file}: finds the same HDUs and EXTNAMEs as astropy`, () => {
      const hdus = listFitsHdus(bytes);
      const kinds: Record<string, string> = {
        PrimaryHDU: 'primary',
        ImageHDU: 'image',
        BinTableHDU: 'bintable',
      };
      expect(hdus.map((hdu) => hdu.kind)).toEqual(expected.hdus.map((hdu) => kinds[hdu.kind]));
      expect(hdus.map((hdu) => hdu.extname ?? null)).toEqual(
        expected.hdus.map((hdu) => hdu.header.EXTNAME ?? null),
      );
    });

    for (const [extname, table] of Object.entries(expected.tables)) {
      it(`${file}, table ${extname}: every column equals astropy's values`, () => {
        const hdu = listFitsHdus(bytes)[table.number - 1]!;
        const layout = readFitsTableLayout(hdu);
        expect(layout.rows).toBe(table.rows);
        for (const [name, column] of Object.entries(table.columns)) {
          const ours = readFitsColumn(bytes, layout, layout.columns.find((item) => item.name === name)!);
          const stored = table.stored[name];
          const wanted = column.values.map((value, row) => {
            if (column.tnull !== null && stored?.[row] === column.tnull) return Number.NaN;
            if (value === null) return Number.NaN;
            if (typeof value === 'boolean') return value ? 1 : 0;
            return value;
          });
          expect(Array.from<number | string>(ours), `column ${name}`).toEqual(wanted);
        }
      });
    }
  }

  it("lightcurve-basic.fits: the light curve has astropy's TIME, PDCSAP_FLUX, its error, QUALITY and keywords", () => {
    const table = readback.files['lightcurve-basic.fits']!.tables.LIGHTCURVE!;
    const curve = readFitsLightCurve(
      new Uint8Array(readFileSync(path.join(directory, 'lightcurve-basic.fits'))),
    );
    expect(Array.from(curve.timeDays)).toEqual(table.columns.TIME!.values);
    expect(Array.from(curve.flux)).toEqual(
      table.columns.PDCSAP_FLUX!.values.map((value) => value ?? Number.NaN),
    );
    expect(Array.from(curve.fluxErr!)).toEqual(table.columns.PDCSAP_FLUX_ERR!.values);
    expect(Array.from(curve.quality!)).toEqual(table.columns.QUALITY!.values);
    expect(curve.objectName).toBe(readback.files['lightcurve-basic.fits']!.hdus[0]!.header.OBJECT);
    expect(curve.timeSystem).toEqual({
      timesys: 'TDB',
      timeref: 'SOLARSYSTEM',
      timeunit: 'd',
      bjdRefDays: 2457000,
    });
  });

  it('lightcurve-scaled.fits: skips the images, reads BINNED with keywords from the primary header, or RAW by EXTNAME', () => {
    const bytes = new Uint8Array(readFileSync(path.join(directory, 'lightcurve-scaled.fits')));
    const { tables, hdus } = readback.files['lightcurve-scaled.fits']!;
    const curve = readFitsLightCurve(bytes);
    const binned = tables.BINNED!;
    expect(Array.from(curve.timeDays)).toEqual(binned.columns.TIME!.values);
    expect(Number.isNaN(curve.flux[2]!)).toBe(true); // stored TNULL
    expect(curve.flux[0]).toBe(binned.columns.FLUX!.values[0]);
    expect(Array.from(curve.fluxErr!)).toEqual(binned.columns.FLUX_ERR!.values);
    expect(curve.objectName).toBe(hdus[0]!.header.OBJECT);
    expect(curve.timeSystem).toEqual({
      timesys: 'TDB',
      timeref: 'SOLARSYSTEM',
      timeunit: 'd',
      bjdRefDays: hdus[0]!.header.BJDREF,
    });
    const raw = readFitsLightCurve(bytes, { extname: 'raw' });
    expect(Array.from(raw.flux)).toEqual(tables.RAW!.columns.SAP_FLUX!.values);
  });
});

// The period-search fixtures (tests/reference/make_reference.py, astropy 5.2.1) hold FITS files in
// tests/fixtures/reference/; each is compared with the CSV of the same name and with what the JSON of
// the same name says about the FITS file (points, keywords, HDUs, TNULL rows), where it says it.
describe('reference fixtures in tests/fixtures/reference', () => {
  const directory = path.resolve(__dirname, '../../../../fixtures/reference');
  const files = existsSync(directory) ? readdirSync(directory).filter((name) => name.endsWith('.fits')) : [];

  it.skipIf(files.length > 0)('has no FITS files yet (nothing to compare)', () => {
    expect(files).toEqual([]);
  });

  for (const file of files) {
    const base = path.join(directory, file.replace(/\.fits$/, ''));
    const bytes = new Uint8Array(readFileSync(path.join(directory, file)));

    it(`${file}: has the same times, fluxes and flux errors as the CSV of the same name`, () => {
      const curve = readFitsLightCurve(bytes);
      expect(curve.timeDays.length).toBeGreaterThan(0);
      if (!existsSync(`${base}.csv`)) return;
      const fromCsv = readCsvLightCurve(new Uint8Array(readFileSync(`${base}.csv`)));
      expect(fromCsv.timeDays.length).toBe(curve.timeDays.length);
      // The CSV writes 8 to 17 significant digits; the FITS columns are float32 or float64.
      for (let i = 0; i < curve.timeDays.length; i += 1) {
        expectClose(fromCsv.timeDays[i]!, curve.timeDays[i]!, 1e-9);
        expectClose(fromCsv.flux[i]!, curve.flux[i]!, 1e-6);
        if (curve.fluxErr && fromCsv.fluxErr) expectClose(fromCsv.fluxErr[i]!, curve.fluxErr[i]!, 1e-6);
      }
    });

    it(`${file}: matches what the JSON of the same name says about the file`, () => {
      if (!existsSync(`${base}.json`)) return;
      const json = JSON.parse(readFileSync(`${base}.json`, 'utf8')) as ReferenceJson;
      const curve = readFitsLightCurve(bytes);
      if (typeof json.points === 'number') expect(curve.timeDays.length).toBe(json.points);
      const fits = json.fits;
      if (!fits) return;
      const hdus = listFitsHdus(bytes);
      if (fits.hdus) expect(hdus).toHaveLength(fits.hdus.length);
      if (fits.table_extname && fits.table_hdu_index !== undefined) {
        expect(hdus[fits.table_hdu_index]?.extname).toBe(fits.table_extname);
      }
      const keywords = fits.keywords ?? {};
      if ('TIMESYS' in keywords) expect(curve.timeSystem.timesys).toBe(keywords.TIMESYS);
      if ('TIMEREF' in keywords) expect(curve.timeSystem.timeref).toBe(keywords.TIMEREF);
      if ('TIMEUNIT' in keywords) expect(curve.timeSystem.timeunit).toBe(keywords.TIMEUNIT);
      if ('BJDREFI' in keywords) {
        expect(curve.timeSystem.bjdRefDays).toBe(Number(keywords.BJDREFI) + Number(keywords.BJDREFF ?? 0));
      }
      if ('OBJECT' in keywords) expect(curve.objectName).toBe(keywords.OBJECT);
      if (fits.flux_scaled_null_rows && fits.columns && 'FLUX_SCALED' in fits.columns) {
        const scaled = readFitsLightCurve(bytes, { columns: { flux: 'FLUX_SCALED' } }).flux;
        const nullRows: number[] = [];
        scaled.forEach((value, i) => {
          if (Number.isNaN(value)) nullRows.push(i);
          else expectClose(value, curve.flux[i]!, 1e-6);
        });
        expect(nullRows).toEqual(fits.flux_scaled_null_rows);
      }
      if (typeof fits.quality_nonzero_count === 'number') {
        expect(curve.quality!.filter((flag) => flag !== 0)).toHaveLength(fits.quality_nonzero_count);
      }
    });
  }
});

interface ReferenceJson {
  points?: number;
  fits?: {
    table_hdu_index?: number;
    table_extname?: string;
    hdus?: string[];
    columns?: Record<string, string>;
    flux_scaled_null_rows?: number[];
    quality_nonzero_count?: number;
    keywords?: Record<string, string | number>;
  };
}

function expectClose(actual: number, expected: number, relative: number) {
  if (Number.isNaN(expected)) {
    expect(actual).toBeNaN();
    return;
  }
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(relative * Math.max(1, Math.abs(expected)));
}
