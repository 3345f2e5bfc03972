// Box least squares (BLS) period search: the periodogram, its best box, and the diagnostics of that
// box (odd/even depths, secondary eclipse, per-transit depths). Pure computation on typed arrays.
// The definitions follow astropy's BoxLeastSquares (astropy/timeseries/periodograms/bls), so its
// answers can be checked against astropy's (tests/fixtures/reference/, made by
// tests/reference/make_reference.py).

import { ScienceInputError } from './types';

/** Which quantity the search maximises over phase, duration and depth at each period. */
export type BlsObjective = 'likelihood' | 'snr';

export interface PeriodGridOptions {
  /** Time from the first to the last observation (days, > 0). */
  baselineDays: number;
  /** Shortest trial period (days, > 0). */
  minPeriodDays: number;
  /** Longest trial period (days, > minPeriodDays). */
  maxPeriodDays: number;
  /** Shortest trial transit duration (days, > 0); it sets the frequency step. */
  shortestDurationDays: number;
  /** Trial frequencies per astropy's default step (≥ 1 makes a finer grid; astropy's frequency_factor is 1/oversample). */
  oversample: number;
}

/** Periods beyond this many make a search that would never finish on the server. */
const MAX_GRID_PERIODS = 5_000_000;

/**
 * Trial periods for a BLS search, evenly spaced in frequency.
 *
 * The frequency step is df = shortestDurationDays / (oversample · baselineDays²): a transit of the
 * shortest duration drifts in phase by at most about one duration over the baseline between two
 * neighbouring trial frequencies.
 *
 * @param options.baselineDays time from the first to the last observation, days, > 0
 * @param options.minPeriodDays shortest period, days, > 0
 * @param options.maxPeriodDays longest period, days, > minPeriodDays
 * @param options.shortestDurationDays shortest trial duration, days, > 0
 * @param options.oversample grid points per astropy default frequency step, ≥ 1 (may be fractional)
 * @returns periods in days, ascending from minPeriodDays: 1 / (1/minPeriodDays − df·i), i = 0…n−1,
 *   n = 1 + round((1/minPeriodDays − 1/maxPeriodDays) / df); the last one is within df of 1/maxPeriodDays
 * @throws ScienceInputError naming the option when a value is not finite or out of range, or when
 *   the grid would hold more than 5,000,000 periods
 * @see Kovács, Zucker & Mazeh 2002, A&A 391, 369
 * @see astropy BoxLeastSquares.autoperiod (https://docs.astropy.org/en/stable/timeseries/bls.html)
 */
export function periodGrid(options: PeriodGridOptions): Float64Array {
  const { baselineDays, minPeriodDays, maxPeriodDays, shortestDurationDays, oversample } = options;
  requirePositive('baselineDays', baselineDays);
  requirePositive('minPeriodDays', minPeriodDays);
  requirePositive('maxPeriodDays', maxPeriodDays);
  requirePositive('shortestDurationDays', shortestDurationDays);
  if (!Number.isFinite(oversample) || oversample < 1) {
    throw new ScienceInputError(`oversample must be a finite number ≥ 1, got ${oversample}`);
  }
  if (!(maxPeriodDays > minPeriodDays)) {
    throw new ScienceInputError(
      `maxPeriodDays must be longer than minPeriodDays (${minPeriodDays} d), got ${maxPeriodDays}`,
    );
  }
  if (!(shortestDurationDays < minPeriodDays)) {
    throw new ScienceInputError(
      `shortestDurationDays must be shorter than minPeriodDays (${minPeriodDays} d), got ${shortestDurationDays}`,
    );
  }
  // astropy BoxLeastSquares.autoperiod: df = frequency_factor · min_duration / baseline².
  const stepPerDay = shortestDurationDays / (oversample * baselineDays * baselineDays);
  const maxFrequency = 1 / minPeriodDays;
  const minFrequency = 1 / maxPeriodDays;
  const count = 1 + Math.round((maxFrequency - minFrequency) / stepPerDay);
  if (count > MAX_GRID_PERIODS) {
    throw new ScienceInputError(
      `the period grid would hold ${count} periods, at most ${MAX_GRID_PERIODS} are allowed: raise minPeriodDays or shortestDurationDays, or lower maxPeriodDays or oversample`,
    );
  }
  const periodsDays = new Float64Array(count);
  for (let i = 0; i < count; i += 1) periodsDays[i] = 1 / (maxFrequency - stepPerDay * i);
  return periodsDays;
}

export interface BoxLeastSquaresOptions {
  /** Trial periods (days, each finite and > every duration); any order. */
  periodsDays: Float64Array;
  /** Trial transit durations (days, each > 0 and shorter than the shortest period). */
  durationsDays: readonly number[];
  /** 'likelihood' (astropy's default) maximises the log-likelihood; 'snr' the depth's SNR. */
  objective: BlsObjective;
  /** Phase bins per shortest duration (integer ≥ 1, default 10: astropy's `oversample`). */
  binsPerDuration?: number;
}

/** The best box at each trial period. Where no box dips below the rest, power is 0 and the others NaN. */
export interface BlsPeriodogram {
  periodsDays: Float64Array;
  /** The objective at its maximum: log-likelihood (dimensionless, with fluxErr) or depth SNR. */
  power: Float64Array;
  /** Best duration at each period (days; a whole number of phase bins, as astropy reports it). */
  durationDays: Float64Array;
  /** A mid-transit time of the best box (days, same time base as timeDays, in [timeDays min, + period)). */
  transitTimeDays: Float64Array;
  depthPpm: Float64Array;
  /** depth / depth error. */
  depthSnr: Float64Array;
}

/** The box with the highest power over the whole grid. */
export interface BlsBest {
  /** Index of this period in the grid. */
  index: number;
  periodDays: number;
  /** Mid-transit time (days, same time base as timeDays, in [timeDays min, timeDays min + period)). */
  transitTimeDays: number;
  durationDays: number;
  depthPpm: number;
  depthErrPpm: number;
  /** depthPpm / depthErrPpm. */
  depthSnr: number;
  /** Log-likelihood of the box model over a flat one (dimensionless, with fluxErr). */
  logLikelihood: number;
  /** The objective's value: logLikelihood or depthSnr. */
  power: number;
}

export interface BoxLeastSquaresResult {
  objective: BlsObjective;
  /** Width of one phase bin: the shortest duration / binsPerDuration (days). */
  binDurationDays: number;
  periodogram: BlsPeriodogram;
  /** Null when no period has a box deeper than the rest (flat or rising data). */
  best: BlsBest | null;
}

/**
 * Box least squares periodogram: at each trial period, the box (duration, phase, depth) that best
 * fits the folded light curve, each point weighted by 1/fluxErr².
 *
 * Each period is folded into phase bins of width shortest duration / binsPerDuration; the box starts
 * at every bin edge and spans round(duration / bin width) bins, wrapping around phase 0 (as astropy's
 * `bls_fast`: bin in phase, then slide the box over cumulative sums). In-transit mean y_in and
 * out-of-transit mean y_out are weighted means; depth = y_out − y_in (only boxes with depth > 0
 * count); its error is √(1/Σw_in + 1/Σw_out); the log-likelihood is ½·Σw_in·depth².
 *
 * Differences from astropy 5.2.1: a box of any duration may wrap around phase 0 (astropy pads only
 * `oversample` bins, so its longer boxes never straddle phase 0); transit times are given in
 * [min time, min time + period) rather than modulo the period from time 0.
 *
 * @param timeDays observation times, days, finite, any order (length n ≥ 2)
 * @param flux relative flux (median ≈ 1), finite, length n
 * @param fluxErr relative flux errors, finite and > 0, length n
 * @param options.periodsDays trial periods, days, finite, each longer than the longest duration
 * @param options.durationsDays trial durations, days, finite, > 0
 * @param options.objective 'likelihood' or 'snr'
 * @param options.binsPerDuration phase bins per shortest duration, integer 1…1000, default 10
 * @returns the periodogram (best box at each period) and the best box overall (null when none dips)
 * @throws ScienceInputError naming the argument: empty or mismatched arrays, non-finite values,
 *   fluxErr ≤ 0, durations not shorter than the shortest period, a bad objective or binsPerDuration
 * @see Kovács, Zucker & Mazeh 2002, A&A 391, 369
 * @see astropy BoxLeastSquares, objective='likelihood' (https://docs.astropy.org/en/stable/timeseries/bls.html)
 */
export function boxLeastSquares(
  timeDays: Float64Array,
  flux: Float64Array,
  fluxErr: Float64Array,
  options: BoxLeastSquaresOptions,
): BoxLeastSquaresResult {
  validateSeries(timeDays, flux, fluxErr);
  const { periodsDays, durationsDays, objective } = options;
  const binsPerDuration = options.binsPerDuration ?? 10;
  if (objective !== 'likelihood' && objective !== 'snr') {
    throw new ScienceInputError(`objective must be 'likelihood' or 'snr', got ${String(objective)}`);
  }
  if (!Number.isInteger(binsPerDuration) || binsPerDuration < 1 || binsPerDuration > 1000) {
    throw new ScienceInputError(`binsPerDuration must be an integer from 1 to 1000, got ${binsPerDuration}`);
  }
  requireFiniteArray('periodsDays', periodsDays);
  if (durationsDays.length === 0) throw new ScienceInputError('durationsDays must not be empty');
  let minPeriod = Number.POSITIVE_INFINITY;
  let maxPeriod = 0;
  for (const period of periodsDays) {
    if (!(period > 0)) throw new ScienceInputError(`periodsDays must all be positive, got ${period}`);
    minPeriod = Math.min(minPeriod, period);
    maxPeriod = Math.max(maxPeriod, period);
  }
  let minDuration = Number.POSITIVE_INFINITY;
  let maxDuration = 0;
  for (const duration of durationsDays) {
    if (!Number.isFinite(duration) || !(duration > 0)) {
      throw new ScienceInputError(`durationsDays must all be positive and finite, got ${duration}`);
    }
    minDuration = Math.min(minDuration, duration);
    maxDuration = Math.max(maxDuration, duration);
  }
  if (!(maxDuration < minPeriod)) {
    throw new ScienceInputError(
      `durationsDays must be shorter than the minimum period (${minPeriod} d), got ${maxDuration}`,
    );
  }

  const n = timeDays.length;
  const binDays = minDuration / binsPerDuration;
  const order = sortedOrder(timeDays);
  const tMin = timeDays[order[0]!]!;
  // Weighted mean flux, subtracted so that the sums stay small (depths are differences: unaffected).
  let sumWeight = 0;
  let sumWeightedFlux = 0;
  for (let i = 0; i < n; i += 1) {
    const weight = 1 / (fluxErr[i]! * fluxErr[i]!);
    sumWeight += weight;
    sumWeightedFlux += weight * flux[i]!;
  }
  const meanFlux = sumWeightedFlux / sumWeight;

  // Times from the first one in units of phase bins, in time order, with +∞ after the end so loops
  // need no length checks; weights and weighted fluxes interleaved, (w, w·y) per point.
  const x = new Float64Array(n + 4).fill(Number.POSITIVE_INFINITY);
  const weighted = new Float64Array(2 * n + 8);
  let sumW = 0;
  let sumWy = 0;
  for (let j = 0; j < n; j += 1) {
    const i = order[j]!;
    const weight = 1 / (fluxErr[i]! * fluxErr[i]!);
    x[j] = (timeDays[i]! - tMin) / binDays;
    weighted[2 * j] = weight;
    weighted[2 * j + 1] = weight * (flux[i]! - meanFlux);
    sumW += weight;
    sumWy += weight * (flux[i]! - meanFlux);
  }

  const durationBins = new Int32Array(durationsDays.length);
  for (let d = 0; d < durationsDays.length; d += 1) {
    durationBins[d] = Math.max(1, Math.round(durationsDays[d]! / binDays));
  }
  const maxDurationBins = Math.max(...durationBins);

  const periodCount = periodsDays.length;
  const periodogram: BlsPeriodogram = {
    periodsDays: Float64Array.from(periodsDays),
    power: new Float64Array(periodCount),
    durationDays: new Float64Array(periodCount).fill(Number.NaN),
    transitTimeDays: new Float64Array(periodCount).fill(Number.NaN),
    depthPpm: new Float64Array(periodCount).fill(Number.NaN),
    depthSnr: new Float64Array(periodCount).fill(Number.NaN),
  };
  const depthErrPpm = new Float64Array(periodCount).fill(Number.NaN);
  const logLikelihood = new Float64Array(periodCount).fill(Number.NaN);

  const maxBins = Math.ceil(maxPeriod / binDays) + 1;
  const search: FoldSearch = {
    x,
    weighted,
    n,
    sumW,
    sumWy,
    binDays,
    durationBins,
    maxDurationBins,
    useSnr: objective === 'snr',
    // Four interleaved accumulators per bin (w and w·y each), so that neighbouring points, which
    // usually share a bin, do not wait on each other's additions.
    accumulators: new Float64Array(8 * (maxBins + 1)),
    cumulative: new Float64Array(2 * (maxBins + maxDurationBins + 2)),
  };
  for (let p = 0; p < periodCount; p += 1) {
    const periodDays = periodsDays[p]!;
    const box = bestBoxAtPeriod(search, periodDays);
    if (box === null) continue;
    const { inWeight, inWeightedFlux, startBin, durationIndex } = box;
    const outWeight = sumW - inWeight;
    // astropy bls.c compute_objective: depth = y_out − y_in, error √(1/Σw_in + 1/Σw_out).
    const depth = (sumWy - inWeightedFlux) / outWeight - inWeightedFlux / inWeight;
    const depthErr = Math.sqrt(1 / inWeight + 1 / outWeight);
    // astropy bls.c compute_objective: log-likelihood = ½·Σw_in·depth².
    const ll = 0.5 * inWeight * depth * depth;
    const durationDays = durationBins[durationIndex]! * binDays;
    let phaseDays = startBin * binDays + 0.5 * durationDays;
    if (phaseDays >= periodDays) phaseDays -= periodDays;
    periodogram.power[p] = objective === 'likelihood' ? ll : depth / depthErr;
    periodogram.durationDays[p] = durationDays;
    periodogram.transitTimeDays[p] = tMin + phaseDays;
    periodogram.depthPpm[p] = depth * 1e6;
    periodogram.depthSnr[p] = depth / depthErr;
    depthErrPpm[p] = depthErr * 1e6;
    logLikelihood[p] = ll;
  }

  let bestIndex = -1;
  for (let p = 0; p < periodCount; p += 1) {
    if (Number.isNaN(periodogram.depthPpm[p]!)) continue;
    if (bestIndex < 0 || periodogram.power[p]! > periodogram.power[bestIndex]!) bestIndex = p;
  }
  const best: BlsBest | null =
    bestIndex < 0
      ? null
      : {
          index: bestIndex,
          periodDays: periodogram.periodsDays[bestIndex]!,
          transitTimeDays: periodogram.transitTimeDays[bestIndex]!,
          durationDays: periodogram.durationDays[bestIndex]!,
          depthPpm: periodogram.depthPpm[bestIndex]!,
          depthErrPpm: depthErrPpm[bestIndex]!,
          depthSnr: periodogram.depthSnr[bestIndex]!,
          logLikelihood: logLikelihood[bestIndex]!,
          power: periodogram.power[bestIndex]!,
        };
  return { objective, binDurationDays: binDays, periodogram, best };
}

interface FoldSearch {
  /** Times since the first in phase bins ((t − t_min) / bin width), ascending, then four +∞. */
  x: Float64Array;
  /** (w, w·y) per point, time order, y relative to the weighted mean. */
  weighted: Float64Array;
  n: number;
  sumW: number;
  sumWy: number;
  binDays: number;
  durationBins: Int32Array;
  maxDurationBins: number;
  useSnr: boolean;
  accumulators: Float64Array;
  cumulative: Float64Array;
}

interface BestBox {
  inWeight: number;
  inWeightedFlux: number;
  startBin: number;
  durationIndex: number;
}

// One period: fold the points into phase bins, then slide each duration's box along the bins.
function bestBoxAtPeriod(search: FoldSearch, periodDays: number): BestBox | null {
  const { x, weighted: wy, n, sumW, sumWy, binDays, durationBins, accumulators: acc, cumulative } = search;
  // Work in units of one phase bin: a point at x = t − t_min lies x / bin bins from the first.
  const periodBins = periodDays / binDays;
  const binCount = Math.ceil(periodBins);
  acc.fill(0, 0, 8 * (binCount + 1));

  // Walk the cycles in time order: a point in cycle c has phase x − c·P (astropy bls.c wraps with
  // x − P·floor(x/P); walking the sorted times avoids the division per point).
  let i = 0;
  let cycle = 0;
  while (i < n) {
    let base = cycle * periodBins;
    let end = (cycle + 1) * periodBins;
    if (x[i]! >= end) {
      // Skip empty cycles (gaps) in one step.
      cycle = Math.floor(x[i]! / periodBins);
      while (cycle * periodBins > x[i]!) cycle -= 1;
      while ((cycle + 1) * periodBins <= x[i]!) cycle += 1;
      base = cycle * periodBins;
      end = (cycle + 1) * periodBins;
    }
    while (x[i + 3]! < end) {
      let k = 8 * ((x[i]! - base) | 0);
      acc[k]! += wy[2 * i]!;
      acc[k + 1]! += wy[2 * i + 1]!;
      k = 8 * ((x[i + 1]! - base) | 0);
      acc[k + 2]! += wy[2 * i + 2]!;
      acc[k + 3]! += wy[2 * i + 3]!;
      k = 8 * ((x[i + 2]! - base) | 0);
      acc[k + 4]! += wy[2 * i + 4]!;
      acc[k + 5]! += wy[2 * i + 5]!;
      k = 8 * ((x[i + 3]! - base) | 0);
      acc[k + 6]! += wy[2 * i + 6]!;
      acc[k + 7]! += wy[2 * i + 7]!;
      i += 4;
    }
    while (x[i]! < end) {
      const k = 8 * ((x[i]! - base) | 0);
      acc[k]! += wy[2 * i]!;
      acc[k + 1]! += wy[2 * i + 1]!;
      i += 1;
    }
    cycle += 1;
  }

  // A phase that rounds up to the period itself belongs to the last bin.
  const last = 8 * binCount;
  for (let j = 0; j < 8; j += 1) {
    acc[last - 8 + j]! += acc[last + j]!;
  }

  // Cumulative sums of (w, w·y) over the bins, continued past the end by the first bins again so a
  // box may wrap around phase 0 (astropy bls.c pads with the first `oversample` bins).
  const pad = Math.min(search.maxDurationBins, binCount);
  cumulative[0] = 0;
  cumulative[1] = 0;
  let cw = 0;
  let cy = 0;
  for (let k = 0; k < binCount + pad; k += 1) {
    const b = 8 * (k < binCount ? k : k - binCount);
    cw += acc[b]! + acc[b + 2]! + acc[b + 4]! + acc[b + 6]!;
    cy += acc[b + 1]! + acc[b + 3]! + acc[b + 5]! + acc[b + 7]!;
    cumulative[2 * k + 2] = cw;
    cumulative[2 * k + 3] = cy;
  }

  const minOutWeight = sumW * 1e-12;
  let bestObjective = 0;
  let bestStart = -1;
  let bestDuration = -1;
  let bestInWeight = 0;
  let bestInWeightedFlux = 0;
  for (let d = 0; d < durationBins.length; d += 1) {
    const span = durationBins[d]!;
    if (span > pad) continue; // a box covering the whole phase has nothing outside it
    for (let k = 0; k < binCount; k += 1) {
      const inWeight = cumulative[2 * (k + span)]! - cumulative[2 * k]!;
      const inWeightedFlux = cumulative[2 * (k + span) + 1]! - cumulative[2 * k + 1]!;
      const outWeight = sumW - inWeight;
      // depth·Σw_in·Σw_out = y_out·Σw_in − y_in·Σw_out in sums: positive when the box dips.
      const numerator = (sumWy - inWeightedFlux) * inWeight - inWeightedFlux * outWeight;
      if (!(numerator > 0) || !(outWeight > minOutWeight)) continue;
      // 2·log-likelihood = Σw_in·depth², or SNR² = depth² / (1/Σw_in + 1/Σw_out).
      const objective = search.useSnr
        ? (numerator * numerator) / (inWeight * outWeight * (inWeight + outWeight))
        : (numerator * numerator) / (inWeight * outWeight * outWeight);
      if (objective > bestObjective) {
        bestObjective = objective;
        bestStart = k;
        bestDuration = d;
        bestInWeight = inWeight;
        bestInWeightedFlux = inWeightedFlux;
      }
    }
  }
  if (bestStart < 0) return null;
  return {
    inWeight: bestInWeight,
    inWeightedFlux: bestInWeightedFlux,
    startBin: bestStart,
    durationIndex: bestDuration,
  };
}

/** A depth with its 1σ error, both in ppm of the relative flux. */
export interface DepthEstimate {
  depthPpm: number;
  depthErrPpm: number;
}

export interface BlsStatisticsOptions {
  periodDays: number;
  durationDays: number;
  /** A mid-transit time (days, same time base as timeDays). */
  transitTimeDays: number;
}

export interface BlsTransits {
  /** Mid-transit times from the first to the last transit with points in it (days). */
  transitTimeDays: Float64Array;
  /** Points inside each transit's box (0 where it fell in a gap). */
  pointCount: Int32Array;
  /** Each transit's share of the log-likelihood (0 where it has no points). */
  logLikelihood: Float64Array;
  /** Each transit's depth against the global out-of-transit mean (NaN where it has no points). */
  depthPpm: Float64Array;
  depthErrPpm: Float64Array;
}

export interface BlsStatistics {
  /** The box at the given period, against all out-of-box points. */
  depth: DepthEstimate | null;
  /** Transits an odd number of periods from transitTimeDays (a model at twice the period). */
  depthOdd: DepthEstimate | null;
  /** Transits an even number of periods from transitTimeDays, including it (the other double-period model). */
  depthEven: DepthEstimate | null;
  /** |odd − even| / √(σ_odd² + σ_even²): how many σ the odd and even depths differ; null without both. */
  oddEvenDifferenceSigma: number | null;
  /** A box at half the period (every half period from transitTimeDays) against all other points. */
  depthHalfPeriod: DepthEstimate | null;
  /** A box at phase 0.5 (secondary eclipse) against points outside both boxes. */
  depthSecondary: DepthEstimate | null;
  /** Amplitude of the best sinusoid at the period (ppm). */
  harmonicAmplitudePpm: number;
  /** Log-likelihood of that sinusoid minus the box model's: > 0 means the sinusoid fits better. */
  harmonicDeltaLogLikelihood: number;
  transits: BlsTransits;
}

/**
 * Diagnostics of one box model, as astropy's `BoxLeastSquares.compute_stats`: odd and even transit
 * depths and how many σ they differ by (eclipsing binaries at twice the period differ), the depth of
 * a box at phase 0.5 (a secondary eclipse), the depth of a box at half the period, a sinusoid's fit
 * against the box's, and each transit's time, point count, log-likelihood and depth. A point is in a
 * box when its distance from the box's centre is less than half the duration.
 *
 * @param timeDays observation times, days, finite (length n ≥ 2)
 * @param flux relative flux (median ≈ 1), finite, length n
 * @param fluxErr relative flux errors, finite and > 0, length n
 * @param options.periodDays period, days, > durationDays
 * @param options.durationDays transit duration, days, > 0
 * @param options.transitTimeDays a mid-transit time, days, finite
 * @returns depths in ppm with 1σ errors (null where a box holds no points, or nothing lies outside),
 *   the odd/even difference in σ, the harmonic comparison and per-transit arrays
 * @throws ScienceInputError naming the argument: empty or mismatched arrays, non-finite values,
 *   fluxErr ≤ 0, a non-positive period or duration, a duration not shorter than the period, or no
 *   point inside the box
 * @see Kovács, Zucker & Mazeh 2002, A&A 391, 369
 * @see astropy BoxLeastSquares.compute_stats (https://docs.astropy.org/en/stable/timeseries/bls.html)
 * @see Thompson et al. 2018, ApJS 235, 38 (odd/even depth test of Kepler's Robovetter)
 */
export function blsStatistics(
  timeDays: Float64Array,
  flux: Float64Array,
  fluxErr: Float64Array,
  options: BlsStatisticsOptions,
): BlsStatistics {
  validateSeries(timeDays, flux, fluxErr);
  const { periodDays, durationDays, transitTimeDays } = options;
  requirePositive('periodDays', periodDays);
  requirePositive('durationDays', durationDays);
  if (!Number.isFinite(transitTimeDays)) {
    throw new ScienceInputError(`transitTimeDays must be finite, got ${transitTimeDays}`);
  }
  if (!(durationDays < periodDays)) {
    throw new ScienceInputError(
      `durationDays must be shorter than periodDays (${periodDays} d), got ${durationDays}`,
    );
  }
  const n = timeDays.length;
  const halfDuration = 0.5 * durationDays;
  const halfPeriod = 0.5 * periodDays;
  const weight = new Float64Array(n);
  const inBox = new Uint8Array(n);
  const odd = new Uint8Array(n);
  const even = new Uint8Array(n);
  const secondary = new Uint8Array(n);
  const halfPeriodBox = new Uint8Array(n);
  let inCount = 0;
  for (let i = 0; i < n; i += 1) {
    weight[i] = 1 / (fluxErr[i]! * fluxErr[i]!);
    const dt = timeDays[i]! - transitTimeDays;
    // The masks of astropy's compute_stats, with Python's floored modulo.
    inBox[i] = Math.abs(floorMod(dt + halfPeriod, periodDays) - halfPeriod) < halfDuration ? 1 : 0;
    odd[i] = Math.abs(floorMod(dt, 2 * periodDays) - periodDays) < halfDuration ? 1 : 0;
    even[i] = Math.abs(floorMod(dt + periodDays, 2 * periodDays) - periodDays) < halfDuration ? 1 : 0;
    secondary[i] = Math.abs(floorMod(dt, periodDays) - halfPeriod) < halfDuration ? 1 : 0;
    halfPeriodBox[i] =
      Math.abs(floorMod(dt + 0.25 * periodDays, halfPeriod) - 0.25 * periodDays) < halfDuration ? 1 : 0;
    inCount += inBox[i]!;
  }
  if (inCount === 0) {
    throw new ScienceInputError(
      `no point lies inside the box (periodDays ${periodDays}, durationDays ${durationDays}, transitTimeDays ${transitTimeDays})`,
    );
  }

  const outside = weightedMean(flux, weight, (i) => inBox[i] === 0);
  const inside = weightedMean(flux, weight, (i) => inBox[i] === 1);
  const depth = depthAgainst(inside, outside);
  const depthOdd = depthAgainst(
    weightedMean(flux, weight, (i) => odd[i] === 1),
    outside,
  );
  const depthEven = depthAgainst(
    weightedMean(flux, weight, (i) => even[i] === 1),
    outside,
  );
  const depthSecondary = depthAgainst(
    weightedMean(flux, weight, (i) => secondary[i] === 1),
    weightedMean(flux, weight, (i) => secondary[i] === 0 && inBox[i] === 0),
  );
  const depthHalfPeriod = depthAgainst(
    weightedMean(flux, weight, (i) => halfPeriodBox[i] === 1),
    weightedMean(flux, weight, (i) => halfPeriodBox[i] === 0),
  );
  const oddEvenDifferenceSigma =
    depthOdd && depthEven
      ? // Odd/even test: difference over its error, errors in quadrature (Thompson et al. 2018).
        Math.abs(depthOdd.depthPpm - depthEven.depthPpm) /
        Math.hypot(depthOdd.depthErrPpm, depthEven.depthErrPpm)
      : null;

  // Per transit: astropy compute_stats numbers transits by round((t − t0) / P).
  const yIn = inside!.mean;
  const yOut = outside?.mean ?? yIn;
  let firstId = Number.POSITIVE_INFINITY;
  let lastId = Number.NEGATIVE_INFINITY;
  for (let i = 0; i < n; i += 1) {
    if (inBox[i] === 0) continue;
    const id = Math.round((timeDays[i]! - transitTimeDays) / periodDays);
    firstId = Math.min(firstId, id);
    lastId = Math.max(lastId, id);
  }
  const transitCount = lastId - firstId + 1;
  const transits: BlsTransits = {
    transitTimeDays: new Float64Array(transitCount),
    pointCount: new Int32Array(transitCount),
    logLikelihood: new Float64Array(transitCount),
    depthPpm: new Float64Array(transitCount).fill(Number.NaN),
    depthErrPpm: new Float64Array(transitCount).fill(Number.NaN),
  };
  const transitWeight = new Float64Array(transitCount);
  const transitWeightedFlux = new Float64Array(transitCount);
  let boxLogLikelihood = 0;
  for (let i = 0; i < n; i += 1) {
    const residualOut = flux[i]! - yOut;
    if (inBox[i] === 0) {
      boxLogLikelihood -= 0.5 * weight[i]! * residualOut * residualOut;
      continue;
    }
    const residualIn = flux[i]! - yIn;
    boxLogLikelihood -= 0.5 * weight[i]! * residualIn * residualIn;
    const t = Math.round((timeDays[i]! - transitTimeDays) / periodDays) - firstId;
    transits.pointCount[t]! += 1;
    // astropy compute_stats: per-transit log-likelihood −½·w·((y − y_in)² − (y − y_out)²).
    transits.logLikelihood[t]! += -0.5 * weight[i]! * (residualIn * residualIn - residualOut * residualOut);
    transitWeight[t]! += weight[i]!;
    transitWeightedFlux[t]! += weight[i]! * flux[i]!;
  }
  for (let t = 0; t < transitCount; t += 1) {
    transits.transitTimeDays[t] = transitTimeDays + periodDays * (firstId + t);
    if (transits.pointCount[t] === 0 || !outside) continue;
    // Same depth estimate as the whole box, with this transit's points only.
    transits.depthPpm[t] = (yOut - transitWeightedFlux[t]! / transitWeight[t]!) * 1e6;
    transits.depthErrPpm[t] = Math.sqrt(1 / transitWeight[t]! + outside.variance) * 1e6;
  }

  const harmonic = fitSinusoid(timeDays, flux, weight, periodDays);
  return {
    depth,
    depthOdd,
    depthEven,
    oddEvenDifferenceSigma,
    depthHalfPeriod,
    depthSecondary,
    harmonicAmplitudePpm: harmonic.amplitude * 1e6,
    harmonicDeltaLogLikelihood: harmonic.logLikelihood - boxLogLikelihood,
    transits,
  };
}

interface WeightedMean {
  mean: number;
  /** 1 / Σw: the variance of the mean. */
  variance: number;
}

function weightedMean(
  flux: Float64Array,
  weight: Float64Array,
  include: (i: number) => boolean,
): WeightedMean | null {
  let sumW = 0;
  let sumWy = 0;
  for (let i = 0; i < flux.length; i += 1) {
    if (!include(i)) continue;
    sumW += weight[i]!;
    sumWy += weight[i]! * flux[i]!;
  }
  return sumW > 0 ? { mean: sumWy / sumW, variance: 1 / sumW } : null;
}

// astropy compute_stats _compute_depth: depth = y_out − y_m, error √(var_m + var_out).
function depthAgainst(box: WeightedMean | null, reference: WeightedMean | null): DepthEstimate | null {
  if (!box || !reference) return null;
  return {
    depthPpm: (reference.mean - box.mean) * 1e6,
    depthErrPpm: Math.sqrt(box.variance + reference.variance) * 1e6,
  };
}

// Weighted least squares of y = a·sin(2πt/P) + b·cos(2πt/P) + c (astropy compute_stats' harmonic model).
function fitSinusoid(
  timeDays: Float64Array,
  flux: Float64Array,
  weight: Float64Array,
  periodDays: number,
): { amplitude: number; logLikelihood: number } {
  const normal = [0, 0, 0, 0, 0, 0, 0, 0, 0];
  const rhs = [0, 0, 0];
  const omega = (2 * Math.PI) / periodDays;
  for (let i = 0; i < timeDays.length; i += 1) {
    const row = [Math.sin(omega * timeDays[i]!), Math.cos(omega * timeDays[i]!), 1];
    for (let a = 0; a < 3; a += 1) {
      rhs[a]! += row[a]! * weight[i]! * flux[i]!;
      for (let b = 0; b < 3; b += 1) normal[3 * a + b]! += row[a]! * weight[i]! * row[b]!;
    }
  }
  const [s, c, k] = solve3(normal, rhs);
  let logLikelihood = 0;
  for (let i = 0; i < timeDays.length; i += 1) {
    const residual = flux[i]! - (s * Math.sin(omega * timeDays[i]!) + c * Math.cos(omega * timeDays[i]!) + k);
    logLikelihood -= 0.5 * weight[i]! * residual * residual;
  }
  return { amplitude: Math.hypot(s, c), logLikelihood };
}

// Cramer's rule for a 3×3 system (row-major matrix).
function solve3(m: number[], v: number[]): [number, number, number] {
  const det = (a: number[]) =>
    a[0]! * (a[4]! * a[8]! - a[5]! * a[7]!) -
    a[1]! * (a[3]! * a[8]! - a[5]! * a[6]!) +
    a[2]! * (a[3]! * a[7]! - a[4]! * a[6]!);
  const whole = det(m);
  const column = (j: number) =>
    m.map((value, index) => (index % 3 === j ? v[Math.floor(index / 3)]! : value));
  return [det(column(0)) / whole, det(column(1)) / whole, det(column(2)) / whole];
}

// Python's a % b (the sign of b), which astropy's masks rely on.
function floorMod(a: number, b: number): number {
  return a - b * Math.floor(a / b);
}

function sortedOrder(timeDays: Float64Array): Int32Array {
  const order = new Int32Array(timeDays.length);
  for (let i = 0; i < order.length; i += 1) order[i] = i;
  let sorted = true;
  for (let i = 1; i < timeDays.length && sorted; i += 1) sorted = timeDays[i]! >= timeDays[i - 1]!;
  if (!sorted) order.sort((a, b) => timeDays[a]! - timeDays[b]! || a - b);
  return order;
}

function validateSeries(timeDays: Float64Array, flux: Float64Array, fluxErr: Float64Array): void {
  if (timeDays.length < 2) {
    throw new ScienceInputError(`timeDays must hold at least 2 points, got ${timeDays.length}`);
  }
  if (flux.length !== timeDays.length) {
    throw new ScienceInputError(
      `flux must have as many values as timeDays (${timeDays.length}), got ${flux.length}`,
    );
  }
  if (fluxErr.length !== timeDays.length) {
    throw new ScienceInputError(
      `fluxErr must have as many values as timeDays (${timeDays.length}), got ${fluxErr.length}`,
    );
  }
  requireFiniteArray('timeDays', timeDays);
  requireFiniteArray('flux', flux);
  for (let i = 0; i < fluxErr.length; i += 1) {
    const value = fluxErr[i]!;
    if (!Number.isFinite(value) || !(value > 0)) {
      throw new ScienceInputError(`fluxErr must be positive and finite, got ${value} at index ${i}`);
    }
  }
}

function requireFiniteArray(name: string, values: Float64Array): void {
  if (values.length === 0) throw new ScienceInputError(`${name} must not be empty`);
  for (let i = 0; i < values.length; i += 1) {
    if (!Number.isFinite(values[i]!)) {
      throw new ScienceInputError(`${name} must be finite, got ${values[i]} at index ${i}`);
    }
  }
}

function requirePositive(name: string, value: number): void {
  if (!Number.isFinite(value) || !(value > 0)) {
    throw new ScienceInputError(`${name} must be positive and finite, got ${value}`);
  }
}
