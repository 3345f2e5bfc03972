// Completeness of a campaign's search by eye: the share of planted dips that volunteers recover, per bin
// of injected SNR, depth and duration, and the share of quiet controls they call a dip. Pure; no I/O.

import { ScienceInputError } from './types';

/** z for a two-sided 95 % interval: Φ⁻¹(0.975) = 1.959964 (√2·erf⁻¹(0.95) = 1.95996398…). */
export const Z_95 = 1.959964;

export interface Interval {
  low: number;
  high: number;
}

/**
 * The Wilson score interval for a binomial proportion: the set of p for which |p̂ − p| ≤ z·√(p(1−p)/n).
 * Unlike p̂ ± z·√(p̂(1−p̂)/n) it stays inside [0, 1] and keeps a width at 0/n and n/n, which matters for
 * bins of a few controls.
 *
 * @param successes whole number, 0 ≤ successes ≤ trials
 * @param trials whole number ≥ 0; with 0 trials nothing is known and the answer is [0, 1] (the limit of
 *   the interval as n → 0)
 * @param z the normal quantile of the confidence level, finite and > 0 (default Z_95, 95 %)
 * @returns the interval's ends, each in [0, 1]; exactly 0 below when successes = 0 and exactly 1 above
 *   when successes = trials
 * @throws ScienceInputError naming the argument when a count is not a whole number in range or z is not
 *   a positive finite number
 * @see Wilson 1927, JASA 22, 209
 */
export function wilsonInterval(successes: number, trials: number, z = Z_95): Interval {
  if (!Number.isInteger(trials) || trials < 0) {
    throw new ScienceInputError(`trials must be a whole number ≥ 0, got ${trials}`);
  }
  if (!Number.isInteger(successes) || successes < 0 || successes > trials) {
    throw new ScienceInputError(
      `successes must be a whole number from 0 to trials (${trials}), got ${successes}`,
    );
  }
  if (!Number.isFinite(z) || z <= 0)
    throw new ScienceInputError(`z must be a positive finite number, got ${z}`);
  if (trials === 0) return { low: 0, high: 1 };
  const n = trials;
  const p = successes / n;
  const z2 = z * z;
  const denominator = 1 + z2 / n;
  const centre = (p + z2 / (2 * n)) / denominator;
  const halfWidth = (z / denominator) * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n));
  return {
    low: successes === 0 ? 0 : Math.max(0, centre - halfWidth),
    high: successes === n ? 1 : Math.min(1, centre + halfWidth),
  };
}

/**
 * Bin edges. Each bin is [edges[i], edges[i + 1]); the last is [edges[last], ∞). Fixed rather than
 * taken from the data or the campaign's settings, so that one campaign's table reads like another's and
 * a bin means the same today as after next month's controls.
 *
 * SNR: 7.1 is the campaign's default SNR threshold; below 5 a transit is barely there, above 30 anyone
 * sees it; 50 closes the range a campaign can plant in by default (plantedSnrMax up to 200 falls in the
 * last bin).
 */
export const SNR_EDGES: readonly number[] = [0, 5, 7.1, 10, 15, 20, 30, 50];
/** Depth (ppm): 1–2–5 steps, evenly spaced in log depth to within rounding; < 100 ppm is one bin. */
export const DEPTH_EDGES_PPM: readonly number[] = [
  0, 100, 200, 500, 1000, 2000, 5000, 10_000, 20_000, 50_000,
];
/** Duration T₁₄ (hours): hour steps where most transits fall, wider beyond. */
export const DURATION_EDGES_HOURS: readonly number[] = [0, 1, 2, 3, 4, 6, 8, 12, 16, 24];

/**
 * Which bin of `edges` (ascending, see SNR_EDGES) holds `value`: i for [edges[i], edges[i + 1]), the
 * last index for values at or above the last edge; −1 for a value below the first edge or not finite.
 */
export function binIndex(value: number, edges: readonly number[]): number {
  if (!Number.isFinite(value) || edges.length === 0 || value < edges[0]!) return -1;
  let lo = 0;
  let hi = edges.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (value >= edges[mid]!) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

/** A planted control's outcome: 'dip' once settled or ruled as holding a dip, 'flat' as not; null while pending. */
export type ControlOutcome = 'dip' | 'flat' | null;

/** A planted control as completeness sees it; a null number (truth not recorded) leaves it out of that binning. */
export interface PlantedControl {
  expectedSnr: number | null;
  depthPpm: number | null;
  durationHours: number | null;
  outcome: ControlOutcome;
}

export interface QuietControl {
  outcome: ControlOutcome;
}

/** Recovered and missed with their rate and Wilson interval; null rate and interval without outcomes. */
export interface Recovery {
  recovered: number;
  missed: number;
  /** Controls without an outcome yet (open or split): never in the rate. */
  pending: number;
  /** recovered / (recovered + missed). */
  rate: number | null;
  wilsonLow: number | null;
  wilsonHigh: number | null;
}

export interface RecoveryBin extends Recovery {
  /** The bin's lower edge, included; in the binning's unit (SNR, ppm or hours). */
  lower: number;
  /** The upper edge, excluded; null for the last, open bin. */
  upper: number | null;
}

export interface CompletenessOptions {
  /** The campaign's planted SNR range: SNR bins that overlap it are listed even when empty. */
  snrRange?: { min: number; max: number };
  /** Default Z_95. */
  z?: number;
}

export interface CompletenessTable {
  /** Every planted control, with or without a usable truth. */
  planted: Recovery & { total: number };
  /** Quiet controls: a dip outcome is a false dip. rate is falseDips / (falseDips + flat). */
  quiet: {
    total: number;
    falseDips: number;
    flat: number;
    pending: number;
    rate: number | null;
    wilsonLow: number | null;
    wilsonHigh: number | null;
  };
  bySnr: RecoveryBin[];
  byDepth: RecoveryBin[];
  byDuration: RecoveryBin[];
  interval: { method: 'wilson'; z: number };
}

function recovery(recovered: number, missed: number, pending: number, z: number): Recovery {
  const trials = recovered + missed;
  if (trials === 0) return { recovered, missed, pending, rate: null, wilsonLow: null, wilsonHigh: null };
  const { low, high } = wilsonInterval(recovered, trials, z);
  return { recovered, missed, pending, rate: recovered / trials, wilsonLow: low, wilsonHigh: high };
}

/**
 * Recovery per bin of one property. The bins listed run from the first to the last that holds a control
 * (pending ones too) or overlaps `shownRange`; empty bins between them stay, so the axis has no holes.
 * Controls whose value is null, not finite or below the first edge are in no bin.
 */
export function recoveryByBin(
  planted: readonly PlantedControl[],
  propertyOf: (control: PlantedControl) => number | null,
  edges: readonly number[],
  options: { z?: number; shownRange?: { min: number; max: number } } = {},
): RecoveryBin[] {
  const { z = Z_95, shownRange } = options;
  const counts = edges.map(() => ({ recovered: 0, missed: 0, pending: 0 }));
  for (const control of planted) {
    const value = propertyOf(control);
    const index = value === null ? -1 : binIndex(value, edges);
    if (index < 0) continue;
    const bin = counts[index]!;
    if (control.outcome === 'dip') bin.recovered += 1;
    else if (control.outcome === 'flat') bin.missed += 1;
    else bin.pending += 1;
  }
  const upperOf = (i: number) => (i + 1 < edges.length ? edges[i + 1]! : null);
  const shown = counts.map((bin, i) => {
    if (bin.recovered + bin.missed + bin.pending > 0) return true;
    if (!shownRange) return false;
    // Overlapping [min, max]; a bin that only touches max at its lower edge is left out.
    const lower = edges[i]!;
    const upper = upperOf(i) ?? Number.POSITIVE_INFINITY;
    return upper > shownRange.min && (lower < shownRange.max || lower <= shownRange.min);
  });
  const first = shown.indexOf(true);
  if (first < 0) return [];
  const last = shown.lastIndexOf(true);
  const bins: RecoveryBin[] = [];
  for (let i = first; i <= last; i += 1) {
    const { recovered, missed, pending } = counts[i]!;
    bins.push({ lower: edges[i]!, upper: upperOf(i), ...recovery(recovered, missed, pending, z) });
  }
  return bins;
}

/**
 * A campaign's completeness table. A planted control is recovered when its outcome is dip and missed
 * when it is flat; one without an outcome is pending and counts in no rate. Among quiet controls with
 * an outcome, the false-dip rate is the share with outcome dip. Every rate has its Wilson interval.
 *
 * @param planted the campaign's planted controls, with the injected SNR, depth (ppm) and duration T₁₄
 *   (hours) from their truth
 * @param quiet the campaign's quiet controls
 * @see Wilson 1927, JASA 22, 209 (the intervals)
 */
export function completenessTable(
  planted: readonly PlantedControl[],
  quiet: readonly QuietControl[],
  options: CompletenessOptions = {},
): CompletenessTable {
  const z = options.z ?? Z_95;
  let recovered = 0;
  let missed = 0;
  for (const control of planted) {
    if (control.outcome === 'dip') recovered += 1;
    else if (control.outcome === 'flat') missed += 1;
  }
  let falseDips = 0;
  let flat = 0;
  for (const control of quiet) {
    if (control.outcome === 'dip') falseDips += 1;
    else if (control.outcome === 'flat') flat += 1;
  }
  const quietRecovery = recovery(falseDips, flat, quiet.length - falseDips - flat, z);
  return {
    planted: {
      total: planted.length,
      ...recovery(recovered, missed, planted.length - recovered - missed, z),
    },
    quiet: {
      total: quiet.length,
      falseDips,
      flat,
      pending: quietRecovery.pending,
      rate: quietRecovery.rate,
      wilsonLow: quietRecovery.wilsonLow,
      wilsonHigh: quietRecovery.wilsonHigh,
    },
    bySnr: recoveryByBin(planted, (c) => c.expectedSnr, SNR_EDGES, { z, shownRange: options.snrRange }),
    byDepth: recoveryByBin(planted, (c) => c.depthPpm, DEPTH_EDGES_PPM, { z }),
    byDuration: recoveryByBin(planted, (c) => c.durationHours, DURATION_EDGES_HOURS, { z }),
    interval: { method: 'wilson', z },
  };
}
