import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createRandom } from '../../../../server/science/random';
import { median, medianCadence, robustSigma } from '../../../../server/science/statistics';

// The obvious reference: sort and take the middle.
function sortedMedian(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

describe('median', () => {
  it('agrees with sorting on random inputs, including repeats', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -50, max: 50 }), { minLength: 1, maxLength: 200 }), (values) => {
        expect(median(values)).toBe(sortedMedian(values));
      }),
    );
  });

  it('leaves its input unchanged and answers NaN for nothing', () => {
    const values = [3, 1, 2];
    median(values);
    expect(values).toEqual([3, 1, 2]);
    expect(median([])).toBeNaN();
  });
});

describe('robustSigma', () => {
  it('estimates the σ of Gaussian noise (MAD × 1.4826, the Gaussian consistency constant)', () => {
    const random = createRandom('robust-sigma');
    const values = Array.from({ length: 20_000 }, () => random.normal(0, 3));
    expect(robustSigma(values)).toBeCloseTo(3, 1);
  });
});

describe('medianCadence', () => {
  it('finds the cadence despite a gap', () => {
    const times = [0, 1, 2, 3, 10, 11, 12].map((t) => t / 720);
    expect(medianCadence(times)).toBeCloseTo(1 / 720, 12);
  });
});
