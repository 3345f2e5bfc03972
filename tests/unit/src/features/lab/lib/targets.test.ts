import { describe, expect, it } from 'vitest';
import { fieldLabel, formatDec, formatRa } from '@/features/lab/lib/targets';

describe('formatRa and formatDec', () => {
  it('write coordinates in sexagesimal, as catalogues do (1 h of RA = 15°)', () => {
    // 04:17:21.5 = (4 + 17/60 + 21.5/3600) × 15 = 64.339583°
    expect(formatRa(64.339583)).toBe('04h 17m 21.5s');
    expect(formatDec(-30.352222)).toBe('−30° 21′ 08″');
    expect(formatDec(7.5)).toBe('+07° 30′ 00″');
  });

  it('wraps an RA that rounds up to 24 h back to 0, and shows a missing coordinate as a dash', () => {
    expect(formatRa(359.99999)).toBe('00h 00m 00.0s');
    expect(formatRa(null)).toBe('—');
    expect(formatDec(null)).toBe('—');
  });
});

describe('fieldLabel', () => {
  it('names assumed fields in words', () => {
    expect(fieldLabel('stellarRadiusRsun')).toBe('stellar radius');
    expect(fieldLabel('teffK')).toBe('effective temperature');
  });
});
