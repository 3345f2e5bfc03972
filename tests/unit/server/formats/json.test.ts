import { describe, expect, it } from 'vitest';
import { CAUTION, type Column, UCD, UNIT } from '../../../../server/formats/columns';
import { jsonChunks } from '../../../../server/formats/json';

const COLUMNS: Column[] = [
  { name: 'designation', type: 'char', ucd: UCD.mainId, description: 'target designation' },
  { name: 'period', type: 'double', unit: UNIT.days, ucd: UCD.period, description: 'orbital period' },
  { name: 'dips', type: 'int', description: 'dips found' },
  { name: 'onFollowUpList', type: 'boolean', description: 'on the follow-up list' },
];
const HEAD = { campaign: { id: 4, name: 'Northern "sky"' }, exportedAt: new Date('2026-03-01T12:00:00Z') };

async function jsonOf(rows: Iterable<Record<string, unknown>>): Promise<{ text: string; pieces: number }> {
  let text = '';
  let pieces = 0;
  for await (const piece of jsonChunks(COLUMNS, rows, HEAD)) {
    text += piece;
    pieces += 1;
  }
  return { text, pieces };
}

describe('jsonChunks', () => {
  it('round-trips through JSON.parse (RFC 8259) with the caution, campaign, time, columns and rows', async () => {
    const rows = [
      { designation: 'TIC 1 "b"\n\u2028', period: 3.52474859, dips: 3, onFollowUpList: true },
      { designation: 'TIC 2', period: Number.NaN, dips: null, onFollowUpList: false },
      { designation: 'TIC 3', period: -0.5 },
    ];
    const parsed = JSON.parse((await jsonOf(rows)).text);
    expect(parsed).toEqual({
      caution: CAUTION,
      campaign: { id: 4, name: 'Northern "sky"' },
      exportedAt: '2026-03-01T12:00:00.000Z',
      columns: [
        {
          name: 'designation',
          type: 'char',
          unit: null,
          ucd: 'meta.id;meta.main',
          description: 'target designation',
        },
        { name: 'period', type: 'double', unit: 'd', ucd: 'time.period', description: 'orbital period' },
        { name: 'dips', type: 'int', unit: null, ucd: null, description: 'dips found' },
        {
          name: 'onFollowUpList',
          type: 'boolean',
          unit: null,
          ucd: null,
          description: 'on the follow-up list',
        },
      ],
      rows: [
        { designation: 'TIC 1 "b"\n\u2028', period: 3.52474859, dips: 3, onFollowUpList: true },
        { designation: 'TIC 2', period: null, dips: null, onFollowUpList: false },
        { designation: 'TIC 3', period: -0.5, dips: null, onFollowUpList: null },
      ],
    });
  });

  it('with no rows, is still a document with an empty rows array', async () => {
    expect(JSON.parse((await jsonOf([])).text).rows).toEqual([]);
  });

  it('yields one piece per row after the head, never the whole document at once', async () => {
    const rows = Array.from({ length: 50 }, (_, i) => ({ designation: `TIC ${i}`, dips: i }));
    expect((await jsonOf(rows)).pieces).toBe(1 + 50 + 1);
  });
});
