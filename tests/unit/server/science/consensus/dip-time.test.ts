import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { dipTimeClusters } from '../../../../../server/science/consensus/dip-time';

// The slow, obvious reference for one cluster: the weighted median as the point where the weight on
// each side is at most half, found by trying every mark (and the midpoint of neighbours on a tie).
function referenceWeightedMedian(marks: { timeDays: number; weight: number }[]): number {
  const sorted = [...marks].sort((a, b) => a.timeDays - b.timeDays);
  const total = sorted.reduce((sum, m) => sum + m.weight, 0);
  for (let k = 0; k < sorted.length; k += 1) {
    const below = sorted.slice(0, k + 1).reduce((sum, m) => sum + m.weight, 0);
    if (Math.abs(below - total / 2) <= 1e-12 * total && k + 1 < sorted.length) {
      return (sorted[k]!.timeDays + sorted[k + 1]!.timeDays) / 2;
    }
    if (below >= total / 2) return sorted[k]!.timeDays;
  }
  return sorted[sorted.length - 1]!.timeDays;
}

describe('dipTimeClusters', () => {
  it('gives the weighted median and 1.4826 × weighted MAD on a hand example', () => {
    // Hand-computed: times 0.1, 0.2, 0.3, 0.4 d with weights 1, 2, 1, 1 (total 5): the cumulative weight
    // first reaches 2.5 at 0.2 d; deviations 0.1, 0, 0.1, 0.2 with the same weights have weighted
    // median 0.1 d; σ = 1.4826 × 0.1 (Hampel 1974's Gaussian-consistent scale).
    const clusters = dipTimeClusters(
      [
        { timeDays: 0.3, weight: 1 },
        { timeDays: 0.1, weight: 1 },
        { timeDays: 0.4, weight: 1 },
        { timeDays: 0.2, weight: 2 },
      ],
      { separationDays: 1 },
    );
    expect(clusters).toHaveLength(1);
    expect(clusters[0]!.center).toBeCloseTo(0.2, 12);
    expect(clusters[0]!.sigma).toBeCloseTo(0.14826, 12);
    expect(clusters[0]!.count).toBe(4);
    expect(clusters[0]!.weight).toBeCloseTo(5, 12);
  });

  it('reduces to the ordinary median with equal weights', () => {
    // Hand-computed: the median of 1, 2, 3, 10 is 2.5; of the deviations 1.5, 0.5, 0.5, 7.5 it is 1.0.
    const [cluster] = dipTimeClusters(
      [1, 2, 3, 10].map((timeDays) => ({ timeDays, weight: 0.7 })),
      { separationDays: 100 },
    );
    expect(cluster!.center).toBeCloseTo(2.5, 12);
    expect(cluster!.sigma).toBeCloseTo(1.4826, 12);
  });

  it('is not pulled by one unreliable outlying mark', () => {
    const [cluster] = dipTimeClusters(
      [
        { timeDays: 5.0, weight: 2 },
        { timeDays: 5.01, weight: 2 },
        { timeDays: 5.02, weight: 2 },
        { timeDays: 5.4, weight: 0.3 },
      ],
      { separationDays: 0.5 },
    );
    expect(cluster!.center).toBeCloseTo(5.01, 12);
  });

  it('gives sigma 0 for a single mark', () => {
    expect(dipTimeClusters([{ timeDays: 3, weight: 1 }], { separationDays: 0.2 })).toEqual([
      { center: 3, sigma: 0, count: 1, weight: 1 },
    ]);
  });

  it('splits two groups farther apart than the separation into two clusters, sorted by time', () => {
    const late = [10.5, 10.52, 10.51].map((timeDays) => ({ timeDays, weight: 1.5 }));
    const early = [10.1, 10.12, 10.08].map((timeDays) => ({ timeDays, weight: 1 }));
    const clusters = dipTimeClusters([...late, ...early], { separationDays: 0.2 });
    expect(clusters).toHaveLength(2);
    expect(clusters[0]!.center).toBeCloseTo(10.1, 12);
    expect(clusters[0]!.count).toBe(3);
    expect(clusters[1]!.center).toBeCloseTo(10.51, 12);
    expect(clusters[1]!.weight).toBeCloseTo(4.5, 12);
  });

  it('keeps one cluster when the gap is within the separation', () => {
    const marks = [10.1, 10.12, 10.25, 10.27].map((timeDays) => ({ timeDays, weight: 1 }));
    expect(dipTimeClusters(marks, { separationDays: 0.2 })).toHaveLength(1);
  });

  it('keeps one cluster when the far group is a single mark or carries too little weight', () => {
    const group = [10.1, 10.12, 10.11].map((timeDays) => ({ timeDays, weight: 1 }));
    expect(dipTimeClusters([...group, { timeDays: 11, weight: 5 }], { separationDays: 0.2 })).toHaveLength(1);
    const light = [11, 11.01].map((timeDays) => ({ timeDays, weight: 0.2 }));
    expect(dipTimeClusters([...group, ...light], { separationDays: 0.2 })).toHaveLength(1);
  });

  it('gives no cluster without marks, and ignores marks of no or negative weight', () => {
    expect(dipTimeClusters([], { separationDays: 0.2 })).toEqual([]);
    expect(
      dipTimeClusters(
        [
          { timeDays: 1, weight: 0 },
          { timeDays: 2, weight: -0.4 },
          { timeDays: Number.NaN, weight: 1 },
        ],
        { separationDays: 0.2 },
      ),
    ).toEqual([]);
  });

  it('agrees with the reference weighted median on random marks', () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.record({
            timeDays: fc.integer({ min: 0, max: 40 }).map((k) => k / 8),
            weight: fc.integer({ min: 1, max: 6 }).map((k) => k / 2),
          }),
          { minLength: 1, maxLength: 15 },
        ),
        (marks) => {
          const [cluster] = dipTimeClusters(marks, { separationDays: 100 });
          expect(cluster!.center).toBeCloseTo(referenceWeightedMedian(marks), 12);
          const deviations = marks.map((m) => ({
            timeDays: Math.abs(m.timeDays - cluster!.center),
            weight: m.weight,
          }));
          expect(cluster!.sigma).toBeCloseTo(
            marks.length > 1 ? 1.4826 * referenceWeightedMedian(deviations) : 0,
            12,
          );
        },
      ),
    );
  });

  it('names the option that is out of range', () => {
    expect(() => dipTimeClusters([], { separationDays: 0 })).toThrow(
      /options\.separationDays must be > 0, got 0/,
    );
    expect(() => dipTimeClusters([], { separationDays: 1, minClusterMarks: 0 })).toThrow(
      /options\.minClusterMarks must be an integer ≥ 1, got 0/,
    );
  });
});
