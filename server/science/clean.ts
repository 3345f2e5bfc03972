import { MAD_TO_SIGMA, median, medianCadence, medianInPlace, robustSigma } from './statistics';
import { type CleanLightCurve, type LightCurve, ScienceInputError } from './types';

export interface CleanOptions {
  /** Drop points whose quality flag is non-zero (when the light curve has flags). Default true. */
  useQualityFlags?: boolean;
  /** Upward outliers beyond this many robust σ above the local level are clipped. Default 4. */
  clipSigma?: number;
  /** Width of the bins that set the local level for clipping, in days. Default 0.25. */
  clipBinDays?: number;
  /** Times closer than this are one timestamp, merged. Default 1e-7 d (about 9 ms). */
  duplicateToleranceDays?: number;
}

export interface CleanReport {
  pointsIn: number;
  droppedNonFinite: number;
  droppedFlagged: number;
  mergedDuplicates: number;
  clippedOutliers: number;
  pointsOut: number;
}

/**
 * Makes a light curve fit to analyse: drops non-finite and quality-flagged points, sorts by time,
 * merges duplicate timestamps (inverse-variance mean), normalises flux to median 1 and clips upward
 * outliers (cosmic rays, scattered light) by sigma clipping with a MAD-based scale. Dips are never
 * clipped: they are what the search looks for. Running it on its own output changes nothing.
 *
 * @param lightCurve a light curve as read; times in days
 * @returns the clean light curve and a count of what was removed
 * @throws ScienceInputError when fewer than 10 points remain, or the median flux is not positive
 */
export function cleanLightCurve(
  lightCurve: LightCurve,
  options: CleanOptions = {},
): { lightCurve: CleanLightCurve; report: CleanReport } {
  const {
    useQualityFlags = true,
    clipSigma = 4,
    clipBinDays = 0.25,
    duplicateToleranceDays = 1e-7,
  } = options;
  const { timeDays, flux, fluxErr, quality } = lightCurve;
  const n = timeDays.length;
  const keep: number[] = [];
  let droppedNonFinite = 0;
  let droppedFlagged = 0;
  for (let i = 0; i < n; i += 1) {
    const errorOk = !fluxErr || (Number.isFinite(fluxErr[i]!) && fluxErr[i]! > 0);
    if (!Number.isFinite(timeDays[i]!) || !Number.isFinite(flux[i]!) || !errorOk) droppedNonFinite += 1;
    else if (useQualityFlags && quality && quality[i] !== 0) droppedFlagged += 1;
    else keep.push(i);
  }
  if (keep.length === 0 && n > 0 && droppedNonFinite === n) {
    throw new ScienceInputError('The flux has no finite values (all NaN or empty)');
  }
  keep.sort((a, b) => timeDays[a]! - timeDays[b]! || a - b);

  // Merge timestamps that repeat: the inverse-variance weighted mean of their fluxes.
  const times: number[] = [];
  const fluxes: number[] = [];
  const errors: number[] = [];
  let mergedDuplicates = 0;
  for (let k = 0; k < keep.length; ) {
    const first = keep[k]!;
    let weightSum = 0;
    let weightedFlux = 0;
    let count = 0;
    let plainSum = 0;
    let j = k;
    while (j < keep.length && timeDays[keep[j]!]! - timeDays[first]! <= duplicateToleranceDays) {
      const index = keep[j]!;
      const weight = fluxErr ? 1 / (fluxErr[index]! * fluxErr[index]!) : 1;
      weightSum += weight;
      weightedFlux += weight * flux[index]!;
      plainSum += flux[index]!;
      count += 1;
      j += 1;
    }
    times.push(timeDays[first]!);
    if (count === 1) {
      // A lone point keeps its values exactly (so that cleaning twice changes nothing).
      fluxes.push(flux[first]!);
      errors.push(fluxErr ? fluxErr[first]! : Number.NaN);
    } else {
      fluxes.push(fluxErr ? weightedFlux / weightSum : plainSum / count);
      errors.push(fluxErr ? 1 / Math.sqrt(weightSum) : Number.NaN);
    }
    mergedDuplicates += count - 1;
    k = j;
  }
  if (times.length < 10) {
    throw new ScienceInputError(
      `Only ${times.length} usable points remain after cleaning; at least 10 are needed`,
    );
  }

  let out: Series = {
    t: Float64Array.from(times),
    f: Float64Array.from(fluxes),
    e: Float64Array.from(errors),
  };
  let clippedOutliers = 0;
  for (let round = 0; round < 10; round += 1) {
    const outliers = upwardOutliers(out.t, out.f, clipSigma, clipBinDays);
    if (outliers.size === 0) break;
    clippedOutliers += outliers.size;
    out = filterPoints(out, (i) => !outliers.has(i));
  }

  // Normalise last, so that a second run finds the median already at 1 and leaves the values as they are.
  const level = median(out.f);
  if (!(level > 0)) throw new ScienceInputError(`The median flux must be positive, got ${level}`);
  if (Math.abs(level - 1) >= 1e-12) {
    out.f = out.f.map((v) => v / level);
    out.e = out.e.map((v) => v / level);
  }

  if (!fluxErr) {
    // No errors in the file: every point gets the point-to-point scatter.
    const sigma = pointToPointScatter(out.f);
    out.e.fill(sigma > 0 ? sigma : 1e-6);
  }
  return {
    lightCurve: { timeDays: out.t, flux: out.f, fluxErr: out.e, timeSystem: lightCurve.timeSystem },
    report: {
      pointsIn: n,
      droppedNonFinite,
      droppedFlagged,
      mergedDuplicates,
      clippedOutliers,
      pointsOut: out.t.length,
    },
  };
}

interface Series {
  t: Float64Array;
  f: Float64Array;
  e: Float64Array;
}

function filterPoints(series: Series, keepPoint: (index: number) => boolean): Series {
  const t: number[] = [];
  const f: number[] = [];
  const e: number[] = [];
  for (let i = 0; i < series.t.length; i += 1) {
    if (!keepPoint(i)) continue;
    t.push(series.t[i]!);
    f.push(series.f[i]!);
    e.push(series.e[i]!);
  }
  return { t: Float64Array.from(t), f: Float64Array.from(f), e: Float64Array.from(e) };
}

// The local level is the median of fixed time bins, so slow stellar variability is not clipped; the
// scale is the MAD of the residuals. Only points above the level are candidates.
function upwardOutliers(t: Float64Array, f: Float64Array, clipSigma: number, binDays: number): Set<number> {
  const n = t.length;
  const residuals = new Float64Array(n);
  const start = t[0]!;
  let binStart = 0;
  const scratch = new Float64Array(n);
  while (binStart < n) {
    const bin = Math.floor((t[binStart]! - start) / binDays);
    let binEnd = binStart;
    while (binEnd < n && Math.floor((t[binEnd]! - start) / binDays) === bin) binEnd += 1;
    for (let i = binStart; i < binEnd; i += 1) scratch[i - binStart] = f[i]!;
    const level = medianInPlace(scratch, binEnd - binStart);
    for (let i = binStart; i < binEnd; i += 1) residuals[i] = f[i]! - level;
    binStart = binEnd;
  }
  const absolute = Float64Array.from(residuals, Math.abs);
  const sigma = MAD_TO_SIGMA * medianInPlace(absolute, n);
  const outliers = new Set<number>();
  if (!(sigma > 0)) return outliers;
  for (let i = 0; i < n; i += 1) if (residuals[i]! > clipSigma * sigma) outliers.add(i);
  return outliers;
}

/**
 * Point-to-point scatter: the robust σ of successive differences divided by √2, so that slow trends do
 * not count as noise. Relative units (multiply by 1e6 for ppm).
 */
export function pointToPointScatter(flux: ArrayLike<number>): number {
  const n = flux.length;
  if (n < 3) return Number.NaN;
  const diffs = new Float64Array(n - 1);
  for (let i = 1; i < n; i += 1) diffs[i - 1] = flux[i]! - flux[i - 1]!;
  return robustSigma(diffs) / Math.SQRT2;
}

export interface NoiseFigures {
  /** Point-to-point scatter (MAD-based), in ppm. */
  pointToPointPpm: number;
  /** Scatter of 1-hour averages (MAD-based), in ppm; NaN with fewer than 8 hourly bins. */
  oneHourPpm: number;
  cadenceDays: number;
}

/** Noise figures of a normalised (ideally detrended) light curve. */
export function noiseFigures(timeDays: Float64Array, flux: Float64Array): NoiseFigures {
  const hour = 1 / 24;
  const means: number[] = [];
  let i = 0;
  while (i < timeDays.length) {
    const binEnd = timeDays[i]! + hour;
    let sum = 0;
    let count = 0;
    while (i < timeDays.length && timeDays[i]! < binEnd) {
      sum += flux[i]!;
      count += 1;
      i += 1;
    }
    if (count >= 3) means.push(sum / count);
  }
  let oneHourPpm = Number.NaN;
  if (means.length >= 8) {
    const center = median(means);
    const deviations = Float64Array.from(means, (m) => Math.abs(m - center));
    oneHourPpm = MAD_TO_SIGMA * medianInPlace(deviations, deviations.length) * 1e6;
  }
  return {
    pointToPointPpm: pointToPointScatter(flux) * 1e6,
    oneHourPpm,
    cadenceDays: medianCadence(timeDays),
  };
}
