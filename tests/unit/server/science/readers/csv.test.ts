import { parse } from 'csv-parse/sync';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  detectDelimiter,
  parseNumberCell,
  readCsvLightCurve,
  readCsvTable,
} from '../../../../../server/science/readers/csv';
import { ReaderError } from '../../../../../server/science/readers/reader-error';

const NO_TIME_SYSTEM = { timesys: null, timeref: null, timeunit: null, bjdRefDays: null };
const array = (values: ArrayLike<number> | null) => (values === null ? null : Array.from(values));

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

describe('readCsvLightCurve: delimiters and headers', () => {
  it('reads a comma-separated table with a header row, in days, with no time system', () => {
    const curve = readCsvLightCurve('time,flux,flux_err\n1.0,1.001,0.0005\n1.5,0.998,0.0005\n');
    expect(array(curve.timeDays)).toEqual([1.0, 1.5]);
    expect(array(curve.flux)).toEqual([1.001, 0.998]);
    expect(array(curve.fluxErr)).toEqual([0.0005, 0.0005]);
    expect(curve.quality).toBeNull();
    expect(curve.objectName).toBeNull();
    expect(curve.timeSystem).toEqual(NO_TIME_SYSTEM);
  });

  it('reads tab-separated bytes with CRLF line ends and a UTF-8 byte order mark', () => {
    const bytes = new TextEncoder().encode('\uFEFFTIME\tSAP_FLUX\r\n10\t5000\r\n11\t5001\r\n');
    const curve = readCsvLightCurve(bytes);
    expect(array(curve.timeDays)).toEqual([10, 11]);
    expect(array(curve.flux)).toEqual([5000, 5001]);
  });

  it('reads a semicolon-separated table with decimal commas', () => {
    const curve = readCsvLightCurve('time;flux;flux_err\n1,25;0,9985;0,0004\n1,5;1,0012;0,0004\n');
    expect(array(curve.timeDays)).toEqual([1.25, 1.5]);
    expect(array(curve.flux)).toEqual([0.9985, 1.0012]);
    expect(array(curve.fluxErr)).toEqual([0.0004, 0.0004]);
  });

  it('reads a whitespace-separated table whose names sit in a leading "# time flux flux_err" comment', () => {
    const text =
      '# made by an invented pipeline\n# time   flux    flux_err\n  1.0   1.01   0.001\n  2.0\t 0.99   0.001\n';
    const table = readCsvTable(text);
    expect(table.delimiter).toBe('whitespace');
    expect(table.headerSource).toBe('comment');
    expect(table.columnNames).toEqual(['time', 'flux', 'flux_err']);
    const curve = readCsvLightCurve(text);
    expect(array(curve.timeDays)).toEqual([1, 2]);
    expect(array(curve.fluxErr)).toEqual([0.001, 0.001]);
  });

  it('skips # comment lines before and among the rows, and empty lines', () => {
    const curve = readCsvLightCurve(
      '# first comment\ntime,flux\n1,2\n# a comment among rows\n\n  # indented comment\n3,4\n',
    );
    expect(array(curve.timeDays)).toEqual([1, 3]);
    expect(array(curve.flux)).toEqual([2, 4]);
  });

  it('reads quoted fields with csv-parse, commas inside quotes included', () => {
    const text = 'time,flux,"object"\n"1.0","2.0","Invented Star, A"\n2.0,3.0,"Invented Star, A"\n';
    const curve = readCsvLightCurve(text);
    expect(array(curve.timeDays)).toEqual([1, 2]);
    expect(curve.objectName).toBe('Invented Star, A');
  });

  it('names the line of a bad cell by its line in the file, also through csv-parse', () => {
    expectReaderError(
      () => readCsvLightCurve('# comment\ntime,flux\n1,2\n# another\n3,"x"\n'),
      "line 5, flux column 'flux': 'x' is not a number",
    );
  });
});

describe('readCsvLightCurve: cells', () => {
  it('reads NaN, nan, null, empty cells and NA as NaN, and inf as Infinity', () => {
    const curve = readCsvLightCurve('time,flux,flux_err\n1,NaN,\n2,nan,null\n3,,NA\n4,inf,-inf\n');
    expect(array(curve.flux)).toEqual([Number.NaN, Number.NaN, Number.NaN, Number.POSITIVE_INFINITY]);
    expect(array(curve.fluxErr)).toEqual([Number.NaN, Number.NaN, Number.NaN, Number.NEGATIVE_INFINITY]);
  });

  it('reads exponents written with e, E, d and D', () => {
    expect(parseNumberCell('1.5e-3', false)).toBe(0.0015);
    expect(parseNumberCell('1.5E+3', false)).toBe(1500);
    expect(parseNumberCell('1.5D-03', false)).toBe(0.0015);
    expect(parseNumberCell('-.5d1', false)).toBe(-5);
    expect(parseNumberCell('0x10', false)).toBeNull();
    expect(parseNumberCell('1,5', false)).toBeNull();
    expect(parseNumberCell('1,5', true)).toBe(1.5);
    expect(parseNumberCell('1.000,5', true)).toBeNull();
  });

  it('refuses a cell that is not a number, naming the line, the column and what is allowed', () => {
    expectReaderError(
      () => readCsvLightCurve('time,flux\n1,2\n2,about one\n'),
      "line 3, flux column 'flux': 'about one' is not a number (allowed: decimal numbers, NaN, nan, null or an empty cell)",
    );
  });

  it('refuses a row too short for a chosen column', () => {
    expectReaderError(
      () => readCsvLightCurve('time,flux,flux_err\n1,2,3\n2,3\n'),
      "line 3 has 2 cells (split at ','), but the flux error column 'flux_err' is cell 3",
    );
  });
});

describe('readCsvLightCurve: columns', () => {
  it('finds columns by common names, case-insensitively, with units in brackets, and pairs PDCSAP_FLUX with its error', () => {
    const text =
      'TIME [d],SAP_FLUX,PDCSAP_FLUX,SAP_FLUX_ERR,PDCSAP_FLUX_ERR,QUALITY\n1,10,0.9,1,0.01,0\n2,11,1.1,1,0.02,512\n';
    const curve = readCsvLightCurve(text);
    expect(array(curve.flux)).toEqual([0.9, 1.1]);
    expect(array(curve.fluxErr)).toEqual([0.01, 0.02]);
    expect(array(curve.quality)).toEqual([0, 512]);
  });

  it('reads the columns the uploader chose, by name or by 0-based index, and none for the flux error', () => {
    const text = 'obs_date,rate,rate_sigma,f\n1,5,0.1,9\n2,6,0.2,9\n';
    const byName = readCsvLightCurve(text, {
      columns: { time: 'OBS_DATE', flux: 'rate', fluxErr: 'rate_sigma' },
    });
    expect(array(byName.flux)).toEqual([5, 6]);
    expect(array(byName.fluxErr)).toEqual([0.1, 0.2]);
    const byIndex = readCsvLightCurve(text, { columns: { time: 0, flux: 1, fluxErr: null } });
    expect(byIndex.fluxErr).toBeNull();
    expect(array(byIndex.flux)).toEqual([5, 6]);
  });

  it('reads a table without a header when the uploader chooses columns by index', () => {
    const curve = readCsvLightCurve('1 2 3\n4 5 6\n', { columns: { time: 0, flux: 2 } });
    expect(array(curve.timeDays)).toEqual([1, 4]);
    expect(array(curve.flux)).toEqual([3, 6]);
  });

  it('when the table has no flux column, names what is missing and the columns found', () => {
    expectReaderError(
      () => readCsvLightCurve('time,brightness,noise\n1,2,3\n'),
      'the file has no flux column; columns found: time, brightness, noise. Expected names like pdcsap_flux/flux/relative_flux/rel_flux/sap_flux/f, or choose the columns',
    );
    expectReaderError(
      () => readCsvLightCurve('date,brightness\n1,2\n'),
      'the file has no time or flux column; columns found: date, brightness',
    );
  });

  it('when the table has no header at all, asks for the columns by number', () => {
    expectReaderError(
      () => readCsvLightCurve('1,2,3\n4,5,6\n'),
      'the file has no header naming its 3 columns, so a time column or a flux column cannot be found by name; choose the columns by their number (0 to 2)',
    );
  });

  it('refuses a chosen column that is not there, and one column chosen twice', () => {
    expectReaderError(
      () => readCsvLightCurve('time,flux\n1,2\n', { columns: { flux: 'pdcsap' } }),
      "column 'pdcsap' chosen for flux is not in the file; columns found: time, flux",
    );
    expectReaderError(
      () => readCsvLightCurve('time,flux\n1,2\n', { columns: { flux: 5 } }),
      'column 5 chosen for flux does not exist: the file has 2 columns, numbered 0 to 1',
    );
    expectReaderError(
      () => readCsvLightCurve('time,flux\n1,2\n', { columns: { time: 0, flux: 'time' } }),
      "column 'time' is chosen for two roles",
    );
  });

  it('reads the target name from an object column, and refuses a file with two targets', () => {
    expect(readCsvLightCurve('time,flux,target\n1,2,\n2,3,Invented Star 4\n').objectName).toBe(
      'Invented Star 4',
    );
    expectReaderError(
      () => readCsvLightCurve('time,flux,object\n1,2,Invented A\n2,3,Invented B\n'),
      "the file holds more than one target: column 'object' has 'Invented A' and, on line 3, 'Invented B'",
    );
  });
});

describe('readCsvLightCurve: time system', () => {
  it('reads TIMESYS, TIMEREF, TIMEUNIT, BJDREFI, BJDREFF and OBJECT from comment lines', () => {
    const text = [
      '# TIMESYS = TDB',
      "# TIMEREF = 'SOLARSYSTEM' / barycentric",
      '# timeunit: d',
      '# BJDREFI = 2457000',
      '# BJDREFF = 0.5',
      '# OBJECT = Invented Star 5',
      'time,flux',
      '1,2',
    ].join('\n');
    const curve = readCsvLightCurve(text);
    expect(curve.timeSystem).toEqual({
      timesys: 'TDB',
      timeref: 'SOLARSYSTEM',
      timeunit: 'd',
      bjdRefDays: 2457000.5,
    });
    expect(curve.objectName).toBe('Invented Star 5');
  });

  it('infers the time system from a BTJD or BKJD column name, and comments win over the name', () => {
    // BTJD = BJD_TDB − 2457000 (TESS), BKJD = BJD_TDB − 2454833 (Kepler): lightkurve time.py.
    expect(readCsvLightCurve('btjd,flux\n1,2\n').timeSystem).toEqual({
      timesys: 'TDB',
      timeref: 'SOLARSYSTEM',
      timeunit: null,
      bjdRefDays: 2457000,
    });
    expect(readCsvLightCurve('BKJD,flux\n1,2\n').timeSystem.bjdRefDays).toBe(2454833);
    expect(readCsvLightCurve('# BJDREF = 2400000\nbtjd,flux\n1,2\n').timeSystem.bjdRefDays).toBe(2400000);
    expect(readCsvLightCurve('mjd,flux\n1,2\n').timeSystem).toEqual(NO_TIME_SYSTEM);
  });

  it('converts times to days from a unit in the column name, or from TIMEUNIT', () => {
    expect(array(readCsvLightCurve('time (h),flux\n24,1\n36,1\n').timeDays)).toEqual([1, 1.5]);
    expect(array(readCsvLightCurve('# TIMEUNIT = s\ntime,flux\n86400,1\n').timeDays)).toEqual([1]);
    expectReaderError(
      () => readCsvLightCurve('# TIMEUNIT = parsec\ntime,flux\n1,1\n'),
      "TIMEUNIT 'parsec' is not a time unit this reader knows",
    );
    expectReaderError(
      () => readCsvLightCurve('# BJDREFI = soon\ntime,flux\n1,1\n'),
      "comment line 1: BJDREFI must be a number, got 'soon'",
    );
  });
});

describe('readCsvLightCurve: refusals', () => {
  it('refuses binary data, an empty file and a header without rows', () => {
    expectReaderError(
      () => readCsvLightCurve(new Uint8Array([0x74, 0x00, 0x01])),
      'not a text table: the file holds binary data (a NUL byte at offset 1)',
    );
    expectReaderError(() => readCsvLightCurve(''), 'the file has no data rows');
    expectReaderError(() => readCsvLightCurve('# only a comment\n'), 'the file has no data rows');
    expectReaderError(() => readCsvLightCurve('time,flux\n'), 'the file has a header row but no data rows');
  });

  it('refuses more rows than maxRows and more bytes than maxBytes', () => {
    const text = `time,flux\n${Array.from({ length: 20 }, (_, i) => `${i},1`).join('\n')}\n`;
    expectReaderError(() => readCsvLightCurve(text, { maxRows: 10 }), 'at most 10 rows are allowed');
    expect(readCsvLightCurve(text, { maxRows: 20 }).timeDays).toHaveLength(20);
    expectReaderError(() => readCsvLightCurve(text, { maxBytes: 50 }), 'at most 50 bytes are allowed');
  });

  it('reads UTF-16 text that starts with a byte order mark', () => {
    const text = 'time\tflux\n1\t2\n';
    const bytes = new Uint8Array(2 + text.length * 2);
    bytes.set([0xff, 0xfe]);
    for (let i = 0; i < text.length; i += 1) bytes[2 + i * 2] = text.charCodeAt(i);
    expect(array(readCsvLightCurve(bytes).flux)).toEqual([2]);
  });
});

describe('detectDelimiter', () => {
  it.each([
    [['a,b,c', '1,2,3'], ','],
    [['a\tb', '1\t2'], '\t'],
    [['a;b', '1,5;2,5'], ';'],
    [['1,5;2,5', '1,5;2,5'], ';'],
    [['a b  c', '1  2 3'], 'whitespace'],
    [['"x,y";b', '1;2'], ';'],
    [['time,flux,err', '1,2', '3,4,5'], ','],
    [['single'], 'whitespace'],
  ] as const)('finds the delimiter of %j: %j', (lines, delimiter) => {
    expect(detectDelimiter(lines)).toBe(delimiter);
  });
});

// The direct split is what csv-parse would give for a table with no quotes: check on random tables.
describe('direct split compared with csv-parse', () => {
  const cell = fc.oneof(
    fc.double({ noNaN: true, noDefaultInfinity: true }).map(String),
    fc.constantFrom('', 'nan', 'NaN', 'null', ' 1.5 ', '-0', '1e-5'),
    fc.stringMatching(/^[a-z _]{0,6}$/),
  );

  it('gives the same cells for random quote-free comma and tab tables', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(',', '\t'),
        fc
          .integer({ min: 2, max: 6 })
          .chain((width) =>
            fc.array(fc.array(cell, { minLength: width, maxLength: width }), { minLength: 1, maxLength: 20 }),
          ),
        (delimiter, generated) => {
          // A line of only spaces and tabs is an empty line to the reader, not a row of empty cells.
          const rows = generated.filter((row) => row.join(delimiter).trim() !== '');
          fc.pre(rows.length > 0);
          const header = rows[0]!.map((_, i) => `col${i}`);
          const text = [header, ...rows].map((row) => row.join(delimiter)).join('\n');
          const table = readCsvTable(text);
          expect(table.delimiter).toBe(delimiter);
          const reference = parse(text, {
            delimiter,
            relax_column_count: true,
            skip_empty_lines: true,
            trim: true,
          }) as string[][];
          expect([table.columnNames, ...table.rows]).toEqual(reference);
        },
      ),
      { numRuns: 200 },
    );
  });
});

// The light-curve reader parses unquoted numbers straight from the text (Clinger's fast path for short
// decimals); the slow, obvious reference is parseNumberCell on readCsvTable's cells.
describe('one-pass numbers compared with parseNumberCell on split cells', () => {
  const numberCell = (decimalComma: boolean) =>
    fc
      .oneof(
        fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e6, max: 1e6 }).map(String),
        fc
          .tuple(fc.integer({ min: -99_999, max: 99_999 }), fc.integer({ min: 0, max: 10 ** 9 }))
          .map(([whole, part]) => `${whole}.${part}`),
        fc.double({ noNaN: true, noDefaultInfinity: true }).map((value) => value.toExponential(6)),
        fc.stringMatching(/^-?\d{1,18}(\.\d{0,18})?$/),
        fc.constantFrom('', 'nan', 'NaN', 'null', '-0', '.5', '5.', '1.5D-03', '+7'),
      )
      .map((cell) => (decimalComma ? cell.replace('.', ',') : cell));

  it('gives the same numbers for random comma, tab, semicolon and whitespace tables', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(',', '\t', ';', ' '),
        fc.integer({ min: 1, max: 30 }),
        fc.context(),
        (delimiter, rowCount, context) => {
          const cells = numberCell(delimiter === ';');
          const rows = fc.sample(
            fc.tuple(fc.double({ noNaN: true, min: 0, max: 1e4 }).map(String), cells, cells),
            {
              numRuns: rowCount,
              seed: rowCount,
            },
          );
          // Whitespace tables cannot hold empty cells.
          const usable = delimiter === ' ' ? rows.map((row) => row.map((cell) => cell || 'nan')) : rows;
          const text = `time${delimiter}flux${delimiter}flux_err\n${usable.map((row) => row.join(delimiter)).join('\n')}\n`;
          context.log(JSON.stringify(text));
          const curve = readCsvLightCurve(text);
          const table = readCsvTable(text);
          const decimalComma = table.delimiter === ';';
          const expected = (column: number) =>
            table.rows.map((row) => parseNumberCell(row[column]!, decimalComma));
          expect(Array.from(curve.timeDays)).toEqual(expected(0));
          expect(Array.from(curve.flux)).toEqual(expected(1));
          expect(Array.from(curve.fluxErr!)).toEqual(expected(2));
          // And every plain decimal equals what Number() makes of it.
          table.rows.forEach((row, i) => {
            if (/^-?\d+(\.\d*)?$/.test(row[1]!) && !decimalComma) expect(curve.flux[i]).toBe(Number(row[1]));
          });
        },
      ),
      { numRuns: 150 },
    );
  });
});
