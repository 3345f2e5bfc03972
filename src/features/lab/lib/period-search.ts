/**
 * What the target review does with a period search's answer: folding the light curve at a trial
 * period, binning the fold, and reading the periodogram's strongest peaks. Plain numbers in, plain
 * numbers out, so each piece can be tested alone.
 */

export type PeriodSearchStatus = 'queued' | 'running' | 'done' | 'failed';

/** Queued and running searches change on the server; done and failed ones never do. */
export function isSearchUnderway(status: PeriodSearchStatus | null | undefined): boolean {
  return status === 'queued' || status === 'running';
}

/** How often the review asks after a search that is still underway, in ms; false once it has ended. */
export const PERIOD_SEARCH_POLL_MS = 1_500;

export function periodSearchPollInterval(status: PeriodSearchStatus | null | undefined): number | false {
  return isSearchUnderway(status) ? PERIOD_SEARCH_POLL_MS : false;
}

/** A progress bar's width: the job's percent held inside 0–100, and 0 when the job has not said. */
export function progressPercent(progress: { percent: number } | null | undefined): number {
  const percent = progress?.percent;
  if (percent === undefined || !Number.isFinite(percent)) return 0;
  return Math.min(100, Math.max(0, Math.round(percent)));
}

export interface SeriesPart {
  /** In the light curve's own days (the same days as a period search's t0Days). */
  timeDays: readonly number[];
  /** Flux in ppm from the light curve's level; null for a gap. */
  fluxPpm: readonly (number | null)[];
}

export interface Fold {
  /** Hours from the nearest mid-transit, ascending. */
  phaseHours: number[];
  fluxPpm: number[];
}

export interface FoldOptions {
  periodDays: number;
  t0Days: number;
  /**
   * Keep points within this many hours of mid-transit; at most half the period (the whole orbit).
   * Omit for the whole orbit.
   */
  halfWindowHours?: number;
}

/**
 * Folds light-curve points at a period: each point's time becomes its offset from the nearest
 * mid-transit t0 + n·P, in hours, from −P/2 to +P/2. Points with no flux are left out; the result is
 * sorted by phase so that it can be drawn as a chart's x axis.
 *
 * @param parts light curves in the same days as `t0Days`, flux in ppm
 * @param options.periodDays the trial period, days, > 0
 * @param options.t0Days a mid-transit time, days
 * @throws RangeError when periodDays is not a positive number
 */
export function foldSeries(parts: readonly SeriesPart[], options: FoldOptions): Fold {
  const { periodDays, t0Days } = options;
  if (!(periodDays > 0) || !Number.isFinite(periodDays)) {
    throw new RangeError(`periodDays must be a positive number, got ${periodDays}`);
  }
  const periodHours = periodDays * 24;
  const halfWindow = Math.min(options.halfWindowHours ?? Number.POSITIVE_INFINITY, periodHours / 2);
  const points: { phase: number; flux: number }[] = [];
  for (const part of parts) {
    const count = Math.min(part.timeDays.length, part.fluxPpm.length);
    for (let i = 0; i < count; i += 1) {
      const flux = part.fluxPpm[i];
      const time = part.timeDays[i]!;
      if (flux === null || flux === undefined || !Number.isFinite(flux) || !Number.isFinite(time)) continue;
      const cycles = (time - t0Days) / periodDays;
      const phase = (cycles - Math.round(cycles)) * periodHours;
      if (Math.abs(phase) > halfWindow) continue;
      points.push({ phase, flux });
    }
  }
  points.sort((a, b) => a.phase - b.phase);
  return { phaseHours: points.map((p) => p.phase), fluxPpm: points.map((p) => p.flux) };
}

/**
 * How far from mid-transit a fold is drawn: five durations either side (enough baseline to see the
 * transit's edges against), at least 6 h, and never more than half the period.
 */
export function foldHalfWindowHours(periodDays: number, durationHours: number): number {
  return Math.min((periodDays * 24) / 2, Math.max(5 * durationHours, 6));
}

export interface BinnedFold {
  /** Bin centres, hours from mid-transit. */
  phaseHours: number[];
  /** Mean flux of the bin in ppm; NaN for an empty bin, which breaks the drawn line. */
  meanPpm: number[];
  count: number[];
}

/**
 * Means of a fold in equal bins of phase, from `fromHours` to `toHours`.
 *
 * @param binHours bin width, hours, > 0
 * @throws RangeError when binHours is not positive or the range is empty
 */
export function binFold(fold: Fold, binHours: number, fromHours: number, toHours: number): BinnedFold {
  if (!(binHours > 0)) throw new RangeError(`binHours must be positive, got ${binHours}`);
  if (!(toHours > fromHours)) {
    throw new RangeError(`toHours must be after fromHours (${fromHours}), got ${toHours}`);
  }
  const bins = Math.max(1, Math.ceil((toHours - fromHours) / binHours - 1e-9));
  const sums = new Float64Array(bins);
  const counts = new Array<number>(bins).fill(0);
  fold.phaseHours.forEach((phase, index) => {
    if (phase < fromHours || phase > toHours) return;
    const bin = Math.min(bins - 1, Math.floor((phase - fromHours) / binHours));
    sums[bin]! += fold.fluxPpm[index]!;
    counts[bin]! += 1;
  });
  return {
    phaseHours: counts.map((_, bin) => fromHours + (bin + 0.5) * binHours),
    meanPpm: counts.map((count, bin) => (count === 0 ? Number.NaN : sums[bin]! / count)),
    count: counts,
  };
}

/** A bin a fifth of the transit's duration: five means across the transit, clear of its edges. */
export function foldBinHours(durationHours: number): number {
  return Math.max(durationHours / 5, 0.05);
}

export interface PeriodogramPeak {
  periodDays: number;
  power: number;
}

/**
 * The strongest local maxima of a periodogram, strongest first, each at least `minSeparation`
 * (relative, 0.01 = 1 %) away in period from a stronger one, so that one broad peak is listed once.
 */
export function periodogramPeaks(
  periodsDays: readonly number[],
  power: readonly number[],
  count: number,
  minSeparation = 0.01,
): PeriodogramPeak[] {
  const maxima: PeriodogramPeak[] = [];
  for (let i = 0; i < power.length; i += 1) {
    const value = power[i]!;
    if (!Number.isFinite(value)) continue;
    const left = i === 0 ? Number.NEGATIVE_INFINITY : power[i - 1]!;
    const right = i === power.length - 1 ? Number.NEGATIVE_INFINITY : power[i + 1]!;
    if (value >= left && value >= right) maxima.push({ periodDays: periodsDays[i]!, power: value });
  }
  maxima.sort((a, b) => b.power - a.power);
  const chosen: PeriodogramPeak[] = [];
  for (const peak of maxima) {
    if (chosen.length >= count) break;
    const near = chosen.some(
      (other) => Math.abs(other.periodDays - peak.periodDays) <= minSeparation * other.periodDays,
    );
    if (!near) chosen.push(peak);
  }
  return chosen;
}

/** A period in days with the digits a BLS period carries: six after the point below 10 d. */
export function formatPeriodDays(periodDays: number | null | undefined): string {
  if (periodDays === null || periodDays === undefined || !Number.isFinite(periodDays)) return '—';
  const digits = periodDays < 10 ? 5 : periodDays < 100 ? 4 : 3;
  return `${periodDays.toFixed(digits)} d`;
}
