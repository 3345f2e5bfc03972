// Light curves from FITS binary tables. There is no well-maintained FITS reader on npm, so this is our
// own, small and careful: every size a header claims is checked against the file and the caps before
// anything is allocated, every loop is bounded by the file's length, and every problem is a ReaderError.
import type { LightCurve, TimeSystem } from '../types';
import { type ColumnChoice, chooseColumns } from './columns';
import {
  FITS_BLOCK_BYTES,
  type FitsHeader,
  headerInteger,
  headerNumber,
  headerString,
  headerValue,
  readFitsHeader,
} from './fits-header';
import { checkInputSize, type ReaderLimits, type ResolvedLimits, resolveLimits } from './limits';
import { ReaderError } from './reader-error';
import { daysPerTimeUnit } from './time-units';

/** What an HDU holds. */
export type FitsHduKind = 'primary' | 'image' | 'bintable' | 'table' | 'other';

/** One header-and-data unit. */
export interface FitsHdu {
  /** 1-based; 1 is the primary HDU. */
  number: number;
  kind: FitsHduKind;
  /** XTENSION's value, null for the primary HDU. */
  xtension: string | null;
  /** EXTNAME's value, or null. */
  extname: string | null;
  header: FitsHeader;
  /** Byte offset of the data in the file. */
  dataOffset: number;
  /** Bytes of data, without the fill to a whole block. */
  dataBytes: number;
  /** Byte offset where the next HDU would start. */
  nextOffset: number;
}

/** One column of a binary table (FITS Standard 4.0 §7.3.1). */
export interface FitsColumn {
  /** 0-based position (TTYPE1 is column 0). */
  index: number;
  /** TTYPEn, or '' when the column has none. */
  name: string;
  /** TFORMn as written, e.g. '1D', '20A'. */
  format: string;
  /** The data type letter: L X B I J K A E D C M P Q. */
  type: string;
  repeat: number;
  /** Offset of the field within a row, bytes. */
  byteOffset: number;
  /** Width of the field, bytes. */
  byteWidth: number;
  /** TUNITn, or null. */
  unit: string | null;
  /** TSCALn (default 1) and TZEROn (default 0): physical = zero + scale × stored. */
  scale: number;
  zero: number;
  /** TNULLn: the stored integer that means "no value", or null. */
  nullValue: number | null;
}

/** A binary table's layout. */
export interface FitsTable {
  hdu: FitsHdu;
  /** NAXIS2. */
  rows: number;
  /** NAXIS1. */
  rowBytes: number;
  columns: FitsColumn[];
}

/** Options of readFitsLightCurve. */
export interface FitsReadOptions extends ReaderLimits {
  /** Read the binary table with this EXTNAME (case-insensitive) instead of the first with time and flux. */
  extname?: string;
  columns?: ColumnChoice;
}

// FITS Standard 4.0 §4.4.1.1: a primary header starts with "SIMPLE  =" in bytes 1–9.
const SIMPLE_CARD_START = 'SIMPLE  =';
const BITPIX_VALUES = new Set([8, 16, 32, 64, -32, -64]);
// FITS Standard 4.0 §7.3.1, Table 18: bytes per element of each TFORM data type (X is bits).
const TYPE_BYTES: Record<string, number> = {
  L: 1,
  X: 1,
  B: 1,
  I: 2,
  J: 4,
  K: 8,
  A: 1,
  E: 4,
  D: 8,
  C: 8,
  M: 16,
  P: 8,
  Q: 16,
};
const READABLE_TYPES = 'L, B, I, J, K, A, E, D';
// WHATWG's 'latin1' is windows-1252: every byte maps to one character, which is all A columns need.
const CHARACTERS = new TextDecoder('latin1');

/**
 * Whether the bytes start as a FITS file does: the card "SIMPLE  =".
 *
 * @param bytes - the file, or its first 9 bytes or more
 * @see FITS Standard 4.0, 2018 (IAU FITS Working Group), §4.4.1.1
 */
export function looksLikeFits(bytes: Uint8Array): boolean {
  if (bytes.length < SIMPLE_CARD_START.length) return false;
  for (let i = 0; i < SIMPLE_CARD_START.length; i += 1) {
    if (bytes[i] !== SIMPLE_CARD_START.charCodeAt(i)) return false;
  }
  return true;
}

function describeHdu(hdu: FitsHdu): string {
  const kind =
    hdu.kind === 'primary' ? 'primary' : hdu.xtension === null ? hdu.kind : `${hdu.xtension.trim()}`;
  return `HDU ${hdu.number} (${kind}${hdu.extname ? ` '${hdu.extname}'` : ''})`;
}

function hduKind(xtension: string | null): FitsHduKind {
  if (xtension === null) return 'primary';
  const name = xtension.trim().toUpperCase();
  if (name === 'BINTABLE') return 'bintable';
  if (name === 'IMAGE') return 'image';
  if (name === 'TABLE') return 'table';
  return 'other';
}

/** Reads the HDU whose header starts at offset and checks the size of its data (§4.4.1). */
function readHdu(bytes: Uint8Array, offset: number, number: number, limits: ResolvedLimits): FitsHdu {
  const header = readFitsHeader(bytes, offset, number);
  const first = header.cards[0];
  const isPrimary = number === 1;
  if (isPrimary) {
    if (first?.keyword !== 'SIMPLE') throw new ReaderError('not a FITS file: the first card is not SIMPLE');
    if (first.value !== true) {
      throw new ReaderError(
        'SIMPLE = F: the file says it does not conform to the FITS Standard, so it is not read',
      );
    }
  } else if (first?.keyword !== 'XTENSION' || typeof first.value !== 'string') {
    throw new ReaderError(`HDU ${number} does not start with an XTENSION card holding a string`);
  }
  const bitpix = headerInteger(header, 'BITPIX', number, { min: -64, max: 64 }, true);
  if (!BITPIX_VALUES.has(bitpix)) {
    throw new ReaderError(`BITPIX in HDU ${number} must be one of 8, 16, 32, 64, -32, -64, got ${bitpix}`);
  }
  const naxis = headerInteger(header, 'NAXIS', number, { min: 0, max: 999 }, true);
  const axes: number[] = [];
  for (let i = 1; i <= naxis; i += 1) axes.push(headerInteger(header, `NAXIS${i}`, number, { min: 0 }, true));
  // §6: random groups have NAXIS1 = 0 and GROUPS = T; NAXIS1 then takes no part in the size.
  const randomGroups = isPrimary && axes[0] === 0 && headerValue(header, 'GROUPS') === true;
  // §4.4.1.2 and §6: PCOUNT and GCOUNT are required in extensions and random groups.
  const hasGroupKeywords = !isPrimary || randomGroups;
  const pcount = hasGroupKeywords ? headerInteger(header, 'PCOUNT', number, { min: 0 }, true) : 0;
  const gcount = hasGroupKeywords ? headerInteger(header, 'GCOUNT', number, { min: 0 }, true) : 1;
  const sizedAxes = randomGroups ? axes.slice(1) : axes;
  // §4.4.1, eq. 2: Nbits = |BITPIX| × GCOUNT × (PCOUNT + NAXIS1 × … × NAXISm); no data when NAXIS = 0.
  let elements = 0;
  if (naxis > 0) {
    elements = sizedAxes.some((length) => length === 0)
      ? 0
      : sizedAxes.reduce((product, length) => product * length, 1);
  }
  const dataBytes = (Math.abs(bitpix) / 8) * gcount * (pcount + elements);
  if (dataBytes > limits.maxBytes || !Number.isFinite(dataBytes)) {
    const claimed = Number.isFinite(dataBytes) ? `${dataBytes}` : 'more than 10^308';
    throw new ReaderError(
      `HDU ${number} claims ${claimed} bytes of data; at most ${limits.maxBytes} bytes are allowed`,
    );
  }
  const xtension = isPrimary ? null : (first.value as string);
  const extname = headerValue(header, 'EXTNAME');
  const paddedBytes = Math.ceil(dataBytes / FITS_BLOCK_BYTES) * FITS_BLOCK_BYTES;
  return {
    number,
    kind: hduKind(xtension),
    xtension,
    extname: typeof extname === 'string' ? extname : null,
    header,
    dataOffset: header.dataOffset,
    dataBytes,
    nextOffset: header.dataOffset + paddedBytes,
  };
}

function checkDataPresent(bytes: Uint8Array, hdu: FitsHdu): void {
  const found = Math.max(0, bytes.length - hdu.dataOffset);
  if (hdu.dataBytes > found) {
    throw new ReaderError(
      `truncated data: ${describeHdu(hdu)} expected ${hdu.dataBytes} bytes of data, found ${found}`,
    );
  }
}

/** Walks the HDUs in order. The walk ends at the end of the file or at bytes that do not start an extension. */
function* walkHdus(bytes: Uint8Array, limits: ResolvedLimits): Generator<FitsHdu> {
  if (!looksLikeFits(bytes)) {
    throw new ReaderError('not a FITS file: it does not start with the card "SIMPLE  = T"');
  }
  let offset = 0;
  let number = 1;
  // Each HDU takes at least one 2880-byte block, so there are at most bytes.length / 2880 passes.
  while (offset < bytes.length) {
    // §3.5: after the last HDU may come special records, which never start with "XTENSION".
    if (number > 1 && !startsWith(bytes, offset, 'XTENSION')) return;
    const hdu = readHdu(bytes, offset, number, limits);
    yield hdu;
    offset = hdu.nextOffset;
    number += 1;
  }
}

function startsWith(bytes: Uint8Array, offset: number, text: string): boolean {
  if (offset + text.length > bytes.length) return false;
  for (let i = 0; i < text.length; i += 1) if (bytes[offset + i] !== text.charCodeAt(i)) return false;
  return true;
}

/**
 * Lists a file's HDUs with their headers and data sizes, checking each HDU's data is in the file.
 *
 * @param bytes - a whole FITS file
 * @param limits - caps on the input size and on the data a header may claim
 * @returns the HDUs in file order, the primary first
 * @throws ReaderError when the bytes are not FITS, a header card is not valid, a mandatory keyword is
 *   missing or wrong, or a header claims more data than the file holds or the cap allows
 * @see FITS Standard 4.0, 2018 (IAU FITS Working Group), §3, §4.4.1, §7
 */
export function listFitsHdus(bytes: Uint8Array, limits: ReaderLimits = {}): FitsHdu[] {
  const resolved = resolveLimits(limits);
  checkInputSize(bytes.length, resolved);
  const hdus: FitsHdu[] = [];
  for (const hdu of walkHdus(bytes, resolved)) {
    checkDataPresent(bytes, hdu);
    hdus.push(hdu);
  }
  return hdus;
}

/**
 * Reads a binary-table extension's layout: rows, row width and its columns' formats.
 *
 * @param hdu - an HDU with XTENSION = 'BINTABLE'
 * @param limits - maxRows caps NAXIS2
 * @returns the table's layout
 * @throws ReaderError when a mandatory keyword is missing or wrong, a TFORMn is not a binary-table
 *   format, the field widths do not add up to NAXIS1, or NAXIS2 is over the row cap
 * @see FITS Standard 4.0, 2018 (IAU FITS Working Group), §7.3
 */
export function readFitsTableLayout(hdu: FitsHdu, limits: ReaderLimits = {}): FitsTable {
  const { maxRows } = resolveLimits(limits);
  const { header, number } = hdu;
  if (hdu.kind !== 'bintable') throw new ReaderError(`${describeHdu(hdu)} is not a binary table`);
  // §7.3.1: BITPIX = 8, NAXIS = 2, GCOUNT = 1, TFIELDS from 0 to 999.
  headerInteger(header, 'BITPIX', number, { min: 8, max: 8 }, true);
  headerInteger(header, 'NAXIS', number, { min: 2, max: 2 }, true);
  headerInteger(header, 'GCOUNT', number, { min: 1, max: 1 }, true);
  const rowBytes = headerInteger(header, 'NAXIS1', number, { min: 0 }, true);
  const rows = headerInteger(header, 'NAXIS2', number, { min: 0 }, true);
  if (rows > maxRows) {
    throw new ReaderError(
      `the table in ${describeHdu(hdu)} claims ${rows} rows; at most ${maxRows} rows are allowed`,
    );
  }
  const fields = headerInteger(header, 'TFIELDS', number, { min: 0, max: 999 }, true);
  const columns: FitsColumn[] = [];
  let byteOffset = 0;
  for (let n = 1; n <= fields; n += 1) {
    const format = headerString(header, `TFORM${n}`, number);
    if (format === null)
      throw new ReaderError(`${describeHdu(hdu)} has no TFORM${n}, which the FITS Standard requires`);
    // §7.3.1: TFORMn = rTa, r the repeat count (default 1), T the type, a anything further.
    const match = /^\s*(\d*)([LXBIJKAEDCMPQ])/.exec(format);
    if (!match) {
      throw new ReaderError(
        `TFORM${n} '${format}' in ${describeHdu(hdu)} is not a binary-table format; allowed: a repeat count and one of L, X, B, I, J, K, A, E, D, C, M, P, Q`,
      );
    }
    const repeat = match[1] ? Number(match[1]) : 1;
    const type = match[2]!;
    const byteWidth = type === 'X' ? Math.ceil(repeat / 8) : repeat * TYPE_BYTES[type]!;
    const scale = headerNumber(header, `TSCAL${n}`, number) ?? 1;
    const zero = headerNumber(header, `TZERO${n}`, number) ?? 0;
    const nullValue = headerInteger(header, `TNULL${n}`, number, { min: Number.NEGATIVE_INFINITY }, false);
    columns.push({
      index: n - 1,
      name: headerString(header, `TTYPE${n}`, number) ?? '',
      format,
      type,
      repeat,
      byteOffset,
      byteWidth,
      unit: headerString(header, `TUNIT${n}`, number),
      scale,
      zero,
      nullValue,
    });
    byteOffset += byteWidth;
  }
  // §7.3.1: NAXIS1 is the sum of the field widths.
  if (byteOffset !== rowBytes) {
    throw new ReaderError(
      `the columns of ${describeHdu(hdu)} take ${byteOffset} bytes per row, but NAXIS1 says ${rowBytes}`,
    );
  }
  return { hdu, rows, rowBytes, columns };
}

function columnLabel(table: FitsTable, column: FitsColumn): string {
  return `column ${column.name ? `'${column.name}'` : column.index} of ${describeHdu(table.hdu)}`;
}

/**
 * Reads one column of a binary table. Numeric columns give physical values, TZEROn + TSCALn × stored,
 * with stored integers equal to TNULLn (and IEEE NaN in E and D columns) as NaN; a column with a
 * repeat count above 1 gives its first element per row. Logical (L) columns give 1 for T, 0 for F and
 * NaN for a null byte. Character (A) columns give strings, cut at the first NUL, trailing spaces removed.
 *
 * @param bytes - the whole file the table was read from
 * @param table - the table's layout, from readFitsTableLayout
 * @param column - one of table.columns
 * @returns a Float64Array of table.rows values, or string[] for an A column
 * @throws ReaderError when the table's data are not all in the file, the column has repeat count 0,
 *   or its type is one this reader does not read (X, C, M, P, Q)
 * @see FITS Standard 4.0, 2018 (IAU FITS Working Group), §7.3.2 and §7.3.3
 */
export function readFitsColumn(
  bytes: Uint8Array,
  table: FitsTable,
  column: FitsColumn,
): Float64Array | string[] {
  const { rows, rowBytes } = table;
  const tableBytes = rows * rowBytes;
  const found = Math.max(0, bytes.length - table.hdu.dataOffset);
  if (tableBytes > found) {
    throw new ReaderError(
      `truncated data: the table in ${describeHdu(table.hdu)} expected ${tableBytes} bytes, found ${found}`,
    );
  }
  if (column.repeat < 1)
    throw new ReaderError(`${columnLabel(table, column)} has repeat count 0: it holds no values`);
  if (!READABLE_TYPES.includes(column.type)) {
    throw new ReaderError(
      `${columnLabel(table, column)} has TFORM '${column.format}', which this reader does not read; readable types: ${READABLE_TYPES}`,
    );
  }
  const start = table.hdu.dataOffset + column.byteOffset;
  if (column.type === 'A') {
    const values: string[] = new Array(rows);
    for (let row = 0; row < rows; row += 1) {
      const offset = start + row * rowBytes;
      let end = offset;
      while (end < offset + column.repeat && bytes[end] !== 0) end += 1;
      values[row] = CHARACTERS.decode(bytes.subarray(offset, end)).replace(/ +$/, '');
    }
    return values;
  }
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const values = new Float64Array(rows);
  // §7.3.2: big-endian throughout; §7.3.3: TNULLn applies to integer types only, compared with the
  // stored value, before TSCALn and TZEROn.
  const nullValue = column.nullValue;
  switch (column.type) {
    case 'L':
      for (let row = 0; row < rows; row += 1) {
        const byte = bytes[start + row * rowBytes];
        values[row] = byte === 0x54 ? 1 : byte === 0x46 ? 0 : Number.NaN; // 'T', 'F', null (0)
      }
      return values;
    case 'B':
      for (let row = 0; row < rows; row += 1) values[row] = view.getUint8(start + row * rowBytes);
      break;
    case 'I':
      for (let row = 0; row < rows; row += 1) values[row] = view.getInt16(start + row * rowBytes);
      break;
    case 'J':
      for (let row = 0; row < rows; row += 1) values[row] = view.getInt32(start + row * rowBytes);
      break;
    case 'K':
      // 64-bit integers become doubles: exact up to 2^53, which covers flux counts and flags.
      for (let row = 0; row < rows; row += 1) values[row] = Number(view.getBigInt64(start + row * rowBytes));
      break;
    case 'E':
      for (let row = 0; row < rows; row += 1) values[row] = view.getFloat32(start + row * rowBytes);
      break;
    default: // 'D'
      for (let row = 0; row < rows; row += 1) values[row] = view.getFloat64(start + row * rowBytes);
  }
  const isInteger = column.type !== 'E' && column.type !== 'D';
  const { scale, zero } = column;
  if (isInteger && nullValue !== null) {
    for (let row = 0; row < rows; row += 1) {
      const stored = values[row]!;
      values[row] = stored === nullValue ? Number.NaN : zero + scale * stored;
    }
  } else if (scale !== 1 || zero !== 0) {
    for (let row = 0; row < rows; row += 1) values[row] = zero + scale * values[row]!;
  }
  return values;
}

function numericColumn(bytes: Uint8Array, table: FitsTable, index: number, role: string): Float64Array {
  const column = table.columns[index]!;
  if (column.type === 'A') {
    throw new ReaderError(
      `${columnLabel(table, column)}, chosen for ${role}, holds text (TFORM '${column.format}'), not numbers`,
    );
  }
  return readFitsColumn(bytes, table, column) as Float64Array;
}

function keyword<T>(
  read: (header: FitsHeader, hduNumber: number) => T | null,
  table: FitsHdu,
  primary: FitsHdu,
): T | null {
  return read(table.header, table.number) ?? read(primary.header, primary.number);
}

// A message names what the file holds, but not all of a file of thousands of HDUs or columns.
const LISTED = 30;
function listed(items: readonly string[], separator: string): string {
  const shown = items.slice(0, LISTED).join(separator);
  return items.length > LISTED ? `${shown}${separator}… (${items.length} in all)` : shown;
}

function nonEmpty(text: string | null): string | null {
  return text === null || text.trim() === '' ? null : text.trim();
}

/**
 * Reads a light curve from a FITS file's binary table: the table named by `extname`, or else the first
 * whose columns include a time and a flux column (TIME with PDCSAP_FLUX, FLUX, SAP_FLUX, … — see
 * chooseColumns). IMAGE and other extensions are skipped by their size. TIMESYS, TIMEREF, TIMEUNIT,
 * BJDREFI + BJDREFF (or BJDREF) and OBJECT come from the table's header, else the primary header.
 * Times are converted to days by the time column's TUNITn or TIMEUNIT (days when neither says).
 *
 * @param bytes - a whole FITS file, at most maxBytes (default 200 MB)
 * @param options - extname, the uploader's column choice, and the caps (maxBytes, maxRows, default
 *   5,000,000 rows)
 * @returns the light curve, times in days; quality nulls read as 0
 * @throws ReaderError for anything wrong with the file: not FITS, an invalid header card, a size over a
 *   cap or beyond the end of the file, no table with a time and a flux column (naming the tables and
 *   columns found), no table with the asked EXTNAME, or a chosen column that holds text
 * @see FITS Standard 4.0, 2018 (IAU FITS Working Group), §4, §7.3 and §9 (time keywords)
 */
export function readFitsLightCurve(bytes: Uint8Array, options: FitsReadOptions = {}): LightCurve {
  const limits = resolveLimits(options);
  checkInputSize(bytes.length, limits);
  let primary: FitsHdu | null = null;
  const seen: string[] = [];
  let hasTable = false;
  let chosen: { table: FitsTable; columns: ReturnType<typeof chooseColumns> } | null = null;
  const wanted = options.extname?.trim().toUpperCase();
  for (const hdu of walkHdus(bytes, limits)) {
    if (primary === null) primary = hdu;
    checkDataPresent(bytes, hdu);
    if (hdu.kind !== 'bintable') {
      seen.push(describeHdu(hdu));
      continue;
    }
    const table = readFitsTableLayout(hdu, limits);
    hasTable = true;
    const names = table.columns.map((column) => column.name);
    seen.push(
      `${describeHdu(hdu)} with columns ${
        listed(
          names.map((name, i) => name || `(unnamed ${i})`),
          ', ',
        ) || 'none'
      }`,
    );
    if (wanted !== undefined) {
      if (hdu.extname?.trim().toUpperCase() !== wanted) continue;
      chosen = { table, columns: chooseColumns(names, options.columns) };
      break;
    }
    try {
      chosen = { table, columns: chooseColumns(names, options.columns) };
      break;
    } catch (error) {
      if (!(error instanceof ReaderError)) throw error;
    }
  }
  if (primary === null) throw new ReaderError('not a FITS file: it has no primary HDU');
  if (chosen === null) {
    const tables = listed(seen, '; ');
    if (wanted !== undefined)
      throw new ReaderError(
        `no binary table has EXTNAME '${options.extname?.slice(0, 40)}'; the file holds ${tables}`,
      );
    throw new ReaderError(
      hasTable
        ? `no table with a time column and a flux column; the file holds ${tables}`
        : `no binary table (XTENSION = 'BINTABLE') in the file; it holds ${tables}`,
    );
  }
  const { table, columns } = chosen;
  const { hdu } = table;
  const timesys = nonEmpty(keyword((h, n) => headerString(h, 'TIMESYS', n), hdu, primary));
  const timeref = nonEmpty(keyword((h, n) => headerString(h, 'TIMEREF', n), hdu, primary));
  const timeunit = nonEmpty(keyword((h, n) => headerString(h, 'TIMEUNIT', n), hdu, primary));
  const bjdRefInteger = keyword((h, n) => headerNumber(h, 'BJDREFI', n), hdu, primary);
  const bjdRefFraction = keyword((h, n) => headerNumber(h, 'BJDREFF', n), hdu, primary);
  // Kepler and TESS write the reference as BJDREFI + BJDREFF (integer and fraction); some files, BJDREF.
  const bjdRefDays =
    bjdRefInteger !== null || bjdRefFraction !== null
      ? (bjdRefInteger ?? 0) + (bjdRefFraction ?? 0)
      : keyword((h, n) => headerNumber(h, 'BJDREF', n), hdu, primary);
  const timeSystem: TimeSystem = { timesys, timeref, timeunit, bjdRefDays };

  const timeColumn = table.columns[columns.time]!;
  const timeDays = numericColumn(bytes, table, columns.time, 'time');
  const daysPerUnit = daysPerTimeUnit(timeColumn.unit, timeunit);
  if (daysPerUnit !== 1)
    for (let i = 0; i < timeDays.length; i += 1) timeDays[i] = timeDays[i]! * daysPerUnit;
  const flux = numericColumn(bytes, table, columns.flux, 'flux');
  const fluxErr =
    columns.fluxErr === null ? null : numericColumn(bytes, table, columns.fluxErr, 'flux error');
  let quality: Int32Array | null = null;
  if (columns.quality !== null) {
    const flags = numericColumn(bytes, table, columns.quality, 'quality');
    quality = new Int32Array(flags.length);
    // A null flag (NaN) reads as 0, "no flag"; flags beyond 32 bits become 1, "bad".
    for (let i = 0; i < flags.length; i += 1) {
      const flag = flags[i]!;
      quality[i] = Number.isNaN(flag) ? 0 : Math.abs(flag) <= 2_147_483_647 ? Math.trunc(flag) : 1;
    }
  }
  let objectName = nonEmpty(keyword((h, n) => headerString(h, 'OBJECT', n), hdu, primary));
  const nameColumn = columns.objectName === null ? undefined : table.columns[columns.objectName];
  if (
    objectName === null &&
    nameColumn &&
    READABLE_TYPES.includes(nameColumn.type) &&
    nameColumn.repeat > 0
  ) {
    const column = nameColumn;
    const values = readFitsColumn(bytes, table, column);
    for (const value of values) {
      const text = typeof value === 'string' ? value.trim() : Number.isNaN(value) ? '' : String(value);
      if (text) {
        objectName = text;
        break;
      }
    }
  }
  return { timeDays, flux, fluxErr, quality, timeSystem, objectName };
}
