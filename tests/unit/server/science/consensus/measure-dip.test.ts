import { describe, expect, it } from 'vitest';
import { dipDurationGridHours, measureDip } from '../../../../../server/science/consensus/measure-dip';
import { createRandom } from '../../../../../server/science/random';

// A 2-day snippet at 2-minute cadence (points at 100 + k/720 d) with white noise and one box dip. Dip
// centres sit half a cadence off the samples, so that a dip of a whole number of cadences holds exactly
// that many points, as a box started at a point does.
const HALF_CADENCE_DAYS = 1 / 1440;
function boxSnippet(seed: string, dip: { centerDays: number; depthPpm: number; durationHours: number }) {
  const random = createRandom(seed);
  const noise = 1e-3;
  const cadenceDays = 2 / 1440;
  const n = 1440;
  const timeDays = Float64Array.from({ length: n }, (_, i) => 100 + i * cadenceDays);
  const flux = Float64Array.from(timeDays, (t) => {
    const inside = Math.abs(t - dip.centerDays) < dip.durationHours / 48;
    return 1 + random.normal(0, noise) - (inside ? dip.depthPpm * 1e-6 : 0);
  });
  return { timeDays, flux, fluxErr: new Float64Array(n).fill(noise) };
}

// The campaign default longest transit (longest_transit_hours 12): durations from 1.5 to 12 h.
const options = { maxDurationHours: 12 };

describe('measureDip', () => {
  it('lays its durations evenly in log from an eighth of the longest to the longest', () => {
    const grid = dipDurationGridHours(options);
    expect(grid).toHaveLength(10);
    expect(grid[0]).toBeCloseTo(1.5, 12);
    expect(grid[9]).toBe(12);
    // Hand-computed: ratio 8^(1/9) between neighbours.
    expect(grid[1]! / grid[0]!).toBeCloseTo(8 ** (1 / 9), 12);
  });

  it('recovers a box dip of a duration on the grid: depth within its error, duration and time exactly', () => {
    // 6 h is on the grid (1.5 × 8^(6/9)); the mark is 40 minutes off the true centre.
    const grid = dipDurationGridHours(options);
    expect(grid[6]).toBeCloseTo(6, 10);
    const depthPpm = 3000;
    const centerDays = 101 + HALF_CADENCE_DAYS;
    let withinOne = 0;
    const seeds = 20;
    for (let k = 0; k < seeds; k += 1) {
      const series = boxSnippet(`measure-dip-${k}`, { centerDays, depthPpm, durationHours: grid[6]! });
      const result = measureDip(series, centerDays + 40 / 1440, options)!;
      expect(result).not.toBeNull();
      // For Gaussian noise the depth should fall within 3 of its errors every time and within 1 about
      // 68% of the time (common practice); at least half of the 20 is asked.
      const miss = Math.abs(result.depthPpm - depthPpm);
      expect(miss).toBeLessThan(3 * result.depthErrPpm);
      if (miss < result.depthErrPpm) withinOne += 1;
      expect(result.durationHours).toBeCloseTo(grid[6]!, 10);
      expect(result.pointsInDip).toBe(180);
      // Within one cadence (2 minutes) of the truth.
      expect(Math.abs(result.timeCenterDays - centerDays)).toBeLessThanOrEqual(2 / 1440 + 1e-9);
      // Hand-computed: 3000 ppm / 1000 ppm × √180 points ≈ 40.
      expect(result.snr).toBeGreaterThan(30);
      expect(result.snr).toBeLessThan(50);
      // Hand-computed: 1000 ppm × √(1/180 + (π/2)/1260) ≈ 82.5 ppm, give or take the scatter's own error.
      expect(result.depthErrPpm).toBeGreaterThan(75);
      expect(result.depthErrPpm).toBeLessThan(91);
    }
    expect(withinOne).toBeGreaterThanOrEqual(seeds / 2);
  });

  it('recovers a duration between grid points within a grid step', () => {
    const grid = dipDurationGridHours(options);
    const trueHours = 3.4; // between grid[3] = 3.0 and grid[4] = 3.78
    const series = boxSnippet('measure-dip-off-grid', {
      centerDays: 100.7 + HALF_CADENCE_DAYS,
      depthPpm: 2500,
      durationHours: trueHours,
    });
    const result = measureDip(series, 100.68, options)!;
    expect(Math.abs(result.durationHours - trueHours)).toBeLessThanOrEqual(grid[4]! - grid[3]!);
    expect(Math.abs(result.depthPpm - 2500)).toBeLessThan(3 * result.depthErrPpm);
  });

  it('weights the points by their errors when it has them, and still measures without them', () => {
    const series = boxSnippet('measure-dip-no-errors', { centerDays: 101, depthPpm: 3000, durationHours: 6 });
    const result = measureDip({ timeDays: series.timeDays, flux: series.flux }, 101, options)!;
    expect(Math.abs(result.depthPpm - 3000)).toBeLessThan(3 * result.depthErrPpm);
  });

  it('measures the depth relative to the baseline, whatever the flux units', () => {
    const series = boxSnippet('measure-dip-units', {
      centerDays: 101 + HALF_CADENCE_DAYS,
      depthPpm: 3000,
      durationHours: 6,
    });
    const relative = measureDip(series, 101, options)!;
    // The same light curve in electrons per second (× 12,000): the same depth in ppm.
    const scaled = {
      timeDays: series.timeDays,
      flux: series.flux.map((f) => f * 12_000),
      fluxErr: series.fluxErr.map((e) => e * 12_000),
    };
    const inCounts = measureDip(scaled, 101, options)!;
    expect(inCounts.depthPpm).toBeCloseTo(relative.depthPpm, 6);
    expect(inCounts.depthErrPpm).toBeCloseTo(relative.depthErrPpm, 6);
    expect(inCounts.snr).toBeCloseTo(relative.snr, 6);
  });

  it('returns null without data, or with too little of it around the mark', () => {
    const empty = { timeDays: new Float64Array(0), flux: new Float64Array(0) };
    expect(measureDip(empty, 101, options)).toBeNull();
    const series = boxSnippet('measure-dip-far', { centerDays: 101, depthPpm: 3000, durationHours: 6 });
    // The mark is 5 days past the end of the snippet.
    expect(measureDip(series, 107, options)).toBeNull();
    // Five points in all.
    const few = { timeDays: series.timeDays.subarray(0, 5), flux: series.flux.subarray(0, 5) };
    expect(measureDip(few, series.timeDays[2]!, options)).toBeNull();
  });

  it('returns null when nothing around the mark lies below the rest', () => {
    const timeDays = Float64Array.from({ length: 500 }, (_, i) => i / 720);
    expect(measureDip({ timeDays, flux: new Float64Array(500).fill(1) }, 0.35, options)).toBeNull();
  });

  it('names the option or array that is wrong', () => {
    const series = { timeDays: new Float64Array(3), flux: new Float64Array(2) };
    expect(() => measureDip(series, 0, options)).toThrow(
      /series\.timeDays, flux and fluxErr must have the same length, got 3, 2 and none/,
    );
    expect(() => measureDip(series, 0, { maxDurationHours: 0 })).toThrow(
      /options\.maxDurationHours must be a finite number > 0, got 0/,
    );
    expect(() => measureDip(series, 0, { maxDurationHours: 4, minDurationHours: 5 })).toThrow(
      /options\.minDurationHours must be in \(0, maxDurationHours \(4\)\], got 5/,
    );
  });
});
