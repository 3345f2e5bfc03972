// A dip's time, depth and duration, measured on the light curve around the volunteers' mark: one box
// fitted by least squares over a small grid of durations and centres.

import { median, robustSigma } from '../statistics';
import { ScienceInputError } from '../types';

export interface DipSeries {
  /** Sorted ascending, days. */
  timeDays: Float64Array;
  /** Relative flux (median about 1). */
  flux: Float64Array;
  /** Relative flux error; the points are weighted 1/σ² when given. */
  fluxErr?: Float64Array | null;
}

export interface MeasureDipOptions {
  /** The longest box tried (hours, > 0). */
  maxDurationHours: number;
  /** The shortest box tried (hours, in (0, maxDurationHours]). Default maxDurationHours / 8. */
  minDurationHours?: number;
  /** How many durations, spaced evenly in log from the shortest to the longest. Default 10. */
  durationCount?: number;
  /** A box needs at least this many points inside. Default 3. */
  minPointsInDip?: number;
  /** And at least this many outside it, within the window around the mark. Default 10. */
  minPointsOutside?: number;
}

export interface DipMeasurement {
  /** Centre of the best box (days, same time system as the series). */
  timeCenterDays: number;
  /** (out-of-box median − in-box mean) / out-of-box median, in ppm (> 0 for a dip). */
  depthPpm: number;
  /**
   * The depth's 1σ error from the point scatter, relative to the baseline, in ppm: σ·√(1/n_in + (π/2)/n_out),
   * the in-box mean's error and the out-of-box median's (whose variance is π/2 times a mean's).
   */
  depthErrPpm: number;
  durationHours: number;
  /** depth / σ · √n_in, with σ the robust scatter (1.4826 × MAD) of the out-of-box points. */
  snr: number;
  /** Points inside the box. */
  pointsInDip: number;
}

interface Settings {
  minHours: number;
  maxHours: number;
  count: number;
  minIn: number;
  minOut: number;
}

function settingsOf(options: MeasureDipOptions): Settings {
  const maxHours = options.maxDurationHours;
  if (!(maxHours > 0 && Number.isFinite(maxHours))) {
    throw new ScienceInputError(`options.maxDurationHours must be a finite number > 0, got ${maxHours}`);
  }
  const minHours = options.minDurationHours ?? maxHours / 8;
  if (!(minHours > 0 && minHours <= maxHours)) {
    throw new ScienceInputError(
      `options.minDurationHours must be in (0, maxDurationHours (${maxHours})], got ${minHours}`,
    );
  }
  const count = options.durationCount ?? 10;
  if (!(Number.isInteger(count) && count >= 1 && count <= 200)) {
    throw new ScienceInputError(`options.durationCount must be an integer in [1, 200], got ${count}`);
  }
  const minIn = options.minPointsInDip ?? 3;
  if (!(Number.isInteger(minIn) && minIn >= 1)) {
    throw new ScienceInputError(`options.minPointsInDip must be an integer ≥ 1, got ${minIn}`);
  }
  const minOut = options.minPointsOutside ?? 10;
  if (!(Number.isInteger(minOut) && minOut >= 2)) {
    throw new ScienceInputError(`options.minPointsOutside must be an integer ≥ 2, got ${minOut}`);
  }
  return { minHours, maxHours, count, minIn, minOut };
}

/** The durations measureDip tries (hours, ascending): `durationCount` evenly spaced in log. */
export function dipDurationGridHours(options: MeasureDipOptions): Float64Array {
  const { minHours, maxHours, count } = settingsOf(options);
  if (count === 1 || minHours === maxHours) return Float64Array.of(maxHours);
  const ratio = Math.log(maxHours / minHours) / (count - 1);
  return Float64Array.from({ length: count }, (_, k) =>
    k === count - 1 ? maxHours : minHours * Math.exp(ratio * k),
  );
}

/** The first index in [from, to) whose time is ≥ value (binary search on sorted times). */
function lowerBound(times: Float64Array, value: number, from: number, to: number): number {
  let lo = from;
  let hi = to;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (times[mid]! < value) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Measures a dip near a volunteer's mark by single-event box least squares. Within the window
 * mark ± 2.5 × the longest duration, for each duration d on `dipDurationGridHours`, a box [tₖ, tₖ + d)
 * starts at every data point tₖ whose box centre lies within ± d of the mark, and is scored by the χ² it
 * removes, (mean_out − mean_in)² · W_in · W_out / W (weights 1/σ² or 1), among boxes whose mean lies
 * below the rest. The best box's depth is measured against the median of the window's points outside
 * it; its time is the midpoint of its first and last points.
 *
 * @param series - the snippet's light curve (times sorted ascending; non-finite points are skipped).
 * @param centerDays - the mark (days): the reliability-weighted centre of the volunteers' marks.
 * @returns the best box, or null when the window has too few points (`minPointsInDip` inside a box,
 *   `minPointsOutside` around it) or no box lies below the rest.
 * @throws ScienceInputError when the series' arrays differ in length or an option is out of range.
 * @see Kovács, Zucker & Mazeh 2002, A&A 391, 369 (box least squares; here one event, not folded)
 */
export function measureDip(
  series: DipSeries,
  centerDays: number,
  options: MeasureDipOptions,
): DipMeasurement | null {
  const settings = settingsOf(options);
  const { timeDays, flux, fluxErr } = series;
  if (flux.length !== timeDays.length || (fluxErr && fluxErr.length !== timeDays.length)) {
    throw new ScienceInputError(
      `series.timeDays, flux and fluxErr must have the same length, got ${timeDays.length}, ${flux.length}` +
        ` and ${fluxErr ? fluxErr.length : 'none'}`,
    );
  }
  if (!Number.isFinite(centerDays))
    throw new ScienceInputError(`centerDays must be finite, got ${centerDays}`);
  const maxDays = settings.maxHours / 24;
  const start = lowerBound(timeDays, centerDays - 2.5 * maxDays, 0, timeDays.length);
  const end = lowerBound(timeDays, centerDays + 2.5 * maxDays, start, timeDays.length);

  // The window's finite points, their weights and running sums.
  const times = new Float64Array(end - start);
  const values = new Float64Array(end - start);
  const cumWeight = new Float64Array(end - start + 1);
  const cumWeighted = new Float64Array(end - start + 1);
  let n = 0;
  for (let i = start; i < end; i += 1) {
    const value = flux[i]!;
    const err = fluxErr ? fluxErr[i]! : 1;
    if (!(Number.isFinite(value) && Number.isFinite(timeDays[i]!) && err > 0 && Number.isFinite(err)))
      continue;
    const weight = fluxErr ? 1 / (err * err) : 1;
    times[n] = timeDays[i]!;
    values[n] = value;
    cumWeight[n + 1] = cumWeight[n]! + weight;
    cumWeighted[n + 1] = cumWeighted[n]! + weight * value;
    n += 1;
  }
  if (n < settings.minIn + settings.minOut) return null;
  const totalWeight = cumWeight[n]!;
  const totalWeighted = cumWeighted[n]!;

  // Every box starts at a data point, so that its edges fall between samples as a real dip's do.
  let best: { from: number; to: number; centerDays: number; durationDays: number; meanIn: number } | null =
    null;
  let bestPower = 0;
  for (const hours of dipDurationGridHours(options)) {
    const durationDays = hours / 24;
    const firstStart = lowerBound(times, centerDays - 1.5 * durationDays, 0, n);
    const lastStart = lowerBound(times, centerDays + 0.5 * durationDays, firstStart, n);
    let to = firstStart;
    for (let from = firstStart; from < lastStart; from += 1) {
      const endDays = times[from]! + durationDays;
      if (to < from) to = from;
      while (to < n && times[to]! < endDays) to += 1;
      if (to - from < settings.minIn || n - (to - from) < settings.minOut) continue;
      const weightIn = cumWeight[to]! - cumWeight[from]!;
      const weightOut = totalWeight - weightIn;
      const meanIn = (cumWeighted[to]! - cumWeighted[from]!) / weightIn;
      const meanOut = (totalWeighted - (cumWeighted[to]! - cumWeighted[from]!)) / weightOut;
      const drop = meanOut - meanIn;
      if (!(drop > 0)) continue;
      const power = (drop * drop * weightIn * weightOut) / totalWeight;
      if (power > bestPower) {
        bestPower = power;
        // The midpoint of the first and last points inside: unbiased whatever the cadence.
        best = { from, to, centerDays: (times[from]! + times[to - 1]!) / 2, durationDays, meanIn };
      }
    }
  }
  if (!best) return null;

  const outside = new Float64Array(n - (best.to - best.from));
  outside.set(values.subarray(0, best.from), 0);
  outside.set(values.subarray(best.to, n), best.from);
  const baseline = median(outside);
  let sigma = robustSigma(outside);
  if (!(sigma > 0) && fluxErr) sigma = median(fluxErr.subarray(start, end));
  const pointsInDip = best.to - best.from;
  const depth = baseline - best.meanIn;
  const depthErr = sigma * Math.sqrt(1 / pointsInDip + Math.PI / 2 / outside.length);
  return {
    timeCenterDays: best.centerDays,
    depthPpm: (depth / baseline) * 1e6,
    depthErrPpm: (depthErr / baseline) * 1e6,
    durationHours: best.durationDays * 24,
    snr: sigma > 0 ? (depth / sigma) * Math.sqrt(pointsInDip) : Number.POSITIVE_INFINITY,
    pointsInDip,
  };
}
