// Where in a snippet the dip is: the volunteers' marks, weighted by reliability, grouped into one dip
// or, when they fall in two separate groups, two.

import { MAD_TO_SIGMA } from '../statistics';
import { ScienceInputError } from '../types';
import type { DipTimeCluster } from './types';

export interface DipMark {
  /** The marked dip centre (light-curve time, days). */
  timeDays: number;
  /** The marking volunteer's reliability weight (e.g. their weightDip); marks weighing ≤ 0 are ignored. */
  weight: number;
}

export interface DipTimeOptions {
  /** Two groups of marks farther apart than this (days) are two dips. */
  separationDays: number;
  /** Each of two groups needs at least this many marks. Default 2. */
  minClusterMarks?: number;
  /** Each of two groups needs at least this share of the total weight. Default 0.25. */
  minClusterWeightShare?: number;
}

/**
 * The weighted median of values sorted ascending, over indices [from, to): the first value at which
 * the cumulative weight reaches half the total; when it lands exactly on half, the mean of that value
 * and the next (so equal weights give the ordinary median).
 */
function weightedMedianSorted(values: Float64Array, weights: Float64Array, from: number, to: number): number {
  let total = 0;
  for (let i = from; i < to; i += 1) total += weights[i]!;
  const half = total / 2;
  let cumulative = 0;
  for (let i = from; i < to; i += 1) {
    cumulative += weights[i]!;
    if (cumulative >= half) {
      // Equal to half within rounding: the median lies between this value and the next.
      if (i + 1 < to && Math.abs(cumulative - half) <= 1e-12 * total)
        return (values[i]! + values[i + 1]!) / 2;
      return values[i]!;
    }
  }
  return values[to - 1]!;
}

function cluster(times: Float64Array, weights: Float64Array, from: number, to: number): DipTimeCluster {
  const center = weightedMedianSorted(times, weights, from, to);
  const count = to - from;
  const order = Array.from({ length: count }, (_, k) => from + k).sort(
    (a, b) => Math.abs(times[a]! - center) - Math.abs(times[b]! - center) || a - b,
  );
  const deviations = Float64Array.from(order, (i) => Math.abs(times[i]! - center));
  const deviationWeights = Float64Array.from(order, (i) => weights[i]!);
  const mad = count > 1 ? weightedMedianSorted(deviations, deviationWeights, 0, count) : 0;
  let weight = 0;
  for (let i = from; i < to; i += 1) weight += weights[i]!;
  return { center, sigma: MAD_TO_SIGMA * mad, count, weight };
}

/**
 * Groups a snippet's dip marks into dips. The rule: drop marks with a weight ≤ 0 or a non-finite time
 * or weight; sort the rest by time; find the largest gap between neighbouring marks. When that gap
 * exceeds `separationDays` and each side has at least `minClusterMarks` marks and
 * `minClusterWeightShare` of the total weight, the marks are two dips, cut at that gap; otherwise one.
 * Each dip's centre is the weighted median of its marks and its sigma 1.4826 × their weighted median
 * absolute deviation about that centre (the Gaussian-consistent robust spread; 0 for one mark).
 *
 * @param marks - the dip marks (days) with their volunteers' reliability weights.
 * @returns zero, one or two clusters, sorted by centre time; [] when no mark remains.
 * @throws ScienceInputError when separationDays is not > 0 or an option is out of range.
 * @see Hampel 1974, JASA 69, 383 (the median absolute deviation, scaled by 1/Φ⁻¹(3/4) = 1.4826)
 */
export function dipTimeClusters(marks: readonly DipMark[], options: DipTimeOptions): DipTimeCluster[] {
  const { separationDays } = options;
  const minMarks = options.minClusterMarks ?? 2;
  const minShare = options.minClusterWeightShare ?? 0.25;
  if (!(separationDays > 0)) {
    throw new ScienceInputError(`options.separationDays must be > 0, got ${separationDays}`);
  }
  if (!(Number.isInteger(minMarks) && minMarks >= 1)) {
    throw new ScienceInputError(`options.minClusterMarks must be an integer ≥ 1, got ${minMarks}`);
  }
  if (!(minShare >= 0 && minShare <= 0.5)) {
    throw new ScienceInputError(`options.minClusterWeightShare must be in [0, 0.5], got ${minShare}`);
  }
  const kept = marks.filter(
    (mark) => Number.isFinite(mark.timeDays) && Number.isFinite(mark.weight) && mark.weight > 0,
  );
  if (kept.length === 0) return [];
  kept.sort((a, b) => a.timeDays - b.timeDays || a.weight - b.weight);
  const n = kept.length;
  const times = Float64Array.from(kept, (mark) => mark.timeDays);
  const weights = Float64Array.from(kept, (mark) => mark.weight);

  let gapAt = -1;
  let largestGap = 0;
  for (let i = 1; i < n; i += 1) {
    const gap = times[i]! - times[i - 1]!;
    if (gap > largestGap) {
      largestGap = gap;
      gapAt = i;
    }
  }
  if (gapAt > 0 && largestGap > separationDays) {
    let total = 0;
    let before = 0;
    for (let i = 0; i < n; i += 1) {
      total += weights[i]!;
      if (i < gapAt) before += weights[i]!;
    }
    const enoughMarks = gapAt >= minMarks && n - gapAt >= minMarks;
    const enoughWeight = before >= minShare * total && total - before >= minShare * total;
    if (enoughMarks && enoughWeight)
      return [cluster(times, weights, 0, gapAt), cluster(times, weights, gapAt, n)];
  }
  return [cluster(times, weights, 0, n)];
}
