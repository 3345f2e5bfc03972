import { describe, expect, it } from 'vitest';
import { defaultDetrendWindowDays, detrendBiweight, splitAtGaps } from '../../../../server/science/detrend';
import { createRandom } from '../../../../server/science/random';
import { ScienceInputError } from '../../../../server/science/types';

function series(
  days: number,
  cadenceDays: number,
  shape: (t: number) => number,
  seed = 'detrend',
  sigma = 2e-4,
) {
  const random = createRandom(seed);
  const n = Math.round(days / cadenceDays);
  const time = Float64Array.from({ length: n }, (_, i) => i * cadenceDays);
  const flux = Float64Array.from(time, (t) => shape(t) + random.normal(0, sigma));
  return { time, flux };
}

describe('detrendBiweight', () => {
  it('defaults to three times the longest transit sought (Hippke et al. 2019 recommend ~3×T14)', () => {
    expect(defaultDetrendWindowDays(12)).toBeCloseTo(1.5, 12);
  });

  it('removes spot modulation and keeps a transit of a third of the window at its depth', () => {
    // A 3-hour, 5000 ppm transit on a star spotted at 0.5% with a 9-day rotation; window 3 × 3 h.
    const depth = 0.005;
    const transit = (t: number) => (Math.abs(t - 10) < 1.5 / 24 ? 1 - depth : 1);
    const { time, flux } = series(
      27,
      1 / 720,
      (t) => (1 + 0.005 * Math.sin((2 * Math.PI * t) / 9)) * transit(t),
    );
    const { detrended } = detrendBiweight(time, flux, { windowDays: defaultDetrendWindowDays(3) });
    const outOfTransit: number[] = [];
    const inTransit: number[] = [];
    time.forEach((t, i) => {
      if (Math.abs(t - 10) < 1 / 24) inTransit.push(detrended[i]!);
      else if (Math.abs(t - 10) > 4 / 24) outOfTransit.push(detrended[i]!);
    });
    const mean = (values: number[]) => values.reduce((a, b) => a + b, 0) / values.length;
    const residual = Math.sqrt(mean(outOfTransit.map((v) => (v - 1) ** 2)));
    expect(residual).toBeLessThan(4e-4); // the 1% modulation is gone, down to the 2e-4 noise
    expect(1 - mean(inTransit) / mean(outOfTransit)).toBeGreaterThan(depth * 0.9);
  });

  it('detrends each side of a long gap on its own, so a jump across it leaves no step', () => {
    const { time: t1, flux: f1 } = series(5, 1 / 720, () => 1, 'gap-a');
    const { time: t2, flux: f2 } = series(5, 1 / 720, () => 1.03, 'gap-b');
    const time = Float64Array.from([...t1, ...Array.from(t2, (t) => t + 7)]);
    const flux = Float64Array.from([...f1, ...f2]);
    const { detrended, segments } = detrendBiweight(time, flux, { windowDays: 1 });
    expect(segments).toHaveLength(2);
    const nearGap = Array.from(detrended.slice(t1.length - 50, t1.length + 50));
    expect(Math.max(...nearGap.map((v) => Math.abs(v - 1)))).toBeLessThan(2e-3);
  });

  it('names the argument when the window is out of range or the arrays differ in length', () => {
    const time = new Float64Array([0, 1]);
    expect(() => detrendBiweight(time, new Float64Array([1, 1]), { windowDays: 0 })).toThrow(/windowDays/);
    expect(() => detrendBiweight(time, new Float64Array([1]), { windowDays: 1 })).toThrow(ScienceInputError);
  });
});

describe('splitAtGaps', () => {
  it('answers index ranges between gaps longer than the limit', () => {
    expect(splitAtGaps(Float64Array.from([0, 1, 2, 10, 11, 30]), 5)).toEqual([
      [0, 3],
      [3, 5],
      [5, 6],
    ]);
  });
});
