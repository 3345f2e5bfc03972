import { describe, expect, it } from 'vitest';
import { describeChange, formatValue } from '@/features/desk/lib/audit';

describe('describeChange', () => {
  it('for two objects lists only the keys whose values differ, before → after', () => {
    expect(
      describeChange(
        { state: 'split', outcome: null, score: 0.5 },
        { state: 'ruled', outcome: 'dip', score: 0.5 },
      ),
    ).toEqual([
      { key: 'state', before: 'split', after: 'ruled' },
      { key: 'outcome', before: 'null', after: 'dip' },
    ]);
  });

  it('for a key only one side has, leaves the other side null', () => {
    expect(describeChange({ a: 1 }, { b: [1, 2] })).toEqual([
      { key: 'a', before: '1', after: null },
      { key: 'b', before: null, after: '[1,2]' },
    ]);
  });

  it('when there was nothing before, lists every key of after', () => {
    expect(describeChange(null, { suspended: true, reason: 'bot' })).toEqual([
      { key: 'suspended', before: null, after: 'true' },
      { key: 'reason', before: null, after: 'bot' },
    ]);
  });

  it('when both sides are empty, has nothing to say', () => {
    expect(describeChange(null, undefined)).toEqual([]);
  });

  it('for values that are not objects, shows the two whole', () => {
    expect(describeChange('volunteer', 'moderator')).toEqual([
      { key: '', before: 'volunteer', after: 'moderator' },
    ]);
  });

  it('cuts a long value at 80 characters', () => {
    const text = formatValue('x'.repeat(200));
    expect(text).toHaveLength(80);
    expect(text.endsWith('…')).toBe(true);
  });
});
