// Which columns of a table hold the time, flux, flux error, quality flag and target name: chosen by
// the uploader (by name or 0-based index) or found by the common names archives and pipelines use.
import type { TimeSystem } from '../types';
import { ReaderError } from './reader-error';

/** A column named as in the file's header (case-insensitive), or its 0-based position. */
export type ColumnRef = string | number;

/** The uploader's choice of columns; a field left out is found by name, `null` means "none". */
export interface ColumnChoice {
  time?: ColumnRef;
  flux?: ColumnRef;
  fluxErr?: ColumnRef | null;
  quality?: ColumnRef | null;
  objectName?: ColumnRef | null;
}

/** 0-based positions of the columns a reader will use. */
export interface ChosenColumns {
  time: number;
  flux: number;
  fluxErr: number | null;
  quality: number | null;
  objectName: number | null;
}

type Role = keyof ChosenColumns;

// Names in order of preference, after normaliseColumnName. Systematics-corrected flux (PDCSAP) comes
// before simple aperture flux, as the Kepler and TESS archives recommend for transit searches.
export const TIME_NAMES = ['time', 't', 'bjd_tdb', 'bjd', 'btjd', 'bkjd', 'jd', 'mjd', 'hjd'] as const;
export const FLUX_NAMES = ['pdcsap_flux', 'flux', 'relative_flux', 'rel_flux', 'sap_flux', 'f'] as const;
export const FLUX_ERR_NAMES = [
  'flux_err',
  'flux_error',
  'fluxerr',
  'err',
  'error',
  'e_flux',
  'sigma',
] as const;
export const QUALITY_NAMES = ['quality', 'quality_flag', 'flag', 'flags'] as const;
export const OBJECT_NAMES = ['object', 'object_name', 'target', 'target_name', 'star', 'name'] as const;

// No real column name is longer; cutting there keeps the work per name small on hostile input.
const MAX_NAME_LENGTH = 200;

/** Splits "TIME [d]" into "TIME" and "d"; the unit is null when the name does not end in brackets. */
function splitUnit(name: string): { bare: string; unit: string | null } {
  const text = name.slice(0, MAX_NAME_LENGTH).trim();
  const close = text[text.length - 1];
  if (close !== ')' && close !== ']') return { bare: text, unit: null };
  const open = text.lastIndexOf(close === ')' ? '(' : '[');
  if (open < 0) return { bare: text, unit: null };
  const unit = text.slice(open + 1, -1).trim();
  return { bare: text.slice(0, open).trim(), unit: unit === '' ? null : unit };
}

function stripQuotes(text: string): string {
  let start = 0;
  let end = text.length;
  while (start < end && (text[start] === '"' || text[start] === "'")) start += 1;
  while (end > start && (text[end - 1] === '"' || text[end - 1] === "'")) end -= 1;
  return text.slice(start, end);
}

/**
 * The form in which column names are compared: lower case, surrounding quotes and a trailing unit in
 * brackets removed ("TIME [d]" → "time"), runs of spaces and hyphens made one underscore.
 *
 * @param name - a column name as written in the file (only its first 200 characters count)
 * @returns the normalised name
 */
export function normaliseColumnName(name: string): string {
  return splitUnit(stripQuotes(name.slice(0, MAX_NAME_LENGTH).trim()))
    .bare.toLowerCase()
    .replace(/[\s-]+/g, '_');
}

/**
 * The unit written in brackets after a column name ("time (s)" → "s"), or null.
 *
 * @param name - a column name as written in the file
 */
export function unitInColumnName(name: string): string | null {
  return splitUnit(stripQuotes(name.slice(0, MAX_NAME_LENGTH).trim())).unit;
}

function describeNames(names: readonly string[]): string {
  if (names.length === 0) return 'none';
  const shown = names
    .slice(0, 30)
    .map((name, index) => (name.trim() ? name.trim().slice(0, 40) : `(unnamed column ${index})`));
  return `${shown.join(', ')}${names.length > 30 ? `, … (${names.length} in all)` : ''}`;
}

function resolveRef(ref: ColumnRef, role: Role, names: readonly string[]): number {
  if (typeof ref === 'number') {
    if (!Number.isInteger(ref) || ref < 0 || ref >= names.length) {
      throw new ReaderError(
        `column ${ref} chosen for ${role} does not exist: the file has ${names.length} columns, numbered 0 to ${names.length - 1}`,
      );
    }
    return ref;
  }
  const exact = names.findIndex((name) => name.trim().toLowerCase() === ref.trim().toLowerCase());
  if (exact >= 0) return exact;
  const wanted = normaliseColumnName(ref);
  const loose = names.findIndex((name) => normaliseColumnName(name) === wanted);
  if (loose >= 0 && wanted !== '') return loose;
  throw new ReaderError(
    `column '${ref.slice(0, 40)}' chosen for ${role} is not in the file; columns found: ${describeNames(names)}`,
  );
}

function findByName(
  candidates: readonly string[],
  normalised: readonly string[],
  taken: Set<number>,
): number | null {
  for (const candidate of candidates) {
    const index = normalised.findIndex((name, i) => name === candidate && !taken.has(i));
    if (index >= 0) return index;
  }
  return null;
}

/**
 * Chooses the columns a light curve is read from: the uploader's choice where given, else the first
 * column whose normalised name is a common name for the role (see TIME_NAMES, FLUX_NAMES, …). The
 * flux error is looked for first as `<flux name>_err`, so PDCSAP_FLUX pairs with PDCSAP_FLUX_ERR.
 *
 * @param names - the table's column names in order ('' for an unnamed column)
 * @param choice - the uploader's choice; omitted fields are found by name, `null` means none
 * @returns 0-based positions; fluxErr, quality and objectName are null when absent
 * @throws ReaderError when no time or flux column can be found (naming what is missing and the
 *   columns found), when a chosen column does not exist, or when one column is chosen twice
 */
export function chooseColumns(names: readonly string[], choice: ColumnChoice = {}): ChosenColumns {
  const normalised = names.map(normaliseColumnName);
  const taken = new Set<number>();
  const chosen: Partial<Record<Role, number | null>> = {};
  const roles: Role[] = ['time', 'flux', 'fluxErr', 'quality', 'objectName'];
  for (const role of roles) {
    const ref = choice[role];
    if (ref === undefined) continue;
    if (ref === null) {
      if (role === 'time' || role === 'flux') throw new ReaderError(`the ${role} column cannot be left out`);
      chosen[role] = null;
      continue;
    }
    const index = resolveRef(ref, role, names);
    if (taken.has(index)) {
      throw new ReaderError(
        `column '${names[index]?.trim().slice(0, 40) || index}' is chosen for two roles; choose one column per role`,
      );
    }
    taken.add(index);
    chosen[role] = index;
  }
  if (chosen.time === undefined) {
    chosen.time = findByName(TIME_NAMES, normalised, taken);
    if (chosen.time !== null) taken.add(chosen.time);
  }
  if (chosen.flux === undefined) {
    chosen.flux = findByName(FLUX_NAMES, normalised, taken);
    if (chosen.flux !== null) taken.add(chosen.flux);
  }
  const missing = (['time', 'flux'] as const).filter((role) => chosen[role] === null);
  if (missing.length > 0) {
    const unnamed = names.every((name) => name.trim() === '');
    const what = missing.map((role) => `a ${role} column`).join(' or ');
    throw new ReaderError(
      unnamed
        ? `the file has no header naming its ${names.length} columns, so ${what} cannot be found by name; choose the columns by their number (0 to ${names.length - 1})`
        : `the file has no ${missing.join(' or ')} column; columns found: ${describeNames(names)}. Expected names like ${missing
            .map((role) => (role === 'time' ? TIME_NAMES : FLUX_NAMES).join('/'))
            .join(' and ')}, or choose the columns`,
    );
  }
  if (chosen.fluxErr === undefined) {
    const fluxName = normalised[chosen.flux as number] ?? '';
    const paired = fluxName ? [`${fluxName}_err`, `${fluxName}_error`, `e_${fluxName}`] : [];
    chosen.fluxErr = findByName([...paired, ...FLUX_ERR_NAMES], normalised, taken);
    if (chosen.fluxErr !== null) taken.add(chosen.fluxErr);
  }
  if (chosen.quality === undefined) {
    chosen.quality = findByName(QUALITY_NAMES, normalised, taken);
    if (chosen.quality !== null) taken.add(chosen.quality);
  }
  if (chosen.objectName === undefined) chosen.objectName = findByName(OBJECT_NAMES, normalised, taken);
  return chosen as ChosenColumns;
}

/**
 * What a time column's name says about its time system: BTJD is BJD_TDB − 2457000 (TESS), BKJD is
 * BJD_TDB − 2454833 (Kepler), BJD_TDB is a full barycentric Julian date in TDB, BJD a full barycentric
 * Julian date in an unstated scale. Other names say nothing (all fields null).
 *
 * @param name - the time column's name as written in the file
 * @returns the TimeSystem fields the name implies; the others null
 */
export function timeSystemFromColumnName(name: string): TimeSystem {
  const none: TimeSystem = { timesys: null, timeref: null, timeunit: null, bjdRefDays: null };
  switch (normaliseColumnName(name)) {
    // TESS Science Data Products Description (BTJD = BJD_TDB − 2457000.0), as lightkurve's TimeBTJD.
    case 'btjd':
      return { ...none, timesys: 'TDB', timeref: 'SOLARSYSTEM', bjdRefDays: 2_457_000 };
    // Kepler Archive Manual §2.3.2 (BKJD = BJD_TDB − 2454833.0), as lightkurve's TimeBKJD.
    case 'bkjd':
      return { ...none, timesys: 'TDB', timeref: 'SOLARSYSTEM', bjdRefDays: 2_454_833 };
    case 'bjd_tdb':
      return { ...none, timesys: 'TDB', timeref: 'SOLARSYSTEM', bjdRefDays: 0 };
    case 'bjd':
      return { ...none, timeref: 'SOLARSYSTEM', bjdRefDays: 0 };
    default:
      return none;
  }
}
