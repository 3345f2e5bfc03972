/**
 * Turning relative flux into what a plot shows: parts per million from the median, against hours or
 * days. Shared by the Lab and (later) the Deck, and kept free of React so it can be tested alone.
 */

export function median(values: readonly (number | null)[]): number | null {
  const finite = values.filter((value): value is number => value !== null && Number.isFinite(value));
  if (finite.length === 0) return null;
  finite.sort((a, b) => a - b);
  const middle = Math.floor(finite.length / 2);
  return finite.length % 2 === 1 ? finite[middle]! : (finite[middle - 1]! + finite[middle]!) / 2;
}

/**
 * Relative flux as ppm from the light curve's median, so a dip of 1 % reads −10 000 whatever the flux
 * was normalised to. A missing or unreadable point stays a gap (null).
 */
export function fluxToPpm(flux: readonly (number | null)[]): (number | null)[] {
  const level = median(flux);
  if (level === null || level === 0) return flux.map(() => null);
  return flux.map((value) =>
    value === null || !Number.isFinite(value) ? null : Math.round((value / level - 1) * 1e6 * 10) / 10,
  );
}

export function daysToHours(days: readonly number[]): number[] {
  return days.map((value) => value * 24);
}

/**
 * A short reading of a value for axes and the cursor: no more digits than the span needs. The cursor
 * asks for extra digits, since it reads one point rather than a tick every few units.
 */
export function formatTick(value: number, spanOfAxis: number, extraDigits = 0): string {
  const span = Math.abs(spanOfAxis);
  const digits = (span >= 10 ? 0 : span >= 1 ? 1 : span >= 0.1 ? 2 : span >= 0.01 ? 3 : 4) + extraDigits;
  // A minus sign, not a hyphen, as in print.
  return value.toFixed(digits).replace(/^-/, '−');
}

/** The fewest decimals that write `value` exactly (up to 6), e.g. 2.5 → 1, 20 → 0, 0.25 → 2. */
export function decimalsOf(value: number): number {
  for (let digits = 0; digits < 6; digits += 1) {
    const scaled = Math.abs(value) * 10 ** digits;
    if (Math.abs(scaled - Math.round(scaled)) < 1e-6 * Math.max(1, scaled)) return digits;
  }
  return 6;
}

/**
 * Axis labels that all carry the digits the step between them needs, so 0, 2.5, 5 reads
 * "0.0, 2.5, 5.0" rather than rounding 2.5 away.
 */
export function formatTicks(splits: readonly number[]): string[] {
  const step = splits.length > 1 ? Math.abs(splits[1]! - splits[0]!) : 0;
  const digits = step > 0 ? decimalsOf(step) : 0;
  return splits.map((value) => value.toFixed(digits).replace(/^-/, '−'));
}
