import { describe, expect, it } from 'vitest';
import {
  binIndex,
  completenessTable,
  DEPTH_EDGES_PPM,
  type PlantedControl,
  recoveryByBin,
  SNR_EDGES,
  wilsonInterval,
  Z_95,
} from '../../../../server/science/completeness';
import { ScienceInputError } from '../../../../server/science/types';
// Made by tests/reference/make_completeness_reference.py with astropy 5.2.1
// astropy.stats.binom_conf_interval and binned_binom_proportion (interval='wilson').
import reference from '../../../fixtures/reference/wilson.json';

const planted = (
  expectedSnr: number | null,
  outcome: PlantedControl['outcome'],
  more: Partial<PlantedControl> = {},
): PlantedControl => ({ expectedSnr, depthPpm: 900, durationHours: 3, outcome, ...more });

describe('wilsonInterval', () => {
  it('for 8 successes in 10 at 95 % gives [0.4902, 0.9433] (astropy.stats.binom_conf_interval, Wilson)', () => {
    const { low, high } = wilsonInterval(8, 10);
    expect(low).toBeCloseTo(0.4902, 4);
    expect(high).toBeCloseTo(0.9433, 4);
  });

  it('agrees with astropy.stats.binom_conf_interval (Wilson) to 1e-7 at 95 % and at 1 σ', () => {
    for (const [name, level] of Object.entries(reference.intervals)) {
      // Our Z_95 is astropy's √2·erf⁻¹(0.95) rounded to 7 digits; at 1 σ both use z = 1.
      const z = name === '95' ? Z_95 : level.z;
      expect(Math.abs(z - level.z)).toBeLessThan(1e-6);
      for (const { successes, trials, low, high } of level.cases) {
        const interval = wilsonInterval(successes, trials, z);
        const what = `${successes}/${trials} at ${name}`;
        expect(Math.abs(interval.low - low), what).toBeLessThan(1e-7);
        expect(Math.abs(interval.high - high), what).toBeLessThan(1e-7);
      }
    }
  });

  it('with no trials answers the whole range [0, 1]: nothing is known', () => {
    expect(wilsonInterval(0, 0)).toEqual({ low: 0, high: 1 });
  });

  it('at 0/n starts at exactly 0 and at n/n ends at exactly 1, with a width that shrinks as n grows', () => {
    const none = [1, 5, 50].map((n) => wilsonInterval(0, n));
    const all = [1, 5, 50].map((n) => wilsonInterval(n, n));
    for (const interval of none) expect(interval.low).toBe(0);
    for (const interval of all) expect(interval.high).toBe(1);
    expect(none[0]!.high).toBeGreaterThan(none[1]!.high);
    expect(none[1]!.high).toBeGreaterThan(none[2]!.high);
    // 0/n and n/n mirror each other about ½.
    none.forEach((interval, i) => {
      expect(interval.high).toBeCloseTo(1 - all[i]!.low, 12);
    });
  });

  it('always holds the observed share, inside [0, 1]', () => {
    for (let n = 1; n <= 40; n += 1) {
      for (let k = 0; k <= n; k += 1) {
        const { low, high } = wilsonInterval(k, n);
        expect(low).toBeGreaterThanOrEqual(0);
        expect(high).toBeLessThanOrEqual(1);
        expect(low).toBeLessThanOrEqual(k / n);
        expect(high).toBeGreaterThanOrEqual(k / n);
      }
    }
  });

  it('refuses counts that are not whole, negative or more successes than trials, naming the argument', () => {
    expect(() => wilsonInterval(11, 10)).toThrow(/successes must be .* got 11/);
    expect(() => wilsonInterval(-1, 10)).toThrow(ScienceInputError);
    expect(() => wilsonInterval(1.5, 10)).toThrow(/successes/);
    expect(() => wilsonInterval(0, -2)).toThrow(/trials must be .* got -2/);
    expect(() => wilsonInterval(0, Number.NaN)).toThrow(/trials/);
    expect(() => wilsonInterval(1, 2, 0)).toThrow(/z must be .* got 0/);
  });
});

describe('binIndex', () => {
  it('puts a value on an edge in the bin that starts there, and values past the last edge in the last bin', () => {
    expect(binIndex(0, SNR_EDGES)).toBe(0);
    expect(binIndex(4.999, SNR_EDGES)).toBe(0);
    expect(binIndex(7.1, SNR_EDGES)).toBe(2);
    expect(binIndex(7.0999, SNR_EDGES)).toBe(1);
    expect(binIndex(50, SNR_EDGES)).toBe(SNR_EDGES.length - 1);
    expect(binIndex(1e6, SNR_EDGES)).toBe(SNR_EDGES.length - 1);
  });

  it('answers −1 for a value below the first edge or not finite', () => {
    expect(binIndex(-0.1, SNR_EDGES)).toBe(-1);
    expect(binIndex(Number.NaN, SNR_EDGES)).toBe(-1);
    expect(binIndex(Number.POSITIVE_INFINITY, SNR_EDGES)).toBe(-1);
  });

  it('agrees with a plain scan of the edges', () => {
    const scan = (value: number, edges: readonly number[]) => {
      let index = -1;
      for (let i = 0; i < edges.length; i += 1) if (value >= edges[i]!) index = i;
      return index;
    };
    for (let value = -3; value < 70_000; value = value * 1.07 + 0.3) {
      expect(binIndex(value, DEPTH_EDGES_PPM), String(value)).toBe(scan(value, DEPTH_EDGES_PPM));
      expect(binIndex(value, SNR_EDGES), String(value)).toBe(scan(value, SNR_EDGES));
    }
  });
});

describe('recoveryByBin', () => {
  it('matches astropy.stats.binned_binom_proportion (Wilson, 95 %) on the committed invented controls', () => {
    const { binned } = reference;
    expect(binned.edges).toEqual(SNR_EDGES);
    const controls = binned.expectedSnr.map((snr, i) => planted(snr, binned.recovered[i] ? 'dip' : 'flat'));
    const bins = recoveryByBin(controls, (c) => c.expectedSnr, SNR_EDGES);
    // astropy lists only the bins that hold data; every bin holds some here.
    expect(bins).toHaveLength(binned.bins.length);
    bins.forEach((bin, i) => {
      const expected = binned.bins[i]!;
      expect(bin.lower).toBeCloseTo(expected.low, 9);
      expect(bin.upper).toBeCloseTo(expected.high, 9);
      expect(bin.recovered + bin.missed).toBe(expected.trials);
      expect(bin.rate).toBeCloseTo(expected.rate, 12);
      expect(Math.abs(bin.wilsonLow! - expected.wilsonLow)).toBeLessThan(1e-7);
      expect(Math.abs(bin.wilsonHigh! - expected.wilsonHigh)).toBeLessThan(1e-7);
    });
  });

  it('lists from the first to the last occupied bin, keeping empty bins between them', () => {
    const bins = recoveryByBin([planted(6, 'dip'), planted(17, 'flat')], (c) => c.expectedSnr, SNR_EDGES);
    expect(bins.map((bin) => [bin.lower, bin.upper])).toEqual([
      [5, 7.1],
      [7.1, 10],
      [10, 15],
      [15, 20],
    ]);
    expect(bins[1]).toMatchObject({ recovered: 0, missed: 0, pending: 0, rate: null, wilsonLow: null });
  });

  it('also lists the empty bins over the campaign’s planted SNR range, but not one that only touches its top', () => {
    const bins = recoveryByBin([], (c) => c.expectedSnr, SNR_EDGES, { shownRange: { min: 7, max: 30 } });
    expect(bins.map((bin) => bin.lower)).toEqual([5, 7.1, 10, 15, 20]);
    const single = recoveryByBin([], (c) => c.expectedSnr, SNR_EDGES, { shownRange: { min: 10, max: 10 } });
    expect(single.map((bin) => bin.lower)).toEqual([10]);
    const high = recoveryByBin([], (c) => c.expectedSnr, SNR_EDGES, { shownRange: { min: 40, max: 200 } });
    expect(high.map((bin) => [bin.lower, bin.upper])).toEqual([
      [30, 50],
      [50, null],
    ]);
  });

  it('counts pending controls in their bin but not in its rate, and leaves out controls without a value', () => {
    const bins = recoveryByBin(
      [planted(12, 'dip'), planted(12, null), planted(13, 'flat'), planted(null, 'dip'), planted(-1, 'dip')],
      (c) => c.expectedSnr,
      SNR_EDGES,
    );
    expect(bins).toEqual([
      expect.objectContaining({ lower: 10, upper: 15, recovered: 1, missed: 1, pending: 1, rate: 0.5 }),
    ]);
  });

  it('with no controls and no range lists no bins', () => {
    expect(recoveryByBin([], (c) => c.depthPpm, DEPTH_EDGES_PPM)).toEqual([]);
  });
});

describe('completenessTable', () => {
  it('counts recovered, missed and pending planted dips and false dips on quiet controls, with Wilson intervals', () => {
    const controls = [
      ...Array.from({ length: 8 }, () => planted(25, 'dip', { depthPpm: 3000, durationHours: 2.5 })),
      ...Array.from({ length: 2 }, () => planted(25, 'flat', { depthPpm: 150, durationHours: 5 })),
      planted(8, null, { depthPpm: 150, durationHours: 5 }),
    ];
    const quiet = [{ outcome: 'dip' as const }, { outcome: 'flat' as const }, { outcome: 'flat' as const }];
    const table = completenessTable(controls, [...quiet, { outcome: 'flat' }, { outcome: null }], {
      snrRange: { min: 7, max: 30 },
    });
    // 8 of 10: [0.4902, 0.9433] at 95 % (astropy.stats.binom_conf_interval, Wilson).
    expect(table.planted).toMatchObject({ total: 11, recovered: 8, missed: 2, pending: 1, rate: 0.8 });
    expect(table.planted.wilsonLow).toBeCloseTo(0.4902, 4);
    expect(table.planted.wilsonHigh).toBeCloseTo(0.9433, 4);
    expect(table.quiet).toMatchObject({ total: 5, falseDips: 1, flat: 3, pending: 1, rate: 0.25 });
    expect(table.quiet.wilsonLow).toBeCloseTo(wilsonInterval(1, 4).low, 12);
    expect(table.bySnr.map((bin) => bin.lower)).toEqual([5, 7.1, 10, 15, 20]);
    expect(table.bySnr.find((bin) => bin.lower === 20)).toMatchObject({
      recovered: 8,
      missed: 2,
      pending: 0,
    });
    expect(table.bySnr.find((bin) => bin.lower === 7.1)).toMatchObject({ pending: 1, rate: null });
    expect(table.byDepth.map((bin) => [bin.lower, bin.recovered, bin.missed, bin.pending])).toEqual([
      [100, 0, 2, 1],
      [200, 0, 0, 0],
      [500, 0, 0, 0],
      [1000, 0, 0, 0],
      [2000, 8, 0, 0],
    ]);
    expect(table.byDuration.map((bin) => [bin.lower, bin.upper, bin.recovered, bin.missed])).toEqual([
      [2, 3, 8, 0],
      [3, 4, 0, 0],
      [4, 6, 0, 2],
    ]);
    expect(table.interval).toEqual({ method: 'wilson', z: Z_95 });
  });

  it('without outcomes has null rates everywhere and still lists the SNR bins of the planted range', () => {
    const table = completenessTable([planted(9, null)], [{ outcome: null }], {
      snrRange: { min: 7, max: 30 },
    });
    expect(table.planted).toMatchObject({
      total: 1,
      pending: 1,
      rate: null,
      wilsonLow: null,
      wilsonHigh: null,
    });
    expect(table.quiet).toMatchObject({ total: 1, pending: 1, rate: null });
    expect(table.bySnr).toHaveLength(5);
    expect(table.bySnr.every((bin) => bin.rate === null)).toBe(true);
  });
});
