/**
 * The column description shared by Dipdeck's export formats (CSV, JSON, VOTable) and the one place a
 * row's values are checked against it, so the three files of one export always agree.
 */

export type ColumnType = 'int' | 'double' | 'char' | 'boolean';

export interface Column {
  /** The column's name in every format: a CSV header cell, a JSON key, a VOTable FIELD name. */
  name: string;
  type: ColumnType;
  /**
   * A VOUnit string (IVOA VOUnits 1.0) that astropy.units parses without warnings; see {@link UNIT}.
   * Leave it off dimensionless columns: astropy warns on '---'.
   */
  unit?: string;
  /** An IVOA UCD1+ word list, e.g. 'time.period'; see {@link UCD}. */
  ucd?: string;
  description: string;
}

/** One exported row: values keyed by column name. A missing key is a null cell. */
export type ExportRow = Readonly<Record<string, unknown>>;
export type ExportRows = AsyncIterable<ExportRow> | Iterable<ExportRow>;

/** A cell after checking: null for an empty cell, otherwise the column type's value. */
export type Cell = number | string | boolean | null;

/** What every export states, in each format's own way (CSV comment, JSON field, VOTable INFO). */
export const CAUTION =
  'Candidates are not confirmed planets: each is a target whose dips volunteers found and a scientist ' +
  'promoted for follow-up; its disposition may still change.';

/**
 * VOUnit strings checked with astropy 5.2.1 (astropy.units.Unit(s, format='vounit') with no warning).
 * ppm is not a VOUnit ('ppm' warns "not supported by the VOUnit standard"), so it is written as the scale
 * factor 1e-6 of a dimensionless ratio (VOUnits 1.0 allows a leading numeric scale factor); astropy reads
 * it back as the unit 1e-06.
 */
export const UNIT = {
  days: 'd',
  hours: 'h',
  ppm: '1e-6',
  degrees: 'deg',
  magnitude: 'mag',
  kelvin: 'K',
  solarRadius: 'solRad',
  solarMass: 'solMass',
} as const;

/** UCD1+ words checked with astropy.io.votable.ucd.check_ucd(…, check_controlled_vocabulary=True). */
export const UCD = {
  mainId: 'meta.id;meta.main',
  id: 'meta.id',
  ra: 'pos.eq.ra;meta.main',
  dec: 'pos.eq.dec;meta.main',
  epoch: 'time.epoch',
  epochError: 'stat.error;time.epoch',
  period: 'time.period',
  periodError: 'stat.error;time.period',
  duration: 'time.duration',
  depth: 'phot.flux;arith.ratio',
  windowStart: 'time.start',
  windowEnd: 'time.end',
  magnitude: 'phot.mag',
  stellarRadius: 'phys.size.radius',
  probability: 'stat.probability',
  snr: 'stat.snr',
  count: 'meta.number',
  disposition: 'meta.code.class',
  note: 'meta.note',
} as const;

function describe(value: unknown): string {
  return typeof value === 'string' ? JSON.stringify(value) : `${String(value)} (${typeof value})`;
}

/**
 * Checks one value against its column: int takes a safe integer, double a number (NaN is a null cell),
 * char a string, boolean a boolean; null and undefined are null cells.
 * @throws Error naming the column and the value when it does not fit, or for an infinite double.
 */
export function cellOf(column: Column, value: unknown): Cell {
  if (value === null || value === undefined) return null;
  switch (column.type) {
    case 'int':
      if (typeof value === 'number' && Number.isSafeInteger(value)) return value;
      break;
    case 'double':
      if (typeof value === 'number') {
        if (Number.isNaN(value)) return null;
        if (Number.isFinite(value)) return value;
      }
      break;
    case 'char':
      if (typeof value === 'string') return value;
      break;
    case 'boolean':
      if (typeof value === 'boolean') return value;
      break;
  }
  const allowed = {
    int: 'a safe integer',
    double: 'a finite number or NaN',
    char: 'a string',
    boolean: 'a boolean',
  }[column.type];
  throw new Error(`column ${column.name} (${column.type}) takes ${allowed} or null, got ${describe(value)}`);
}

/** The row's cells in column order. */
export function cellsOf(columns: readonly Column[], row: ExportRow): Cell[] {
  return columns.map((column) => cellOf(column, row[column.name]));
}
