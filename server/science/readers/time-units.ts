// Time units a file may state for its time column, as multiples of a day.
import { ReaderError } from './reader-error';

// FITS Standard 4.0, 2018, §9.3 (time units, after Rots et al. 2015, A&A 574, A36): s, min, h, d,
// a and yr (Julian year, 365.25 d), cy (Julian century); plus the spelled-out forms uploaders write.
const DAYS_PER_UNIT: Record<string, number> = {
  d: 1,
  day: 1,
  days: 1,
  h: 1 / 24,
  hr: 1 / 24,
  hour: 1 / 24,
  hours: 1 / 24,
  min: 1 / 1440,
  minute: 1 / 1440,
  minutes: 1 / 1440,
  s: 1 / 86_400,
  sec: 1 / 86_400,
  second: 1 / 86_400,
  seconds: 1 / 86_400,
  a: 365.25,
  yr: 365.25,
  cy: 36_525,
};

/** The time units the readers know, for error messages. */
export const KNOWN_TIME_UNITS = Object.keys(DAYS_PER_UNIT);

/**
 * Days per unit for a unit string, or null when the string names none. A unit may sit among other
 * words, as in TESS's TUNIT1 'BJD - 2457000, days'.
 *
 * @param unit - a unit string such as 'd', 's', 'BJD - 2457000, days'
 * @returns days per unit (1 for days), or null when no known unit word is in the string
 */
export function findDaysPerTimeUnit(unit: string): number | null {
  const exact = DAYS_PER_UNIT[unit.trim().toLowerCase()];
  if (exact !== undefined) return exact;
  for (const word of unit.toLowerCase().split(/[^a-z]+/)) {
    // Single letters inside longer text ('BJD - 2457000, d') count only for d and s.
    if (word.length === 1 && word !== 'd' && word !== 's') continue;
    const factor = DAYS_PER_UNIT[word];
    if (factor !== undefined) return factor;
  }
  return null;
}

/**
 * Days per unit of the time column. The column's own unit (FITS TUNITn, or a unit in brackets after a
 * CSV column name) wins when it names a known unit; then the file's TIMEUNIT; with neither, days.
 * FITS Standard 4.0 §9.3 makes seconds TIMEUNIT's default, but light-curve files (Kepler, TESS and
 * the pipelines that follow them) write days, so a file that states nothing is read as days.
 *
 * @param columnUnit - the time column's unit, or null
 * @param timeunit - the TIMEUNIT keyword's value, or null
 * @returns days per unit, > 0
 * @throws ReaderError when TIMEUNIT names no known unit
 */
export function daysPerTimeUnit(columnUnit: string | null, timeunit: string | null): number {
  const fromColumn = columnUnit ? findDaysPerTimeUnit(columnUnit) : null;
  if (fromColumn !== null) return fromColumn;
  if (timeunit === null || timeunit.trim() === '') return 1;
  const fromKeyword = DAYS_PER_UNIT[timeunit.trim().toLowerCase()];
  if (fromKeyword === undefined) {
    throw new ReaderError(
      `TIMEUNIT '${timeunit.slice(0, 40)}' is not a time unit this reader knows; allowed: ${KNOWN_TIME_UNITS.join(', ')}`,
    );
  }
  return fromKeyword;
}
