import { describe, expect, it } from 'vitest';
import { CAUTION, type Column, UNIT } from '../../../../server/formats/columns';
import { csvLines, csvText } from '../../../../server/formats/csv';

const COLUMNS: Column[] = [
  { name: 'designation', type: 'char', description: 'target designation' },
  { name: 'depth', type: 'double', unit: UNIT.ppm, description: 'transit depth' },
  { name: 'dips', type: 'int', description: 'dips found' },
];

async function csvOf(rows: Record<string, unknown>[], preamble?: string[]): Promise<string> {
  let out = '';
  for await (const piece of csvLines(COLUMNS, rows, { preamble })) out += piece;
  return out;
}

/** The records after the comment lines. */
async function records(rows: Record<string, unknown>[]): Promise<string> {
  const out = await csvOf(rows);
  return out.slice(out.indexOf('designation,'));
}

describe('csvLines', () => {
  it('ends every record with CRLF, header first (RFC 4180 §2 rules 1 and 3)', async () => {
    const out = await records([{ designation: 'TIC 1', depth: 512.5, dips: 3 }]);
    expect(out).toBe('designation,depth,dips\r\nTIC 1,512.5,3\r\n');
  });

  it('quotes a field holding a comma, a quote, CR or LF and doubles inner quotes (RFC 4180 §2 rules 6, 7)', async () => {
    const out = await records([
      { designation: 'a,b', dips: 1 },
      { designation: 'he said "hi"', dips: 2 },
      { designation: 'line1\r\nline2', dips: 3 },
      { designation: 'lf\nonly', dips: 4 },
    ]);
    expect(out.split('\r\n').slice(1).join('\r\n')).toBe(
      '"a,b",,1\r\n"he said ""hi""",,2\r\n"line1\r\nline2",,3\r\n"lf\nonly",,4\r\n',
    );
  });

  it('writes a null or missing cell as an empty field and an empty text as ""', async () => {
    const out = await records([{ designation: '', depth: null }]);
    expect(out).toBe('designation,depth,dips\r\n"",,\r\n');
  });

  it('escapes text that a spreadsheet would run as a formula with a leading quote (OWASP CSV Injection)', async () => {
    for (const [text, field] of [
      ['=SUM(A1)', "'=SUM(A1)"],
      ['+1', "'+1"],
      ['-cmd', "'-cmd"],
      ['@x', "'@x"],
      ['\tx', "'\tx"],
      ['\rx', '"\'\rx"'],
      ['=HYPERLINK("http://x")', '"\'=HYPERLINK(""http://x"")"'],
    ]) {
      expect(csvText(text!), text).toBe(field);
    }
  });

  it('leaves a negative number in a number column as a plain number', async () => {
    const out = await records([{ designation: 'TIC 2', depth: -3.5, dips: -1 }]);
    expect(out).toBe('designation,depth,dips\r\nTIC 2,-3.5,-1\r\n');
  });

  it('quotes text beginning with # or white space, so a comment-aware reader keeps the record', async () => {
    expect(csvText('#7')).toBe('"#7"');
    expect(csvText(' padded ')).toBe('" padded "');
  });

  it('begins with the caution and the preamble as # comment lines, one per line of text', async () => {
    const out = await csvOf([], ['campaign: Northern sky', 'exported at: 2026-03-01T00:00:00.000Z\nUTC']);
    expect(out).toBe(
      `# ${CAUTION}\r\n# campaign: Northern sky\r\n# exported at: 2026-03-01T00:00:00.000Z\r\n# UTC\r\n` +
        'designation,depth,dips\r\n',
    );
  });

  it('reads rows from an async iterable', async () => {
    async function* rows() {
      yield { designation: 'TIC 3', depth: 1e-7, dips: 0 };
    }
    let out = '';
    for await (const piece of csvLines(COLUMNS, rows())) out += piece;
    expect(out.endsWith('TIC 3,1e-7,0\r\n')).toBe(true);
  });

  it('when a value does not fit its column, throws naming the column', async () => {
    await expect(csvOf([{ designation: 'TIC 4', dips: 2.5 }])).rejects.toThrow(
      'column dips (int) takes a safe integer or null, got 2.5 (number)',
    );
    await expect(csvOf([{ designation: 7 }])).rejects.toThrow('column designation (char)');
    await expect(csvOf([{ designation: 'x', depth: Number.POSITIVE_INFINITY }])).rejects.toThrow(
      'column depth (double)',
    );
  });
});
