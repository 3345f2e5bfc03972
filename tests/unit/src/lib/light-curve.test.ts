import { describe, expect, it } from 'vitest';
import { decimalsOf, fluxToPpm, formatTicks, median } from '@/lib/light-curve';

describe('fluxToPpm', () => {
  it('measures flux in ppm from the median, so a 1 % dip reads −10 000 whatever the normalisation', () => {
    expect(fluxToPpm([2, 2, 1.98, 2])).toEqual([0, 0, -10_000, 0]);
    expect(fluxToPpm([1, 1, 1.0005, null])).toEqual([0, 0, 500, null]);
  });

  it('leaves every point a gap when there is nothing to measure from', () => {
    expect(fluxToPpm([null, null])).toEqual([null, null]);
  });
});

describe('median', () => {
  it('ignores gaps and averages the middle pair', () => {
    expect(median([3, null, 1, 2, 4])).toBe(2.5);
    expect(median([])).toBeNull();
  });
});

describe('formatTicks', () => {
  it('gives every label the digits its step needs, with a true minus sign', () => {
    expect(formatTicks([0, 2.5, 5])).toEqual(['0.0', '2.5', '5.0']);
    expect(formatTicks([-10_000, -5000, 0, 5000])).toEqual(['−10000', '−5000', '0', '5000']);
    expect(formatTicks([0.25])).toEqual(['0']);
    expect(decimalsOf(0.25)).toBe(2);
  });
});
