import { parse } from 'csv-parse/sync';
import type { TargetFields } from '../../db/targets';

// Reading a target catalogue: one row per star. Pure: text in, accepted fields and row reports out.

export interface CatalogueRowReport {
  /** 1-based line of the row in the file (the header is line 1). */
  line: number;
  designation: string | null;
  status: 'accepted' | 'rejected';
  reason?: string;
  /** Fields that were missing and hold a default now. */
  assumed?: string[];
}

export const ASSUMED_DEFAULTS = { stellarRadiusRsun: 1, stellarMassMsun: 1, teffK: 5772 } as const;

const COLUMN_NAMES: Record<keyof Omit<TargetFields, 'assumedFields'>, string[]> = {
  designation: ['designation', 'name', 'target', 'id', 'object'],
  raDeg: ['ra', 'ra_deg', 'raj2000', 'right_ascension'],
  decDeg: ['dec', 'dec_deg', 'dej2000', 'decj2000', 'declination'],
  magnitude: ['magnitude', 'mag', 'tmag', 'vmag', 'kepmag', 'gmag'],
  stellarRadiusRsun: ['stellar_radius', 'radius', 'r_star', 'rstar', 'stellar_radius_rsun', 'radius_rsun'],
  stellarMassMsun: ['stellar_mass', 'mass', 'm_star', 'mstar', 'stellar_mass_msun', 'mass_msun'],
  teffK: ['teff', 'effective_temperature', 'teff_k', 't_eff'],
};

const normalise = (name: string) =>
  name
    .trim()
    .toLowerCase()
    .replace(/[\s-]+/g, '_');

/** RA in degrees, or sexagesimal hours ("14:29:42.9", "14h29m42.9s", "14 29 42.9"). */
export function parseRightAscension(text: string): number | null {
  const value = text.trim();
  if (value === '') return null;
  const parts = value.split(/[:hms\s]+/i).filter(Boolean);
  if (parts.length >= 2) {
    const [h, m, s = 0] = parts.map(Number);
    if ([h, m, s].some((n) => !Number.isFinite(n)) || m! >= 60 || s! >= 60 || m! < 0 || s! < 0)
      return Number.NaN;
    return 15 * (h! + m! / 60 + s! / 3600); // 1 hour of right ascension = 15°
  }
  return Number(value);
}

/** Dec in degrees, or sexagesimal degrees ("-62:40:46", "-62d40m46s", "-62 40 46"). */
export function parseDeclination(text: string): number | null {
  const value = text.trim();
  if (value === '') return null;
  const parts = value
    .replace(/^[+-]/, '')
    .split(/[:dms°'"\s]+/i)
    .filter(Boolean);
  if (parts.length >= 2) {
    const [d, m, s = 0] = parts.map(Number);
    if ([d, m, s].some((n) => !Number.isFinite(n)) || m! >= 60 || s! >= 60 || m! < 0 || s! < 0)
      return Number.NaN;
    const sign = value.startsWith('-') ? -1 : 1;
    return sign * (d! + m! / 60 + s! / 3600);
  }
  return Number(value);
}

function optionalNumber(text: string | undefined): number | null {
  if (text === undefined) return null;
  const value = text.trim();
  if (value === '' || /^(nan|null|na|n\/a|-)$/i.test(value)) return null;
  return Number(value);
}

const RANGES: Record<string, [number, number, string]> = {
  raDeg: [0, 360, 'RA must be between 0° and 360°'],
  decDeg: [-90, 90, 'Dec must be between −90° and +90°'],
  magnitude: [-2, 30, 'magnitude must be between −2 and 30'],
  stellarRadiusRsun: [0.05, 2000, 'stellar radius must be between 0.05 and 2000 R☉'],
  stellarMassMsun: [0.05, 150, 'stellar mass must be between 0.05 and 150 M☉'],
  teffK: [2000, 60000, 'effective temperature must be between 2000 and 60000 K'],
};

export class CatalogueError extends Error {
  override name = 'CatalogueError';
}

/**
 * Parses a catalogue CSV. The header names the columns (common aliases accepted); a designation column
 * is required. Missing radius, mass and temperature are filled with a Sun-like default and listed as
 * assumed. Rows with bad values are rejected with the reason; the rest are accepted.
 * @throws CatalogueError when the file is not a table or has no designation column
 */
export function parseCatalogue(text: string): {
  targets: { line: number; fields: TargetFields }[];
  report: CatalogueRowReport[];
} {
  let rows: string[][];
  try {
    const delimiter = (text.split('\n')[0] ?? '').includes('\t')
      ? '\t'
      : text.split('\n')[0]?.includes(';')
        ? ';'
        : ',';
    rows = parse(text, {
      delimiter,
      comment: '#',
      skip_empty_lines: true,
      relax_column_count: true,
      trim: true,
      bom: true,
    });
  } catch (error) {
    throw new CatalogueError(`The catalogue is not a readable CSV: ${(error as Error).message}`);
  }
  const header = rows[0];
  if (!header || rows.length < 2)
    throw new CatalogueError('The catalogue needs a header row and at least one star');
  const names = header.map(normalise);
  const index = Object.fromEntries(
    Object.entries(COLUMN_NAMES).map(([field, aliases]) => [
      field,
      names.findIndex((name) => aliases.includes(name)),
    ]),
  ) as Record<keyof typeof COLUMN_NAMES, number>;
  if (index.designation < 0) {
    throw new CatalogueError(`The catalogue has no designation column (found: ${header.join(', ')})`);
  }
  const targets: { line: number; fields: TargetFields }[] = [];
  const report: CatalogueRowReport[] = [];
  const seen = new Set<string>();
  for (const [position, cells] of rows.slice(1).entries()) {
    const line = position + 2;
    const cell = (field: keyof typeof COLUMN_NAMES) => (index[field] >= 0 ? cells[index[field]] : undefined);
    const designation = (cell('designation') ?? '').trim();
    const reject = (reason: string) =>
      report.push({ line, designation: designation || null, status: 'rejected', reason });
    if (!designation) {
      reject('no designation');
      continue;
    }
    if (designation.length > 64) {
      reject('designation longer than 64 characters');
      continue;
    }
    if (seen.has(designation)) {
      reject('designation repeated in this file');
      continue;
    }
    const fields: TargetFields = {
      designation,
      raDeg: cell('raDeg') === undefined ? null : parseRightAscension(cell('raDeg')!),
      decDeg: cell('decDeg') === undefined ? null : parseDeclination(cell('decDeg')!),
      magnitude: optionalNumber(cell('magnitude')),
      stellarRadiusRsun: optionalNumber(cell('stellarRadiusRsun')),
      stellarMassMsun: optionalNumber(cell('stellarMassMsun')),
      teffK: optionalNumber(cell('teffK')),
      assumedFields: [],
    };
    let problem: string | null = null;
    for (const [field, [min, max, message]] of Object.entries(RANGES)) {
      const value = fields[field as keyof typeof COLUMN_NAMES] as number | null;
      if (value === null) continue;
      if (!Number.isFinite(value) || value < min || value > max) {
        problem = `${message}, got ${cell(field as keyof typeof COLUMN_NAMES)}`;
        break;
      }
    }
    if (problem) {
      reject(problem);
      continue;
    }
    for (const [field, fallback] of Object.entries(ASSUMED_DEFAULTS)) {
      const key = field as keyof typeof ASSUMED_DEFAULTS;
      if (fields[key] === null) {
        fields[key] = fallback;
        fields.assumedFields.push(field);
      }
    }
    seen.add(designation);
    targets.push({ line, fields });
    report.push({
      line,
      designation,
      status: 'accepted',
      ...(fields.assumedFields.length ? { assumed: fields.assumedFields } : {}),
    });
  }
  return { targets, report };
}
