import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { blsStatistics, boxLeastSquares, periodGrid } from '../../../../server/science/bls';
import { createRandom, type Random } from '../../../../server/science/random';
import { ScienceInputError } from '../../../../server/science/types';

// ---------------------------------------------------------------------------------------------
// The reference fixtures: invented light curves and astropy's answers for them, made by
// tests/reference/make_reference.py with astropy 5.2.1 BoxLeastSquares (objective='likelihood').
// ---------------------------------------------------------------------------------------------

const FIXTURE_DIR = new URL('../../../fixtures/reference/', import.meta.url);
const FIXTURES = ['hot-jupiter', 'shallow-transit', 'eclipsing-binary'] as const;

interface Reference {
  name: string;
  bls: {
    inputs: {
      oversample: number;
      durations_days: number[];
      period_grid: {
        baseline_days: number;
        min_period_days: number;
        max_period_days: number;
        shortest_duration_days: number;
        oversample: number;
        count: number;
        first_period_days: number;
        last_period_days: number;
      };
    };
    best: {
      period_days: number;
      transit_time_days: number;
      duration_days: number;
      depth: number;
      depth_err: number;
      depth_snr: number;
      log_likelihood: number;
    };
    compute_stats: {
      depth: [number, number];
      depth_odd: [number, number];
      depth_even: [number, number];
      depth_half: [number, number];
      depth_phased: [number, number];
      harmonic_amplitude: number;
      harmonic_delta_log_likelihood: number;
      per_transit_count: number[];
      per_transit_log_likelihood: number[];
      transit_times: number[];
    };
  };
}

interface Series {
  timeDays: Float64Array;
  flux: Float64Array;
  fluxErr: Float64Array;
}

function loadFixture(name: string): { series: Series; reference: Reference } {
  const lines = readFileSync(new URL(`${name}.csv`, FIXTURE_DIR), 'utf8')
    .trim()
    .split('\n')
    .slice(1);
  const series: Series = {
    timeDays: new Float64Array(lines.length),
    flux: new Float64Array(lines.length),
    fluxErr: new Float64Array(lines.length),
  };
  lines.forEach((line, i) => {
    const [time, flux, fluxErr] = line.split(',').map(Number);
    series.timeDays[i] = time!;
    series.flux[i] = flux!;
    series.fluxErr[i] = fluxErr!;
  });
  const reference = JSON.parse(readFileSync(new URL(`${name}.json`, FIXTURE_DIR), 'utf8')) as Reference;
  return { series, reference };
}

function gridOf(reference: Reference): Float64Array {
  const grid = reference.bls.inputs.period_grid;
  return periodGrid({
    baselineDays: grid.baseline_days,
    minPeriodDays: grid.min_period_days,
    maxPeriodDays: grid.max_period_days,
    shortestDurationDays: grid.shortest_duration_days,
    oversample: grid.oversample,
  });
}

// Distance between two transit times on the circle of one period.
function phaseDistanceDays(a: number, b: number, periodDays: number): number {
  const d = Math.abs((((a - b) % periodDays) + periodDays) % periodDays);
  return Math.min(d, periodDays - d);
}

function relative(ours: number, theirs: number): number {
  return Math.abs(ours - theirs) / Math.abs(theirs);
}

// ---------------------------------------------------------------------------------------------
// The slow, obvious reference: for every period, duration and starting phase bin, put each point
// in or out of the box by its own phase and fit the two weighted means directly.
// ---------------------------------------------------------------------------------------------

interface SlowBox {
  power: number;
  durationDays: number;
  transitTimeDays: number;
  depth: number;
  depthErr: number;
  logLikelihood: number;
}

function slowBoxLeastSquares(
  { timeDays, flux, fluxErr }: Series,
  periodsDays: number[],
  durationsDays: number[],
  binsPerDuration: number,
  objective: 'likelihood' | 'snr',
): (SlowBox | null)[] {
  const tMin = Math.min(...timeDays);
  const binDays = Math.min(...durationsDays) / binsPerDuration;
  return periodsDays.map((periodDays) => {
    const binCount = Math.ceil(periodDays / binDays);
    const phaseBin = Array.from(timeDays, (t) => {
      const x = t - tMin;
      const phase = x - periodDays * Math.floor(x / periodDays);
      return Math.min(Math.floor(phase / binDays), binCount - 1);
    });
    let best: SlowBox | null = null;
    for (const durationDays of durationsDays) {
      const span = Math.max(1, Math.round(durationDays / binDays));
      for (let start = 0; start < binCount; start += 1) {
        let wIn = 0;
        let yIn = 0;
        let wOut = 0;
        let yOut = 0;
        for (let i = 0; i < timeDays.length; i += 1) {
          const w = 1 / fluxErr[i]! ** 2;
          if ((phaseBin[i]! - start + binCount) % binCount < span) {
            wIn += w;
            yIn += w * flux[i]!;
          } else {
            wOut += w;
            yOut += w * flux[i]!;
          }
        }
        if (wIn === 0 || wOut === 0) continue;
        const depth = yOut / wOut - yIn / wIn;
        if (!(depth > 0)) continue;
        const depthErr = Math.sqrt(1 / wIn + 1 / wOut);
        const logLikelihood = 0.5 * wIn * depth * depth;
        const power = objective === 'likelihood' ? logLikelihood : depth / depthErr;
        if (best === null || power > best.power) {
          const phase = (start + 0.5 * span) * binDays;
          best = {
            power,
            durationDays: span * binDays,
            transitTimeDays: tMin + (phase >= periodDays ? phase - periodDays : phase),
            depth,
            depthErr,
            logLikelihood,
          };
        }
      }
    }
    return best;
  });
}

function randomSeries(random: Random, n: number): Series {
  const timeDays = Float64Array.from({ length: n }, () => random.uniform(0, 12)).sort();
  const fluxErr = Float64Array.from({ length: n }, () => random.uniform(0.5e-3, 2e-3));
  const flux = Float64Array.from(fluxErr, (sigma) => 1 + random.normal(0, sigma));
  return { timeDays, flux, fluxErr };
}

/** A box transit planted on white noise at a regular cadence, with a gap. */
function plantedSeries(
  random: Random,
  planted: { periodDays: number; t0Days: number; durationDays: number; depthPpm: number },
  noisePpm: number,
  cadenceDays = 10 / 1440,
  spanDays = 27,
): Series {
  const times: number[] = [];
  for (let t = 0; t < spanDays; t += cadenceDays) if (t < 13 || t > 14.2) times.push(t);
  const timeDays = Float64Array.from(times);
  const fluxErr = new Float64Array(times.length).fill(noisePpm * 1e-6);
  const flux = Float64Array.from(timeDays, (t) => {
    const half = 0.5 * planted.periodDays;
    const inside =
      Math.abs(((t - planted.t0Days + half) % planted.periodDays) - half) < 0.5 * planted.durationDays;
    return 1 + random.normal(0, noisePpm * 1e-6) - (inside ? planted.depthPpm * 1e-6 : 0);
  });
  return { timeDays, flux, fluxErr };
}

describe('periodGrid', () => {
  it('when given the fixtures’ grid definitions, makes the same grids as the reference script', () => {
    for (const name of FIXTURES) {
      const { reference } = loadFixture(name);
      const grid = gridOf(reference);
      const expected = reference.bls.inputs.period_grid; // astropy 5.2.1 run, tests/fixtures/reference/<name>.json
      expect(grid.length).toBe(expected.count);
      expect(grid[0]).toBeCloseTo(expected.first_period_days, 12);
      expect(grid[grid.length - 1]).toBeCloseTo(expected.last_period_days, 10);
    }
  });

  it('spaces the frequencies by shortest duration / (oversample · baseline²)', () => {
    const grid = periodGrid({
      baselineDays: 20,
      minPeriodDays: 1,
      maxPeriodDays: 10,
      shortestDurationDays: 0.1,
      oversample: 2,
    });
    const step = 0.1 / (2 * 20 * 20);
    expect(grid[0]).toBe(1);
    for (let i = 1; i < grid.length; i += 1) {
      expect(1 / grid[i - 1]! - 1 / grid[i]!).toBeCloseTo(step, 12);
    }
    expect(grid.length).toBe(1 + Math.round((1 - 0.1) / step));
  });

  it('when the options are out of range, throws naming the option and what was allowed', () => {
    const good = {
      baselineDays: 20,
      minPeriodDays: 1,
      maxPeriodDays: 10,
      shortestDurationDays: 0.1,
      oversample: 1,
    };
    expect(() => periodGrid({ ...good, baselineDays: 0 })).toThrow(/baselineDays must be positive/);
    expect(() => periodGrid({ ...good, minPeriodDays: Number.NaN })).toThrow(
      /minPeriodDays must be positive/,
    );
    expect(() => periodGrid({ ...good, maxPeriodDays: 0.5 })).toThrow(
      'maxPeriodDays must be longer than minPeriodDays (1 d), got 0.5',
    );
    expect(() => periodGrid({ ...good, shortestDurationDays: 1.5 })).toThrow(
      'shortestDurationDays must be shorter than minPeriodDays (1 d), got 1.5',
    );
    expect(() => periodGrid({ ...good, oversample: 0.5 })).toThrow(
      'oversample must be a finite number ≥ 1, got 0.5',
    );
    expect(() =>
      periodGrid({ ...good, minPeriodDays: 0.01, shortestDurationDays: 0.001, baselineDays: 1000 }),
    ).toThrow(/at most 5000000 are allowed/);
  });
});

describe('boxLeastSquares against the slow reference', () => {
  it.each([
    ['likelihood', 1],
    ['likelihood', 2],
    ['likelihood', 3],
    ['snr', 4],
    ['snr', 5],
  ] as const)('on random light curves (objective %s, seed %i), agrees at every period', (objective, seed) => {
    const random = createRandom(`bls-slow-${objective}-${seed}`);
    const series = randomSeries(random, random.int(60, 160));
    const durationsDays = [random.uniform(0.08, 0.15), random.uniform(0.15, 0.3), random.uniform(0.3, 0.6)];
    const periodsDays = Array.from({ length: 25 }, () => random.uniform(0.7, 6));
    const binsPerDuration = random.int(2, 6);
    const slow = slowBoxLeastSquares(series, periodsDays, durationsDays, binsPerDuration, objective);
    const fast = boxLeastSquares(series.timeDays, series.flux, series.fluxErr, {
      periodsDays: Float64Array.from(periodsDays),
      durationsDays,
      objective,
      binsPerDuration,
    });
    slow.forEach((expected, p) => {
      expect(expected).not.toBeNull();
      expect(fast.periodogram.power[p]).toBeCloseTo(expected!.power, 8);
      expect(fast.periodogram.durationDays[p]).toBeCloseTo(expected!.durationDays, 12);
      expect(fast.periodogram.transitTimeDays[p]).toBeCloseTo(expected!.transitTimeDays, 10);
      expect(fast.periodogram.depthPpm[p]! / 1e6).toBeCloseTo(expected!.depth, 10);
      expect(fast.periodogram.depthSnr[p]).toBeCloseTo(expected!.depth / expected!.depthErr, 8);
    });
    const bestSlow = slow.reduce((a, b, i) => (b!.power > slow[a]!.power ? i : a), 0);
    expect(fast.best!.index).toBe(bestSlow);
    expect(fast.best!.logLikelihood).toBeCloseTo(slow[bestSlow]!.logLikelihood, 8);
    expect(fast.best!.depthErrPpm / 1e6).toBeCloseTo(slow[bestSlow]!.depthErr, 12);
  });

  it('when the times are not sorted, gives the same answer as for the sorted light curve', () => {
    const random = createRandom('bls-unsorted');
    const series = randomSeries(random, 200);
    const order = Array.from(series.timeDays, (_, i) => i).sort(() => random.next() - 0.5);
    const shuffled: Series = {
      timeDays: Float64Array.from(order, (i) => series.timeDays[i]!),
      flux: Float64Array.from(order, (i) => series.flux[i]!),
      fluxErr: Float64Array.from(order, (i) => series.fluxErr[i]!),
    };
    const options = {
      periodsDays: Float64Array.from({ length: 40 }, (_, i) => 0.8 + i * 0.13),
      durationsDays: [0.1, 0.2],
      objective: 'likelihood' as const,
    };
    const a = boxLeastSquares(series.timeDays, series.flux, series.fluxErr, options);
    const b = boxLeastSquares(shuffled.timeDays, shuffled.flux, shuffled.fluxErr, options);
    for (let p = 0; p < 40; p += 1) expect(b.periodogram.power[p]).toBeCloseTo(a.periodogram.power[p]!, 8);
    expect(b.best!.index).toBe(a.best!.index);
  });
});

describe('boxLeastSquares on planted transits', () => {
  it.each([
    { periodDays: 2.734, t0Days: 0.61, durationDays: 0.1, depthPpm: 3000, noisePpm: 1000 },
    { periodDays: 5.31, t0Days: 4.02, durationDays: 0.18, depthPpm: 800, noisePpm: 600 },
    { periodDays: 11.2, t0Days: 7.5, durationDays: 0.25, depthPpm: 5000, noisePpm: 2000 },
  ])('recovers a $depthPpm ppm box at $periodDays d', (planted) => {
    const series = plantedSeries(
      createRandom(`bls-planted-${planted.periodDays}`),
      planted,
      planted.noisePpm,
    );
    const durationsDays = [0.06, 0.1, 0.15, 0.2, 0.25];
    const periodsDays = periodGrid({
      baselineDays: 27,
      minPeriodDays: 0.8,
      maxPeriodDays: 13,
      shortestDurationDays: 0.06,
      oversample: 1,
    });
    const { best } = boxLeastSquares(series.timeDays, series.flux, series.fluxErr, {
      periodsDays,
      durationsDays,
      objective: 'likelihood',
    });
    // Resolved: over the 27 d baseline the period error shifts the transits by under half a duration.
    const cycles = 27 / planted.periodDays;
    expect(Math.abs(best!.periodDays - planted.periodDays) * cycles).toBeLessThan(0.5 * planted.durationDays);
    expect(phaseDistanceDays(best!.transitTimeDays, planted.t0Days, planted.periodDays)).toBeLessThan(
      0.25 * planted.durationDays,
    );
    expect(Math.abs(best!.durationDays - planted.durationDays)).toBeLessThanOrEqual(0.03);
    expect(Math.abs(best!.depthPpm - planted.depthPpm)).toBeLessThan(4 * best!.depthErrPpm);
    expect(best!.depthSnr).toBeGreaterThan(7);
    expect(best!.transitTimeDays).toBeGreaterThanOrEqual(0);
    expect(best!.transitTimeDays).toBeLessThan(best!.periodDays);
  });

  it('when the flux never dips, has no best box', () => {
    const timeDays = Float64Array.from({ length: 50 }, (_, i) => i * 0.1);
    const flux = new Float64Array(50).fill(1);
    const fluxErr = new Float64Array(50).fill(1e-3);
    const result = boxLeastSquares(timeDays, flux, fluxErr, {
      periodsDays: Float64Array.of(1, 1.5, 2),
      durationsDays: [0.2],
      objective: 'likelihood',
    });
    expect(result.best).toBeNull();
    expect(Array.from(result.periodogram.power)).toEqual([0, 0, 0]);
    expect(Number.isNaN(result.periodogram.durationDays[0]!)).toBe(true);
  });
});

describe('boxLeastSquares and blsStatistics against astropy', () => {
  describe.each(FIXTURES)('on the %s fixture', (name) => {
    const { series, reference } = loadFixture(name);
    // Check values: astropy 5.2.1 BoxLeastSquares, tests/fixtures/reference/<name>.json.
    const astropy = reference.bls.best;
    const stats = reference.bls.compute_stats;
    const result = boxLeastSquares(series.timeDays, series.flux, series.fluxErr, {
      periodsDays: gridOf(reference),
      durationsDays: reference.bls.inputs.durations_days,
      objective: 'likelihood',
      binsPerDuration: reference.bls.inputs.oversample,
    });
    const best = result.best!;

    it('finds the best period within 0.1%, t0 within 0.01 d and the depth within 5%', () => {
      expect(relative(best.periodDays, astropy.period_days)).toBeLessThan(1e-3);
      expect(
        phaseDistanceDays(best.transitTimeDays, astropy.transit_time_days, best.periodDays),
      ).toBeLessThan(0.01);
      expect(relative(best.depthPpm / 1e6, astropy.depth)).toBeLessThan(0.05);
      expect(best.durationDays).toBeCloseTo(astropy.duration_days, 9);
      expect(relative(best.depthErrPpm / 1e6, astropy.depth_err)).toBeLessThan(0.05);
      expect(relative(best.depthSnr, astropy.depth_snr)).toBeLessThan(0.05);
      expect(relative(best.logLikelihood, astropy.log_likelihood)).toBeLessThan(0.05);
    });

    it('at our best box, gives odd and even depths within 10% of astropy’s compute_stats', () => {
      const ours = blsStatistics(series.timeDays, series.flux, series.fluxErr, {
        periodDays: best.periodDays,
        durationDays: best.durationDays,
        transitTimeDays: best.transitTimeDays,
      });
      expect(relative(ours.depth!.depthPpm / 1e6, stats.depth[0])).toBeLessThan(0.05);
      expect(relative(ours.depthOdd!.depthPpm / 1e6, stats.depth_odd[0])).toBeLessThan(0.1);
      expect(relative(ours.depthEven!.depthPpm / 1e6, stats.depth_even[0])).toBeLessThan(0.1);
      expect(ours.transits.transitTimeDays.length).toBe(stats.transit_times.length);
    });

    it('at astropy’s box, matches every compute_stats value', () => {
      const ours = blsStatistics(series.timeDays, series.flux, series.fluxErr, {
        periodDays: astropy.period_days,
        durationDays: astropy.duration_days,
        transitTimeDays: astropy.transit_time_days,
      });
      const pairs = [
        [ours.depth, stats.depth],
        [ours.depthOdd, stats.depth_odd],
        [ours.depthEven, stats.depth_even],
        [ours.depthHalfPeriod, stats.depth_half],
        [ours.depthSecondary, stats.depth_phased],
      ] as const;
      for (const [estimate, [depth, depthErr]] of pairs) {
        expect(estimate!.depthPpm / 1e6).toBeCloseTo(depth, 9);
        expect(relative(estimate!.depthErrPpm / 1e6, depthErr)).toBeLessThan(1e-9);
      }
      expect(relative(ours.harmonicAmplitudePpm / 1e6, stats.harmonic_amplitude)).toBeLessThan(1e-6);
      expect(relative(ours.harmonicDeltaLogLikelihood, stats.harmonic_delta_log_likelihood)).toBeLessThan(
        1e-6,
      );
      expect(Array.from(ours.transits.pointCount)).toEqual(stats.per_transit_count);
      ours.transits.transitTimeDays.forEach((t, i) => {
        expect(t).toBeCloseTo(stats.transit_times[i]!, 9);
      });
      ours.transits.logLikelihood.forEach((ll, i) => {
        expect(ll).toBeCloseTo(stats.per_transit_log_likelihood[i]!, 6);
      });
    });
  });

  it('tells the eclipsing binary’s unequal odd/even depths and its secondary eclipse from a planet’s', () => {
    const statisticsOf = (name: string) => {
      const { series, reference } = loadFixture(name);
      const best = reference.bls.best; // astropy 5.2.1 BoxLeastSquares, tests/fixtures/reference/<name>.json
      return blsStatistics(series.timeDays, series.flux, series.fluxErr, {
        periodDays: best.period_days,
        durationDays: best.duration_days,
        transitTimeDays: best.transit_time_days,
      });
    };
    const binary = statisticsOf('eclipsing-binary');
    const planet = statisticsOf('hot-jupiter');
    expect(binary.oddEvenDifferenceSigma!).toBeGreaterThan(20);
    expect(binary.depthSecondary!.depthPpm / binary.depthSecondary!.depthErrPpm).toBeGreaterThan(10);
    expect(planet.oddEvenDifferenceSigma!).toBeLessThan(3);
    expect(Math.abs(planet.depthSecondary!.depthPpm / planet.depthSecondary!.depthErrPpm)).toBeLessThan(3);
  });
});

describe('blsStatistics per transit', () => {
  it('gives each transit its depth, point count and time; a transit in a gap has no points', () => {
    const planted = { periodDays: 3.1, t0Days: 1.2, durationDays: 0.15, depthPpm: 4000 };
    const series = plantedSeries(createRandom('bls-per-transit'), planted, 500);
    const stats = blsStatistics(series.timeDays, series.flux, series.fluxErr, {
      periodDays: planted.periodDays,
      durationDays: planted.durationDays,
      transitTimeDays: planted.t0Days,
    });
    const { transits } = stats;
    expect(transits.transitTimeDays.length).toBe(9); // 1.2, 4.3, …, 26.0 d
    transits.transitTimeDays.forEach((t, i) => {
      expect(t).toBeCloseTo(1.2 + 3.1 * i, 12);
    });
    const inGap = Array.from(transits.transitTimeDays).findIndex((t) => t > 13 && t < 14.2);
    expect(transits.pointCount[inGap]).toBe(0);
    expect(Number.isNaN(transits.depthPpm[inGap]!)).toBe(true);
    transits.pointCount.forEach((count, i) => {
      if (i === inGap) return;
      expect(count).toBeGreaterThanOrEqual(21);
      expect(Math.abs(transits.depthPpm[i]! - 4000)).toBeLessThan(4 * transits.depthErrPpm[i]!);
    });
    expect(stats.oddEvenDifferenceSigma!).toBeLessThan(3);
  });
});

describe('bad input', () => {
  const timeDays = Float64Array.from({ length: 20 }, (_, i) => i * 0.25);
  const flux = new Float64Array(20).fill(1);
  const fluxErr = new Float64Array(20).fill(1e-3);
  const options = {
    periodsDays: Float64Array.of(0.5, 1, 2),
    durationsDays: [0.1],
    objective: 'likelihood' as const,
  };

  it('when a duration is not shorter than the shortest period, throws naming durationsDays', () => {
    expect(() => boxLeastSquares(timeDays, flux, fluxErr, { ...options, durationsDays: [0.1, 0.8] })).toThrow(
      'durationsDays must be shorter than the minimum period (0.5 d), got 0.8',
    );
  });

  it('when arrays are empty or of different lengths, throws naming the array', () => {
    const empty = new Float64Array(0);
    expect(() => boxLeastSquares(empty, empty, empty, options)).toThrow(
      'timeDays must hold at least 2 points, got 0',
    );
    expect(() => boxLeastSquares(timeDays, flux.subarray(1), fluxErr, options)).toThrow(
      'flux must have as many values as timeDays (20), got 19',
    );
    expect(() => boxLeastSquares(timeDays, flux, fluxErr.subarray(2), options)).toThrow(
      'fluxErr must have as many values as timeDays (20), got 18',
    );
    expect(() => boxLeastSquares(timeDays, flux, fluxErr, { ...options, periodsDays: empty })).toThrow(
      'periodsDays must not be empty',
    );
    expect(() => boxLeastSquares(timeDays, flux, fluxErr, { ...options, durationsDays: [] })).toThrow(
      'durationsDays must not be empty',
    );
  });

  it('when a value is not finite or an error not positive, throws naming the array and the index', () => {
    const withNaN = Float64Array.from(flux);
    withNaN[7] = Number.NaN;
    expect(() => boxLeastSquares(timeDays, withNaN, fluxErr, options)).toThrow(
      'flux must be finite, got NaN at index 7',
    );
    const withInfinity = Float64Array.from(timeDays);
    withInfinity[3] = Number.POSITIVE_INFINITY;
    expect(() => boxLeastSquares(withInfinity, flux, fluxErr, options)).toThrow(
      'timeDays must be finite, got Infinity at index 3',
    );
    const withZero = Float64Array.from(fluxErr);
    withZero[4] = 0;
    expect(() => boxLeastSquares(timeDays, flux, withZero, options)).toThrow(
      'fluxErr must be positive and finite, got 0 at index 4',
    );
    expect(() =>
      boxLeastSquares(timeDays, flux, fluxErr, { ...options, periodsDays: Float64Array.of(1, -2) }),
    ).toThrow('periodsDays must all be positive, got -2');
    expect(() =>
      boxLeastSquares(timeDays, flux, fluxErr, { ...options, durationsDays: [Number.NaN] }),
    ).toThrow('durationsDays must all be positive and finite, got NaN');
  });

  it('when the objective or binsPerDuration is not allowed, throws naming it', () => {
    expect(() =>
      boxLeastSquares(timeDays, flux, fluxErr, { ...options, objective: 'chi2' as unknown as 'snr' }),
    ).toThrow("objective must be 'likelihood' or 'snr', got chi2");
    expect(() => boxLeastSquares(timeDays, flux, fluxErr, { ...options, binsPerDuration: 2.5 })).toThrow(
      'binsPerDuration must be an integer from 1 to 1000, got 2.5',
    );
  });

  it('throws ScienceInputError, the error the uploader sees', () => {
    expect(() => boxLeastSquares(timeDays, flux, fluxErr, { ...options, durationsDays: [3] })).toThrow(
      ScienceInputError,
    );
  });

  it('when blsStatistics gets a box that holds no point or a duration too long, throws naming it', () => {
    expect(() =>
      blsStatistics(timeDays, flux, fluxErr, { periodDays: 1, durationDays: 0.01, transitTimeDays: 0.1 }),
    ).toThrow(/no point lies inside the box/);
    expect(() =>
      blsStatistics(timeDays, flux, fluxErr, { periodDays: 1, durationDays: 1, transitTimeDays: 0 }),
    ).toThrow('durationDays must be shorter than periodDays (1 d), got 1');
    expect(() =>
      blsStatistics(timeDays, flux, fluxErr, { periodDays: 0, durationDays: 0.1, transitTimeDays: 0 }),
    ).toThrow('periodDays must be positive and finite, got 0');
    expect(() =>
      blsStatistics(timeDays, flux, fluxErr, {
        periodDays: 1,
        durationDays: 0.1,
        transitTimeDays: Number.NaN,
      }),
    ).toThrow('transitTimeDays must be finite, got NaN');
  });
});
