import { medianCadence } from './statistics';
import { ScienceInputError } from './types';

export interface SnippetOptions {
  /** Window length in days (0.1–30); a campaign's default is 2. */
  lengthDays: number;
  /** Share of each window that the next one repeats, in [0, 0.9); default 0.25. */
  overlap: number;
  /** Windows with less data than this share of their length are skipped; default 0.6. */
  minCoverage?: number;
  /** The card's series has at most this many points; default 600. */
  maxDisplayPoints?: number;
}

export interface SnippetWindow {
  startDays: number;
  endDays: number;
  /** Index range [first, end) of the light curve's points in the window: the full-resolution series. */
  first: number;
  end: number;
  pointCount: number;
  /** Share of the window covered by data: points × cadence / length, at most 1. */
  coverage: number;
}

/**
 * Cuts a light curve into overlapping windows of a fixed length, the snippets volunteers judge.
 * Windows start at the first point and step by length × (1 − overlap); a window with less than
 * `minCoverage` of its length covered by data (gaps, edges) is skipped.
 *
 * @param timeDays sorted times in days
 * @throws ScienceInputError for a length or overlap out of range
 */
export function cutWindows(timeDays: Float64Array, options: SnippetOptions): SnippetWindow[] {
  const { lengthDays, overlap, minCoverage = 0.6 } = options;
  if (!(lengthDays >= 0.1 && lengthDays <= 30)) {
    throw new ScienceInputError(`lengthDays must be between 0.1 and 30, got ${lengthDays}`);
  }
  if (!(overlap >= 0 && overlap < 0.9))
    throw new ScienceInputError(`overlap must be in [0, 0.9), got ${overlap}`);
  const n = timeDays.length;
  if (n === 0) return [];
  const cadence = medianCadence(timeDays);
  const step = lengthDays * (1 - overlap);
  const windows: SnippetWindow[] = [];
  const lastTime = timeDays[n - 1]!;
  let first = 0;
  for (let start = timeDays[0]!; start < lastTime; start += step) {
    const end = start + lengthDays;
    while (first < n && timeDays[first]! < start) first += 1;
    let stop = first;
    while (stop < n && timeDays[stop]! < end) stop += 1;
    const pointCount = stop - first;
    const coverage = Number.isFinite(cadence) ? Math.min(1, (pointCount * cadence) / lengthDays) : 0;
    if (pointCount > 0 && coverage >= minCoverage) {
      windows.push({ startDays: start, endDays: end, first, end: stop, pointCount, coverage });
    }
    if (end >= lastTime) break;
  }
  return windows;
}

export interface DisplaySeries {
  timeDays: Float64Array;
  flux: Float64Array;
}

/**
 * The card's series: at most `maxPoints` points. With more points than that, the window is split into
 * equal time bins and each bin keeps its lowest point (with its own time), so that binning can never
 * average a dip away.
 */
export function displaySeries(
  timeDays: Float64Array,
  flux: Float64Array,
  window: Pick<SnippetWindow, 'startDays' | 'endDays' | 'first' | 'end'>,
  maxPoints = 600,
): DisplaySeries {
  const count = window.end - window.first;
  if (count <= maxPoints) {
    return { timeDays: timeDays.slice(window.first, window.end), flux: flux.slice(window.first, window.end) };
  }
  const binDays = (window.endDays - window.startDays) / maxPoints;
  const times: number[] = [];
  const fluxes: number[] = [];
  let i = window.first;
  for (let bin = 0; bin < maxPoints && i < window.end; bin += 1) {
    const binEnd = bin === maxPoints - 1 ? Number.POSITIVE_INFINITY : window.startDays + (bin + 1) * binDays;
    let lowest = -1;
    while (i < window.end && timeDays[i]! < binEnd) {
      if (lowest < 0 || flux[i]! < flux[lowest]!) lowest = i;
      i += 1;
    }
    if (lowest >= 0) {
      times.push(timeDays[lowest]!);
      fluxes.push(flux[lowest]!);
    }
  }
  return { timeDays: Float64Array.from(times), flux: Float64Array.from(fluxes) };
}
