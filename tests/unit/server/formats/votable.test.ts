// @vitest-environment jsdom
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { CAUTION, type Column, type ExportRow, UCD, UNIT } from '../../../../server/formats/columns';
import { csvLines } from '../../../../server/formats/csv';
import { votableChunks, xmlText } from '../../../../server/formats/votable';

const COLUMNS: Column[] = [
  { name: 'candidate_id', type: 'int', ucd: UCD.mainId, description: 'Dipdeck candidate id' },
  { name: 'designation', type: 'char', ucd: UCD.id, description: 'target designation' },
  {
    name: 'epoch',
    type: 'double',
    unit: UNIT.days,
    ucd: UCD.epoch,
    description: 'mid-transit time, BJD_TDB',
  },
  { name: 'period', type: 'double', unit: UNIT.days, ucd: UCD.period, description: 'orbital period' },
  { name: 'duration', type: 'double', unit: UNIT.hours, ucd: UCD.duration, description: 'transit duration' },
  { name: 'depth', type: 'double', unit: UNIT.ppm, ucd: UCD.depth, description: 'transit depth <& "ppm">' },
  { name: 'consensus_score', type: 'double', ucd: UCD.probability, description: 'consensus score' },
  { name: 'dips', type: 'int', ucd: UCD.count, description: 'dips found' },
  { name: 'note', type: 'char', ucd: UCD.note, description: 'scientist note' },
];
const ROWS: ExportRow[] = [
  {
    candidate_id: 1,
    designation: 'TIC 25155310',
    epoch: 2459000.123456789,
    period: 3.52474859,
    duration: 2.75,
    depth: 14616.5,
    consensus_score: 0.987,
    dips: 4,
    note: 'a & b <c> "d", \'e\'',
  },
  {
    candidate_id: 2,
    designation: 'Kepler-1658 é 🪐',
    epoch: 2455000.5,
    period: null,
    duration: -3.5,
    depth: 1e-7,
    consensus_score: Number.NaN,
    dips: null,
    note: '=SUM(A1)',
  },
  { candidate_id: 3, designation: 'TIC 3, "quoted"', epoch: 2460000, note: 'tab\there' },
];
const HEAD = {
  tableName: 'follow_up_list',
  campaign: { id: 4, name: 'Northern <sky> & "more"' },
  exportedAt: new Date('2026-03-01T12:00:00Z'),
  description: 'Dipdeck follow-up list.',
};

async function collect(pieces: AsyncIterable<string>): Promise<string> {
  let out = '';
  for await (const piece of pieces) out += piece;
  return out;
}

describe('votableChunks', () => {
  it('writes a well-formed XML document (XML 1.0) with the VOTable 1.4 root, INFOs and FIELDs', async () => {
    const xml = await collect(votableChunks(COLUMNS, ROWS, HEAD));
    const doc = new DOMParser().parseFromString(xml, 'application/xml');
    expect(doc.getElementsByTagName('parsererror')).toHaveLength(0);
    const root = doc.documentElement;
    // IVOA VOTable 1.4 Recommendation 2019-10-21: version 1.4 keeps the v1.3 namespace.
    expect(root.getAttribute('version')).toBe('1.4');
    expect(root.namespaceURI).toBe('http://www.ivoa.net/xml/VOTable/v1.3');
    const infos = Object.fromEntries(
      [...doc.getElementsByTagName('INFO')].map((info) => [
        info.getAttribute('name'),
        info.getAttribute('value'),
      ]),
    );
    expect(infos).toEqual({
      caution: CAUTION,
      'campaign.id': '4',
      'campaign.name': 'Northern <sky> & "more"',
      exportedAt: '2026-03-01T12:00:00.000Z',
    });
    const fields = [...doc.getElementsByTagName('FIELD')];
    expect(fields.map((f) => f.getAttribute('datatype'))).toEqual([
      'int',
      'unicodeChar',
      'double',
      'double',
      'double',
      'double',
      'double',
      'int',
      'unicodeChar',
    ]);
    expect(fields[1]!.getAttribute('arraysize')).toBe('*');
    expect(fields[0]!.hasAttribute('unit')).toBe(false);
    const rows = [...doc.getElementsByTagName('TR')];
    expect(rows).toHaveLength(3);
    expect([...rows[0]!.getElementsByTagName('TD')].map((td) => td.textContent)[8]).toBe(
      'a & b <c> "d", \'e\'',
    );
  });

  it('escapes markup, keeps tab and newlines in attributes, and replaces characters XML forbids', () => {
    expect(xmlText('<a & "b">')).toBe('&lt;a &amp; &quot;b&quot;&gt;');
    expect(xmlText('a\tb\nc\rd')).toBe('a&#9;b&#10;c&#13;d');
    expect(xmlText('bell\u0007 lone\uD800 pair🪐')).toBe('bell\uFFFD lone\uFFFD pair🪐');
  });
});

// The outside check: astropy reads both files back. Debian's python3-astropy (5.2.1).
const PYTHON = '/usr/bin/python3';
const hasAstropy = spawnSync(PYTHON, ['-c', 'import astropy'], { stdio: 'ignore' }).status === 0;
if (!hasAstropy && !process.env.CI) {
  console.warn(
    `skipping the astropy read-back: ${PYTHON} cannot import astropy (apt-get install python3-astropy)`,
  );
}

interface AstropyColumn {
  name: string;
  datatype?: string;
  unit?: string | null;
  ucd?: string | null;
  ucdValid?: boolean | null;
  values: unknown[];
}
interface AstropyReport {
  astropy: string;
  votable: { warnings: string[]; version: string; infos: Record<string, string>; columns: AstropyColumn[] };
  csv: { warnings: string[]; comments: string[]; columns: AstropyColumn[] };
}

describe.skipIf(!hasAstropy && !process.env.CI)('read back by astropy', () => {
  const dir = mkdtempSync(join(tmpdir(), 'dipdeck-exports-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  async function astropyReport(): Promise<AstropyReport> {
    const votablePath = join(dir, 'follow-up.vot');
    const csvPath = join(dir, 'follow-up.csv');
    writeFileSync(votablePath, await collect(votableChunks(COLUMNS, ROWS, HEAD)));
    writeFileSync(csvPath, await collect(csvLines(COLUMNS, ROWS, { preamble: ['campaign: Northern sky'] })));
    const out = execFileSync(PYTHON, ['tests/reference/check_exports.py', votablePath, csvPath], {
      encoding: 'utf8',
    });
    return JSON.parse(out) as AstropyReport;
  }

  // What astropy should see: nulls and NaN masked; astropy parses the VOUnit '1e-6' as the unit 1e-06.
  const expectedValues = COLUMNS.map((column) =>
    ROWS.map((row) => {
      const value = row[column.name];
      return value === undefined || (typeof value === 'number' && Number.isNaN(value)) ? null : value;
    }),
  );
  const expectedUnits: (string | null)[] = [null, null, 'd', 'd', 'h', '1e-06', null, null, null];

  it('parses the VOTable without a warning, with the same values, units and valid UCD1+ words', async () => {
    const { votable } = await astropyReport();
    expect(votable.warnings).toEqual([]);
    expect(votable.version).toBe('1.4');
    expect(votable.infos.caution).toBe(CAUTION);
    expect(votable.infos['campaign.name']).toBe('Northern <sky> & "more"');
    expect(votable.columns.map((c) => c.name)).toEqual(COLUMNS.map((c) => c.name));
    expect(votable.columns.map((c) => c.unit)).toEqual(expectedUnits);
    expect(votable.columns.map((c) => c.ucd)).toEqual(COLUMNS.map((c) => c.ucd ?? null));
    // IVOA UCD1+ controlled vocabulary, as astropy.io.votable.ucd.check_ucd knows it.
    expect(votable.columns.every((c) => c.ucdValid === true)).toBe(true);
    // A null text cell reads back as '' in VOTable TABLEDATA (an empty TD).
    const values = expectedValues.map((column, i) =>
      COLUMNS[i]!.type === 'char' ? column.map((v) => v ?? '') : column,
    );
    expect(votable.columns.map((c) => c.values)).toEqual(values);
  });

  it("reads the CSV with comment='#' without a warning, with the caution as a comment and the same values", async () => {
    const { csv } = await astropyReport();
    expect(csv.warnings).toEqual([]);
    expect(csv.comments).toEqual([CAUTION, 'campaign: Northern sky']);
    expect(csv.columns.map((c) => c.name)).toEqual(COLUMNS.map((c) => c.name));
    // Text cells that begin like a formula come back with the leading quote (OWASP CSV Injection).
    const values = expectedValues.map((column) => column.map((v) => (v === '=SUM(A1)' ? "'=SUM(A1)" : v)));
    expect(csv.columns.map((c) => c.values)).toEqual(values);
  });
});
