import { describe, expect, it } from 'vitest';
import {
  binFold,
  foldHalfWindowHours,
  foldSeries,
  formatPeriodDays,
  isSearchUnderway,
  periodogramPeaks,
  periodSearchPollInterval,
  progressPercent,
  type SeriesPart,
} from '@/features/lab/lib/period-search';

/** A deterministic stand-in for noise (a linear congruential generator), so failures repeat. */
function noise(seed: number) {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1_664_525) + 1_013_904_223) >>> 0;
    return state / 2 ** 32 - 0.5;
  };
}

/** A light curve with a box transit of `depthPpm` every `periodDays` from `t0Days`, 10-min cadence. */
function plantedBox(options: {
  startDays: number;
  spanDays: number;
  periodDays: number;
  t0Days: number;
  durationHours: number;
  depthPpm: number;
  noisePpm?: number;
}): SeriesPart {
  const random = noise(7);
  const timeDays: number[] = [];
  const fluxPpm: number[] = [];
  const cadence = 10 / (24 * 60);
  for (let t = options.startDays; t < options.startDays + options.spanDays; t += cadence) {
    const cycles = (t - options.t0Days) / options.periodDays;
    const hours = Math.abs(cycles - Math.round(cycles)) * options.periodDays * 24;
    const inTransit = hours < options.durationHours / 2;
    timeDays.push(t);
    fluxPpm.push((inTransit ? -options.depthPpm : 0) + (options.noisePpm ?? 0) * random());
  }
  return { timeDays, fluxPpm };
}

/** The obvious fold, one point at a time with a loop over cycles, to check the fast one against. */
function slowPhaseHours(time: number, periodDays: number, t0Days: number): number {
  let best = Number.POSITIVE_INFINITY;
  for (let n = -10_000; n <= 10_000; n += 1) {
    const offset = (time - (t0Days + n * periodDays)) * 24;
    if (Math.abs(offset) < Math.abs(best)) best = offset;
  }
  return best;
}

describe('foldSeries', () => {
  it('puts every point at its offset from the nearest mid-transit, agreeing with a slow loop over cycles', () => {
    const random = noise(3);
    const timeDays = Array.from({ length: 200 }, () => 1000 + random() * 60);
    const part = { timeDays, fluxPpm: timeDays.map((_, i) => i) };
    const fold = foldSeries([part], { periodDays: 2.2319, t0Days: 1001.0104 });
    expect(fold.phaseHours).toHaveLength(200);
    const expected = timeDays.map((t) => slowPhaseHours(t, 2.2319, 1001.0104)).sort((a, b) => a - b);
    fold.phaseHours.forEach((phase, i) => {
      expect(phase).toBeCloseTo(expected[i]!, 6);
    });
    // Each flux stays with its own time: the value is the point's index, so find its time back.
    fold.fluxPpm.forEach((index, i) => {
      expect(slowPhaseHours(timeDays[index]!, 2.2319, 1001.0104)).toBeCloseTo(fold.phaseHours[i]!, 6);
    });
  });

  it('sorts by phase, keeps within ±P/2, and leaves out gaps', () => {
    const fold = foldSeries(
      [
        { timeDays: [10, 10.4, 10.9, 11.6], fluxPpm: [1, null, 3, 4] },
        { timeDays: [12.05], fluxPpm: [5] },
      ],
      { periodDays: 1, t0Days: 0 },
    );
    expect(fold.fluxPpm).toEqual([4, 3, 1, 5]);
    expect(fold.phaseHours.map((h) => Number(h.toFixed(6)))).toEqual([-9.6, -2.4, 0, 1.2]);
    for (const phase of fold.phaseHours) expect(Math.abs(phase)).toBeLessThanOrEqual(12);
  });

  it('keeps only the points within the window asked for', () => {
    const fold = foldSeries([{ timeDays: [0, 0.05, 0.2, 0.45], fluxPpm: [1, 2, 3, 4] }], {
      periodDays: 1,
      t0Days: 0,
      halfWindowHours: 2,
    });
    expect(fold.fluxPpm).toEqual([1, 2]);
  });

  it('names the period when it is not positive', () => {
    expect(() => foldSeries([], { periodDays: 0, t0Days: 0 })).toThrow(
      /periodDays must be a positive number, got 0/,
    );
  });

  it('recovers a planted transit: the binned fold at P is as deep as planted at phase 0 and flat outside', () => {
    const periodDays = 2.2319;
    const part = plantedBox({
      startDays: 1000,
      spanDays: 27,
      periodDays,
      t0Days: 1001.0104,
      durationHours: 2,
      depthPpm: 5000,
      noisePpm: 400,
    });
    const half = foldHalfWindowHours(periodDays, 2);
    const fold = foldSeries([part], { periodDays, t0Days: 1001.0104, halfWindowHours: half });
    const binned = binFold(fold, 0.5, -half, half);
    const at = (hours: number) =>
      binned.meanPpm[binned.phaseHours.findIndex((c) => Math.abs(c - hours) < 0.26)]!;
    expect(at(0.25)).toBeCloseTo(-5000, -2);
    expect(at(-0.25)).toBeCloseTo(-5000, -2);
    expect(Math.abs(at(5.25))).toBeLessThan(100);
    expect(Math.abs(at(-8.75))).toBeLessThan(100);
  });

  it('at twice the period, puts half the transits at phase 0 and the other half at ±P, the edges of the fold', () => {
    // Transits at P fold at 2P onto phase 0 and onto ±P; with a window of ±5 durations only phase 0 is in.
    const periodDays = 2;
    const part = plantedBox({
      startDays: 0,
      spanDays: 40,
      periodDays,
      t0Days: 1,
      durationHours: 2,
      depthPpm: 3000,
    });
    const fold = foldSeries([part], { periodDays: 4, t0Days: 1, halfWindowHours: 10 });
    const binned = binFold(fold, 0.5, -10, 10);
    expect(binned.meanPpm[binned.phaseHours.indexOf(0.25)]).toBeCloseTo(-3000, 6);
    const full = foldSeries([part], { periodDays: 4, t0Days: 1 });
    // The other half of the transits land at ±48 h, the edge of the fold at 2P.
    expect(full.phaseHours.some((phase) => Math.abs(Math.abs(phase) - 48) < 0.5)).toBe(true);
  });
});

describe('binFold', () => {
  it('averages each bin and marks an empty bin NaN so the line breaks there', () => {
    const binned = binFold(
      { phaseHours: [-1.9, -1.1, 0.2, 0.4, 1.99], fluxPpm: [10, 20, -100, -200, 6] },
      1,
      -2,
      2,
    );
    expect(binned.phaseHours).toEqual([-1.5, -0.5, 0.5, 1.5]);
    expect(binned.count).toEqual([2, 0, 2, 1]);
    expect(binned.meanPpm[0]).toBe(15);
    expect(Number.isNaN(binned.meanPpm[1])).toBe(true);
    expect(binned.meanPpm[2]).toBe(-150);
    expect(binned.meanPpm[3]).toBe(6);
  });

  it('names a bad bin width or range', () => {
    expect(() => binFold({ phaseHours: [], fluxPpm: [] }, 0, -1, 1)).toThrow(
      /binHours must be positive, got 0/,
    );
    expect(() => binFold({ phaseHours: [], fluxPpm: [] }, 1, 1, 1)).toThrow(
      /toHours must be after fromHours/,
    );
  });
});

describe('foldHalfWindowHours', () => {
  it('shows five durations either side, at least 6 h, never past half the period', () => {
    expect(foldHalfWindowHours(2.23, 1.5)).toBe(7.5);
    expect(foldHalfWindowHours(10, 0.5)).toBe(6);
    expect(foldHalfWindowHours(0.4, 3)).toBeCloseTo(4.8, 9);
  });
});

describe('periodogramPeaks', () => {
  it('lists local maxima strongest first, once per broad peak', () => {
    const periods = [1, 1.001, 1.002, 1.5, 2, 2.0005, 2.5, 3];
    const power = [5, 9, 8.5, 1, 7, 7.2, 1, 2];
    expect(periodogramPeaks(periods, power, 3)).toEqual([
      { periodDays: 1.001, power: 9 },
      { periodDays: 2.0005, power: 7.2 },
      { periodDays: 3, power: 2 },
    ]);
  });

  it('gives fewer peaks than asked when the periodogram has fewer', () => {
    expect(periodogramPeaks([1, 2, 3], [1, 2, 3], 5)).toEqual([{ periodDays: 3, power: 3 }]);
  });
});

describe('search state', () => {
  it('polls only while a search is queued or running', () => {
    expect(isSearchUnderway('queued')).toBe(true);
    expect(isSearchUnderway('running')).toBe(true);
    expect(isSearchUnderway('done')).toBe(false);
    expect(periodSearchPollInterval('running')).toBeGreaterThan(0);
    expect(periodSearchPollInterval('failed')).toBe(false);
    expect(periodSearchPollInterval(null)).toBe(false);
  });

  it('holds the progress bar inside 0–100', () => {
    expect(progressPercent({ percent: 42.4 })).toBe(42);
    expect(progressPercent({ percent: 140 })).toBe(100);
    expect(progressPercent(null)).toBe(0);
  });

  it('writes a period with the digits BLS gives it', () => {
    expect(formatPeriodDays(2.2319075929743697)).toBe('2.23191 d');
    expect(formatPeriodDays(null)).toBe('—');
  });
});
