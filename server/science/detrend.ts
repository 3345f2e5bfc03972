import { medianInPlace } from './statistics';
import { ScienceInputError } from './types';

/** The window the detrending uses by default: three times the longest transit sought (Hippke et al. 2019, §2.3). */
export const defaultDetrendWindowDays = (longestTransitHours: number): number =>
  (3 * longestTransitHours) / 24;

export interface DetrendOptions {
  /** Full width of the sliding window, in days (0.05–30). */
  windowDays: number;
  /** Biweight tuning constant in units of the MAD; 5 as in wotan (Hippke et al. 2019). */
  cutoff?: number;
  /**
   * The biweight location is computed at window centres this far apart and interpolated between them;
   * default a twentieth of the window, far finer than the trend can change.
   */
  gridStepDays?: number;
}

export interface DetrendResult {
  /** The fitted trend, one value per point. */
  trend: Float64Array;
  /** flux / trend. */
  detrended: Float64Array;
  /** [first index, end index) of each stretch detrended on its own, split at long gaps. */
  segments: [number, number][];
}

/**
 * Removes stellar variability and slow systematics with a robust sliding-window filter: the Tukey
 * biweight location of the points within ±window/2 of each time. Transits shorter than about a third
 * of the window keep their depth, because the biweight gives little weight to points that sit far
 * below the rest. The series is split at gaps longer than half the window and each part is detrended
 * on its own; at a part's edges the window is cut to the data it has.
 *
 * @param timeDays sorted times, in days
 * @param flux relative flux (median near 1), same length
 * @see Hippke, David, Mulders & Heller 2019, AJ 158, 143 (wotan), §2.2 the biweight
 * @see Mosteller & Tukey 1977, Data Analysis and Regression, the biweight location
 * @throws ScienceInputError when the window is out of range or the arrays differ in length
 */
export function detrendBiweight(
  timeDays: Float64Array,
  flux: Float64Array,
  options: DetrendOptions,
): DetrendResult {
  const { windowDays, cutoff = 5 } = options;
  if (!(windowDays >= 0.05 && windowDays <= 30)) {
    throw new ScienceInputError(`windowDays must be between 0.05 and 30, got ${windowDays}`);
  }
  if (timeDays.length !== flux.length) {
    throw new ScienceInputError(`timeDays and flux differ in length (${timeDays.length} and ${flux.length})`);
  }
  const gridStepDays = options.gridStepDays ?? windowDays / 20;
  const n = timeDays.length;
  const trend = new Float64Array(n);
  const segments = splitAtGaps(timeDays, windowDays / 2);
  const scratch = new Float64Array(n);
  const deviations = new Float64Array(n);

  for (const [first, end] of segments) {
    const start = timeDays[first]!;
    const stop = timeDays[end - 1]!;
    const steps = Math.max(1, Math.ceil((stop - start) / gridStepDays));
    const centres = new Float64Array(steps + 1);
    const levels = new Float64Array(steps + 1);
    let lo = first;
    let hi = first;
    for (let g = 0; g <= steps; g += 1) {
      const centre = start + ((stop - start) * g) / steps;
      while (lo < end && timeDays[lo]! < centre - windowDays / 2) lo += 1;
      while (hi < end && timeDays[hi]! <= centre + windowDays / 2) hi += 1;
      centres[g] = centre;
      levels[g] = biweightLocation(flux, lo, hi, cutoff, scratch, deviations);
    }
    // Linear interpolation of the grid onto every point of the segment.
    let g = 0;
    for (let i = first; i < end; i += 1) {
      const t = timeDays[i]!;
      while (g < steps - 1 && centres[g + 1]! < t) g += 1;
      const span = centres[g + 1]! - centres[g]!;
      const w = span > 0 ? Math.min(1, Math.max(0, (t - centres[g]!) / span)) : 0;
      trend[i] = levels[g]! * (1 - w) + levels[g + 1]! * w;
    }
  }
  const detrended = new Float64Array(n);
  for (let i = 0; i < n; i += 1) detrended[i] = flux[i]! / trend[i]!;
  return { trend, detrended, segments };
}

/** Index ranges [first, end) separated by gaps longer than `maxGapDays`. */
export function splitAtGaps(timeDays: Float64Array, maxGapDays: number): [number, number][] {
  const segments: [number, number][] = [];
  let first = 0;
  for (let i = 1; i <= timeDays.length; i += 1) {
    if (i === timeDays.length || timeDays[i]! - timeDays[i - 1]! > maxGapDays) {
      if (i > first) segments.push([first, i]);
      first = i;
    }
  }
  return segments;
}

// Iterated biweight location of flux[lo, hi), starting from the median (Mosteller & Tukey 1977):
// u = (x − M) / (c · MAD), weights (1 − u²)² inside |u| < 1, until M moves less than 1e-7.
function biweightLocation(
  flux: Float64Array,
  lo: number,
  hi: number,
  cutoff: number,
  scratch: Float64Array,
  deviations: Float64Array,
): number {
  const count = hi - lo;
  if (count === 0) return Number.NaN;
  for (let i = 0; i < count; i += 1) scratch[i] = flux[lo + i]!;
  let location = medianInPlace(scratch, count);
  for (let iteration = 0; iteration < 10; iteration += 1) {
    for (let i = 0; i < count; i += 1) deviations[i] = Math.abs(flux[lo + i]! - location);
    const mad = medianInPlace(deviations, count);
    if (!(mad > 0)) break;
    let weightSum = 0;
    let weighted = 0;
    for (let i = lo; i < hi; i += 1) {
      const u = (flux[i]! - location) / (cutoff * mad);
      if (u * u >= 1) continue;
      const weight = (1 - u * u) * (1 - u * u);
      weightSum += weight;
      weighted += weight * flux[i]!;
    }
    if (weightSum === 0) break;
    const next = weighted / weightSum;
    const moved = Math.abs(next - location);
    location = next;
    if (moved < 1e-7) break; // 0.1 ppm of a normalised flux: far below any noise
  }
  return location;
}
