/** Labels and formatting for candidates, their ephemerides and transit windows. */

/** As the server's CANDIDATE_STATES (server/db/candidates.ts), in the order a candidate moves through. */
export const CANDIDATE_STATES = ['promoted', 'scheduled', 'observed', 'resolved'] as const;
export type CandidateState = (typeof CANDIDATE_STATES)[number];

/** As the server's DISPOSITIONS: trade terms, written as the trade writes them. */
export const DISPOSITIONS = [
  'planet candidate',
  'eclipsing binary',
  'systematic',
  'false positive',
  'confirmed planet',
] as const;
export type Disposition = (typeof DISPOSITIONS)[number];

export const candidateStateLabels: Record<CandidateState, string> = {
  promoted: 'Promoted',
  scheduled: 'Scheduled',
  observed: 'Observed',
  resolved: 'Resolved',
};

export const candidateStateHints: Record<CandidateState, string> = {
  promoted: 'On the list, no observation planned yet',
  scheduled: 'An observation is planned',
  observed: 'Observed, results not in yet',
  resolved: 'The disposition is settled',
};

export type BadgeTone = 'amber' | 'slate' | 'danger' | 'success';

export const candidateStateTones: Record<CandidateState, BadgeTone> = {
  promoted: 'amber',
  scheduled: 'slate',
  observed: 'slate',
  resolved: 'success',
};

export function dispositionLabel(disposition: Disposition): string {
  return disposition[0]!.toUpperCase() + disposition.slice(1);
}

export const dispositionTones: Record<Disposition, BadgeTone> = {
  'planet candidate': 'amber',
  'eclipsing binary': 'slate',
  systematic: 'slate',
  'false positive': 'danger',
  'confirmed planet': 'success',
};

const finite = (value: number | null | undefined): value is number =>
  value !== null && value !== undefined && Number.isFinite(value);

/** A number with a fixed count of decimals and its unit, or "—" when there is none. */
export function formatFixed(value: number | null | undefined, digits: number, unit = ''): string {
  if (!finite(value)) return '—';
  return `${value.toFixed(digits)}${unit ? ` ${unit}` : ''}`;
}

const ppmFormat = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 0 });

/** An angle in whole degrees: "70°". */
export function formatDegrees(value: number | null | undefined): string {
  return finite(value) ? `${Math.round(value)}°` : '—';
}

export function formatPpm(value: number | null | undefined): string {
  return finite(value) ? `${ppmFormat.format(value)} ppm` : '—';
}

/** BJD_TDB as a full Julian date; five decimals is about a second. */
export function formatBjd(value: number | null | undefined): string {
  return formatFixed(value, 5);
}

/** An uncertainty in days written in minutes, the unit observers plan in: "± 26.0 min", "± 142 min". */
export function formatSigmaMinutes(sigmaDays: number | null | undefined): string {
  if (!finite(sigmaDays)) return '± —';
  const minutes = sigmaDays * 24 * 60;
  // A decimal below 100 min, so the growth from one epoch to the next shows.
  return `± ${minutes < 100 ? minutes.toFixed(1) : Math.round(minutes).toString()} min`;
}

/**
 * A period with its error: "2.231908 ± 0.000012 d". The value gets as many decimals as the error's
 * first two significant digits need (at least 4, at most 8), so neither hides the other.
 */
export function formatPeriod(periodDays: number | null, sigmaDays: number | null): string {
  if (!finite(periodDays)) return '—';
  if (!finite(sigmaDays) || sigmaDays <= 0) return `${periodDays.toFixed(6)} d`;
  const digits = Math.min(8, Math.max(4, 1 - Math.floor(Math.log10(sigmaDays))));
  return `${periodDays.toFixed(digits)} ± ${sigmaDays.toFixed(digits)} d`;
}

/** A mid-transit time with its error: "2458001.01042 BJD_TDB ± 0.2 min". */
export function formatEpochTime(bjd: number | null, sigmaDays: number | null): string {
  if (!finite(bjd)) return '—';
  return `${formatBjd(bjd)} BJD_TDB ${finite(sigmaDays) ? formatSigmaMinutes(sigmaDays) : ''}`.trim();
}

const utcDateTime = new Intl.DateTimeFormat('en-GB', {
  timeZone: 'UTC',
  weekday: 'short',
  day: 'numeric',
  month: 'short',
  year: 'numeric',
  hour: '2-digit',
  minute: '2-digit',
  hourCycle: 'h23',
});

const utcTime = new Intl.DateTimeFormat('en-GB', {
  timeZone: 'UTC',
  hour: '2-digit',
  minute: '2-digit',
  hourCycle: 'h23',
});

/** "Thu 3 Dec 2026, 09:18 UTC": windows are planned in UTC whatever the reader's own zone. */
export function formatUtc(iso: string): string {
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : `${utcDateTime.format(date)} UTC`;
}

/** "09:18": the time of day in UTC. */
export function formatUtcTime(iso: string): string {
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : utcTime.format(date);
}

/**
 * A window's start and end in UTC: "Thu 3 Dec 2026, 08:07 – 10:29 UTC", with the end's date written
 * out only when it falls on another day.
 */
export function formatUtcRange(startIso: string, endIso: string): string {
  const start = new Date(startIso);
  const end = new Date(endIso);
  if (Number.isNaN(start.getTime()) || Number.isNaN(end.getTime())) return `${startIso} – ${endIso}`;
  const sameDay = startIso.slice(0, 10) === endIso.slice(0, 10);
  return sameDay
    ? `${utcDateTime.format(start)} – ${utcTime.format(end)} UTC`
    : `${utcDateTime.format(start)} – ${utcDateTime.format(end)} UTC`;
}

export interface Credits {
  named: readonly string[];
  others: number;
}

/** "Found by Ada, Bea and 3 others": volunteers who chose to be credited by name come first. */
export function creditLine(credits: Credits): string {
  const { named, others } = credits;
  const othersText = others === 1 ? '1 other volunteer' : `${others} others`;
  if (named.length === 0) {
    return others === 0
      ? 'No volunteer credited yet'
      : `Found by ${others === 1 ? '1 volunteer' : `${others} volunteers`}`;
  }
  const parts = others > 0 ? [...named, othersText] : [...named];
  if (parts.length === 1) return `Found by ${parts[0]}`;
  return `Found by ${parts.slice(0, -1).join(', ')} and ${parts[parts.length - 1]}`;
}

export type DipTargetOrder = 'snr' | 'dips' | 'consensus';

export const dipTargetOrderLabels: Record<DipTargetOrder, string> = {
  snr: 'Best SNR',
  dips: 'Number of dips',
  consensus: 'Mean consensus score',
};

interface RankedTarget {
  targetId: number;
  dipCount: number;
  bestSnr: number | null;
  meanScore: number | null;
}

/**
 * The review list in the chosen order. "snr" keeps the server's own ranking (SNR, then dips, then
 * consensus); the others lead with their own measure and fall back on the same ranking, so ties read
 * the same way everywhere. Missing values go last.
 */
export function orderDipTargets<T extends RankedTarget>(targets: readonly T[], order: DipTargetOrder): T[] {
  const snr = (t: T) => t.bestSnr ?? -1;
  const score = (t: T) => t.meanScore ?? -1;
  const byServer = (a: T, b: T) =>
    snr(b) - snr(a) || b.dipCount - a.dipCount || score(b) - score(a) || a.targetId - b.targetId;
  const lead: Record<DipTargetOrder, (a: T, b: T) => number> = {
    snr: () => 0,
    dips: (a, b) => b.dipCount - a.dipCount,
    consensus: (a, b) => score(b) - score(a),
  };
  return [...targets].sort((a, b) => lead[order](a, b) || byServer(a, b));
}

/** The follow-up list highest priority first; candidates without a priority last, oldest first. */
export function orderByPriority<T extends { id: number; priority: number | null }>(
  candidates: readonly T[],
): T[] {
  return [...candidates].sort(
    (a, b) =>
      (b.priority ?? Number.NEGATIVE_INFINITY) - (a.priority ?? Number.NEGATIVE_INFINITY) || a.id - b.id,
  );
}
