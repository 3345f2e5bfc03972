/** Reading a target's vetting: numbers with their errors, verdicts and where the transit came from. */

export type VettingSource = 'period-search' | 'dip';
export type DiagnosticVerdict = 'pass' | 'warn';

export const vettingSourceLabels: Record<VettingSource, string> = {
  'period-search': 'the latest period search (BLS)',
  dip: 'the strongest dip, taken as a single transit',
};

/** Written next to the badge's colour, so the verdict does not rest on colour alone. */
export const verdictLabels: Record<DiagnosticVerdict, string> = { pass: 'Pass', warn: 'Warn' };
export const verdictTones = { pass: 'success', warn: 'amber' } as const satisfies Record<
  DiagnosticVerdict,
  'success' | 'amber'
>;

/**
 * Decimals that show an error to `significant` figures (1.9e-2 → 3 for two figures), held to 0–8;
 * null when the error is zero or missing, so the caller picks its own.
 */
export function decimalsForError(error: number | null | undefined, significant = 2): number | null {
  if (error === null || error === undefined || !Number.isFinite(error) || error <= 0) return null;
  const decimals = significant - 1 - Math.floor(Math.log10(error));
  return Math.min(8, Math.max(0, decimals));
}

/**
 * A value with its error, rounded to the error's two significant figures: "3.750 ± 0.019 R⊕".
 * Without an error (none measured, or zero), the value alone with `fallbackDigits` decimals.
 */
export function formatMeasurement(
  value: number | null | undefined,
  error: number | null | undefined,
  unit = '',
  fallbackDigits = 2,
): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const suffix = unit ? ` ${unit}` : '';
  const decimals = decimalsForError(error);
  const sign = (text: string) => text.replace(/^-/, '−');
  if (decimals === null) return `${sign(value.toFixed(fallbackDigits))}${suffix}`;
  return `${sign(value.toFixed(decimals))} ± ${error!.toFixed(decimals)}${suffix}`;
}

/** Whether a measurement has an error to show (servers send 0 where none was measured). */
export function hasError(error: number | null | undefined): boolean {
  return decimalsForError(error) !== null;
}

/** A probability as a percentage with two decimals, "9.59 %". */
export function formatPercent(probability: number | null | undefined, digits = 2): string {
  if (probability === null || probability === undefined || !Number.isFinite(probability)) return '—';
  return `${(probability * 100).toFixed(digits)} %`;
}

/** "about 1 in 10": the transit probability read as how many such orbits there are per one we see. */
export function oneIn(probability: number | null | undefined): string {
  if (probability === null || probability === undefined || !(probability > 0)) return '—';
  return `about 1 in ${Math.round(1 / probability)}`;
}

/** A diagnostic's number as sent, with a true minus; the server rounds it already. */
export function formatDiagnosticValue(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  return String(value).replace(/^-/, '−');
}

/** How many of the diagnostics warn, for the section's summary line. */
export function warningCount(diagnostics: readonly { verdict: string }[]): number {
  return diagnostics.filter((diagnostic) => diagnostic.verdict === 'warn').length;
}
