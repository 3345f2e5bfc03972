// Light curves from delimited text: CSV, TSV, semicolon-separated (with decimal commas) and
// whitespace-separated tables, with '#' comment lines. Quoted fields are parsed by csv-parse; a table
// without a quote character is read straight from the text, which gives the same cells (a test checks)
// and is several times faster on 20,000-row files.
import { parse } from 'csv-parse/sync';
import type { LightCurve, TimeSystem } from '../types';
import {
  type ColumnChoice,
  chooseColumns,
  normaliseColumnName,
  timeSystemFromColumnName,
  unitInColumnName,
} from './columns';
import { checkInputSize, type ReaderLimits, resolveLimits } from './limits';
import { ReaderError } from './reader-error';
import { daysPerTimeUnit } from './time-units';

/** The delimiters the reader detects; 'whitespace' is any run of spaces and tabs. */
export type CsvDelimiter = ',' | '\t' | ';' | 'whitespace';

/** A delimited text table as read, before any column is chosen. */
export interface CsvTable {
  delimiter: CsvDelimiter;
  /** Column names, '' for an unnamed column. */
  columnNames: string[];
  /** Where the names came from: a header row, a '#' comment line before the data, or nowhere. */
  headerSource: 'row' | 'comment' | 'none';
  /** The data rows' cells, trimmed. */
  rows: string[][];
  /** The 1-based line number of each row, for messages. */
  rowLines: number[];
  /** Keywords from comment lines such as `# TIMESYS = TDB` (upper-case keyword → value); the first wins. */
  keywords: Map<string, { value: string; line: number }>;
}

/** Options of readCsvLightCurve. */
export interface CsvReadOptions extends ReaderLimits {
  columns?: ColumnChoice;
}

// Comment keywords read into the light curve, named as the FITS keywords they stand for.
const COMMENT_KEYWORDS = new Set([
  'TIMESYS',
  'TIMEREF',
  'TIMEUNIT',
  'BJDREFI',
  'BJDREFF',
  'BJDREF',
  'OBJECT',
]);
// The value runs to the end of the line, whatever it holds ('s': U+2028 too); keywordValue trims it.
// A `\s*` before it, with `.` stopping at U+2028, made a line of spaces and U+2028 take quadratic time.
const KEYWORD_LINE = /^#+\s*([A-Za-z][A-Za-z0-9_-]*)\s*[=:](.*)$/s;
// Written so that no two branches match the same digits: linear time on any cell, however long.
const DECIMAL = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eEdD][+-]?\d+)?$/;
const MISSING = new Set(['nan', '+nan', '-nan', 'null', 'none', 'na', 'n/a']);
const INFINITY = new Set(['inf', '+inf', 'infinity', '+infinity']);
const NEGATIVE_INFINITY = new Set(['-inf', '-infinity']);
const SAMPLE_LINES = 50;

/**
 * Reads one cell as a number: a decimal number (exponents with e, E, d or D), with a decimal comma
 * allowed when `decimalComma`; '', NaN, nan, null, none, NA → NaN; inf and -inf → ±Infinity.
 *
 * @param cell - the cell's text (surrounding spaces are ignored)
 * @param decimalComma - whether '1,5' means 1.5 (semicolon-separated tables)
 * @returns the number, or null when the cell is not one
 */
export function parseNumberCell(cell: string, decimalComma: boolean): number | null {
  let text = cell.trim();
  if (text === '') return Number.NaN;
  if (decimalComma && text.indexOf(',') >= 0 && text.indexOf('.') < 0) text = text.replace(',', '.');
  if (DECIMAL.test(text)) {
    const value = Number(text);
    // Fortran-style D exponents ("1.5D-03") are not JavaScript numbers.
    return Number.isNaN(value) ? Number(text.replace(/[dD]/, 'e')) : value;
  }
  const lower = text.toLowerCase();
  if (MISSING.has(lower)) return Number.NaN;
  if (INFINITY.has(lower)) return Number.POSITIVE_INFINITY;
  if (NEGATIVE_INFINITY.has(lower)) return Number.NEGATIVE_INFINITY;
  return null;
}

// Clinger's fast path (W. D. Clinger 1990, "How to read floating point numbers accurately", PLDI):
// a decimal with at most 15 digits is an exact double, and so is 10^k for k ≤ 22, so one IEEE
// division gives the correctly rounded value, the same as Number().
const POWERS_OF_TEN = Array.from({ length: 23 }, (_, k) => 10 ** k);
const MAX_FAST_DIGITS = 15;

/** Reads text[start, end) as parseNumberCell would; plain decimals skip the substring and the regex. */
function parseNumberRange(text: string, start: number, end: number, decimalComma: boolean): number | null {
  if (start === end) return Number.NaN;
  let i = start;
  let negative = false;
  let code = text.charCodeAt(i);
  if (code === 45 || code === 43) {
    negative = code === 45;
    i += 1;
  }
  let mantissa = 0;
  let digits = 0;
  let fraction = 0;
  for (; i < end; i += 1) {
    code = text.charCodeAt(i);
    if (code < 48 || code > 57) break;
    mantissa = mantissa * 10 + (code - 48);
    digits += 1;
  }
  if (i < end && (code === 46 || (decimalComma && code === 44))) {
    for (i += 1; i < end; i += 1) {
      code = text.charCodeAt(i);
      if (code < 48 || code > 57) break;
      mantissa = mantissa * 10 + (code - 48);
      digits += 1;
      fraction += 1;
    }
  }
  if (i === end && digits > 0 && digits <= MAX_FAST_DIGITS) {
    const value = mantissa / POWERS_OF_TEN[fraction]!;
    return negative ? -value : value;
  }
  return parseNumberCell(text.slice(start, end), decimalComma);
}

function isNumberCell(cell: string): boolean {
  const value = parseNumberCell(cell, true);
  return value !== null && Number.isFinite(value);
}

function notText(what: string): ReaderError {
  return new ReaderError(
    `not a text table: the file holds binary data (${what}); upload a CSV/TSV text table or a FITS file`,
  );
}

/** Turns the bytes into text: UTF-8 (BOM removed), or UTF-16 when a UTF-16 BOM says so. */
function decodeText(input: Uint8Array | string): string {
  if (typeof input === 'string') return input.replace(/^\uFEFF/, '');
  const utf16 =
    input[0] === 0xff && input[1] === 0xfe
      ? 'utf-16le'
      : input[0] === 0xfe && input[1] === 0xff
        ? 'utf-16be'
        : null;
  if (utf16) {
    // In UTF-16 every character has a zero byte, but no text has the character U+0000 (and a
    // database cannot store it in a name or a message).
    const text = new TextDecoder(utf16).decode(input);
    const nul = text.indexOf('\u0000');
    if (nul >= 0) throw notText(`a NUL character at character ${nul}`);
    return text;
  }
  const nul = input.indexOf(0);
  if (nul >= 0) throw notText(`a NUL byte at offset ${nul}`);
  let ascii = true;
  for (let i = 0; i < input.length; i += 1) {
    if (input[i]! > 0x7f) {
      ascii = false;
      break;
    }
  }
  // Plain ASCII reads the same in every ASCII-based encoding; the one-byte decoder is twice as fast.
  return new TextDecoder(ascii ? 'latin1' : 'utf-8').decode(input);
}

function countOutsideQuotes(line: string, delimiter: string): number {
  let count = 0;
  let quoted = false;
  for (let i = 0; i < line.length; i += 1) {
    const character = line[i];
    if (character === '"') quoted = !quoted;
    else if (character === delimiter && !quoted) count += 1;
  }
  return count;
}

function whitespaceFields(line: string): string[] {
  const trimmed = line.trim();
  return trimmed === '' ? [] : trimmed.split(/[ \t]+/);
}

/**
 * Finds the delimiter of a table from its first lines: tab, semicolon or comma when it occurs the same
 * number of times (outside quotes) on every line, in that order of preference — semicolon before comma
 * because semicolon-separated tables write decimal commas; else whitespace when every line splits into
 * the same number (≥ 2) of fields; else the first of tab, semicolon, comma found on every line; else
 * whitespace. csv-parse's own delimiter discovery does not know decimal commas or whitespace tables.
 *
 * @param lines - non-comment, non-empty lines from the start of the table (the first 50 are used)
 * @returns the delimiter
 */
export function detectDelimiter(lines: readonly string[]): CsvDelimiter {
  const sample = lines.slice(0, SAMPLE_LINES);
  if (sample.length === 0) return 'whitespace';
  const candidates = ['\t', ';', ','] as const;
  const counts = candidates.map((delimiter) => sample.map((line) => countOutsideQuotes(line, delimiter)));
  for (let i = 0; i < candidates.length; i += 1) {
    const perLine = counts[i]!;
    if (perLine[0]! > 0 && perLine.every((count) => count === perLine[0])) return candidates[i]!;
  }
  const fieldCounts = sample.map((line) => whitespaceFields(line).length);
  if (fieldCounts[0]! >= 2 && fieldCounts.every((count) => count === fieldCounts[0])) return 'whitespace';
  for (let i = 0; i < candidates.length; i += 1) {
    if (counts[i]!.every((count) => count > 0)) return candidates[i]!;
  }
  return 'whitespace';
}

function splitLine(line: string, delimiter: CsvDelimiter): string[] {
  if (delimiter === 'whitespace') return whitespaceFields(line);
  const cells = line.split(delimiter);
  for (let i = 0; i < cells.length; i += 1) cells[i] = cells[i]!.trim();
  return cells;
}

function keywordValue(raw: string): string {
  const text = raw.trim();
  const quote = text[0];
  if (quote === "'" || quote === '"') {
    const close = text.indexOf(quote, 1);
    return (close > 0 ? text.slice(1, close) : text.slice(1)).trim();
  }
  const comment = text.indexOf(' /');
  return (comment >= 0 ? text.slice(0, comment) : text).trim();
}

/** The text cut into lines once: data lines as offsets, comments kept for names and keywords. */
interface ScannedText {
  text: string;
  delimiter: CsvDelimiter;
  /** Offsets of each data line's first character and just past its last (no line end). */
  starts: number[];
  ends: number[];
  lineNumbers: number[];
  commentsBeforeData: string[];
  keywords: CsvTable['keywords'];
  /** Whether a data line holds a double quote: then csv-parse reads the table. */
  hasQuote: boolean;
}

function scanText(input: Uint8Array | string, maxBytes: number, maxRows: number): ScannedText {
  checkInputSize(input.length, { maxBytes, maxRows });
  let text = decodeText(input);
  if (text.indexOf('\r') >= 0) text = text.replace(/\r\n?/g, '\n');
  const keywords: CsvTable['keywords'] = new Map();
  const starts: number[] = [];
  const ends: number[] = [];
  const lineNumbers: number[] = [];
  const commentsBeforeData: string[] = [];
  let hasQuote = false;
  let nextQuote = text.indexOf('"');
  let lineNumber = 0;
  // Each pass consumes one line, so the loop ends after at most text.length + 1 passes.
  for (let position = 0; position <= text.length; ) {
    let end = text.indexOf('\n', position);
    if (end < 0) end = text.length;
    lineNumber += 1;
    let first = position;
    while (first < end && (text.charCodeAt(first) === 32 || text.charCodeAt(first) === 9)) first += 1;
    if (first < end && text.charCodeAt(first) === 35) {
      const line = text.slice(first, end);
      if (starts.length === 0) commentsBeforeData.push(line);
      const match = KEYWORD_LINE.exec(line);
      const key = match?.[1]?.toUpperCase();
      if (key && COMMENT_KEYWORDS.has(key) && !keywords.has(key)) {
        keywords.set(key, { value: keywordValue(match![2]!), line: lineNumber });
      }
    } else if (first < end) {
      if (starts.length > maxRows) {
        throw new ReaderError(`the table has more than ${maxRows} rows; at most ${maxRows} rows are allowed`);
      }
      while (nextQuote >= 0 && nextQuote < position) nextQuote = text.indexOf('"', position);
      if (nextQuote >= 0 && nextQuote < end) hasQuote = true;
      starts.push(position);
      ends.push(end);
      lineNumbers.push(lineNumber);
    }
    position = end + 1;
  }
  if (starts.length === 0) throw new ReaderError('the file has no data rows, only comments or empty lines');
  const sample = starts.slice(0, SAMPLE_LINES).map((start, i) => text.slice(start, ends[i]));
  const delimiter = detectDelimiter(sample);
  return { text, delimiter, starts, ends, lineNumbers, commentsBeforeData, keywords, hasQuote };
}

/** Parses the data lines with csv-parse (quoted fields, RFC 4180); empty records are dropped. */
function parseQuoted(scanned: ScannedText): { rows: string[][]; rowLines: number[] } {
  // Only data lines go in, one per line, so a record's line count maps back to the file's line.
  const lines = scanned.starts.map((start, i) => scanned.text.slice(start, scanned.ends[i]));
  let records: { record: string[]; info: { lines: number } }[];
  try {
    records = parse(lines.join('\n'), {
      delimiter: scanned.delimiter,
      info: true,
      relax_column_count: true,
      relax_quotes: true,
      skip_empty_lines: true,
      trim: true,
    }) as unknown as { record: string[]; info: { lines: number } }[];
  } catch (error) {
    throw new ReaderError(
      `the table could not be read: ${error instanceof Error ? error.message : String(error)}`,
    );
  }
  return {
    rows: records.map((entry) => entry.record),
    rowLines: records.map(
      (entry) => scanned.lineNumbers[entry.info.lines - 1] ?? scanned.lineNumbers.at(-1)!,
    ),
  };
}

interface Header {
  columnNames: string[];
  headerSource: CsvTable['headerSource'];
}

/** A first row with no number in it is the header; else the last fitting '#' comment line names the columns. */
function findHeader(first: readonly string[], scanned: ScannedText): Header {
  if (!first.some(isNumberCell)) return { columnNames: [...first], headerSource: 'row' };
  for (let k = scanned.commentsBeforeData.length - 1; k >= 0; k -= 1) {
    const text = scanned.commentsBeforeData[k]!.replace(/^#+/, '').trim();
    const match = KEYWORD_LINE.exec(`#${text}`);
    if (text === '' || (match && COMMENT_KEYWORDS.has(match[1]!.toUpperCase()))) continue;
    let names = splitLine(text, scanned.delimiter);
    if (names.length !== first.length) names = whitespaceFields(text);
    if (names.length === first.length && !names.some(isNumberCell))
      return { columnNames: names, headerSource: 'comment' };
  }
  return { columnNames: first.map(() => ''), headerSource: 'none' };
}

function checkRowCount(rows: number, maxRows: number): void {
  if (rows === 0) throw new ReaderError('the file has a header row but no data rows');
  if (rows > maxRows)
    throw new ReaderError(`the table has ${rows} rows; at most ${maxRows} rows are allowed`);
}

/**
 * Reads a delimited text table: finds the delimiter, skips '#' comment lines (collecting keywords such
 * as `# TIMESYS = TDB` from them), takes the column names from a header row, or else from the last
 * '#' comment line before the data that has as many names as the first row has cells. A line of only
 * spaces and tabs is an empty line.
 *
 * @param input - the file's bytes (UTF-8, or UTF-16 with a BOM) or its text
 * @param limits - caps on the input's bytes and on the number of data rows
 * @returns the table's names, rows and comment keywords
 * @throws ReaderError when the input is binary, over a cap, has no data rows, or has a quoted field
 *   csv-parse cannot read
 * @see RFC 4180 (Common Format and MIME Type for CSV Files), for quoted fields
 */
export function readCsvTable(input: Uint8Array | string, limits: ReaderLimits = {}): CsvTable {
  const { maxBytes, maxRows } = resolveLimits(limits);
  const scanned = scanText(input, maxBytes, maxRows);
  let { rows, rowLines } =
    scanned.hasQuote && scanned.delimiter !== 'whitespace'
      ? parseQuoted(scanned)
      : {
          rows: scanned.starts.map((start, i) =>
            splitLine(scanned.text.slice(start, scanned.ends[i]), scanned.delimiter),
          ),
          rowLines: scanned.lineNumbers,
        };
  if (rows.length === 0) throw new ReaderError('the file has no data rows, only comments or empty lines');
  const header = findHeader(rows[0]!, scanned);
  if (header.headerSource === 'row') {
    rows = rows.slice(1);
    rowLines = rowLines.slice(1);
  }
  checkRowCount(rows.length, maxRows);
  return { delimiter: scanned.delimiter, ...header, rows, rowLines, keywords: scanned.keywords };
}

function describeDelimiter(delimiter: CsvDelimiter): string {
  return delimiter === '\t' ? 'tab' : delimiter === 'whitespace' ? 'whitespace' : `'${delimiter}'`;
}

/** Where the cells of a table come from: split rows (quoted tables) or the text itself. */
interface Cells {
  count: number;
  delimiter: CsvDelimiter;
  columnNames: string[];
  line(row: number): number;
  /** The cell's text, or null when the row has too few cells. */
  cell(row: number, index: number): string | null;
  /** The cell as a number (parseNumberCell), undefined when the row has too few cells. */
  number(row: number, index: number): number | null | undefined;
  cellCount(row: number): number;
}

function rowCells(table: CsvTable): Cells {
  const decimalComma = table.delimiter === ';';
  return {
    count: table.rows.length,
    delimiter: table.delimiter,
    columnNames: table.columnNames,
    line: (row) => table.rowLines[row]!,
    cell: (row, index) => table.rows[row]![index] ?? null,
    number: (row, index) => {
      const cell = table.rows[row]![index];
      return cell === undefined ? undefined : parseNumberCell(cell, decimalComma);
    },
    cellCount: (row) => table.rows[row]!.length,
  };
}

function isBlank(code: number): boolean {
  return code === 32 || code === 9;
}

/** Cells straight from the text, without splitting lines into strings: the fast path for unquoted tables. */
function textCells(scanned: ScannedText, firstRow: number, columnNames: string[]): Cells {
  const { text, delimiter, starts, ends, lineNumbers } = scanned;
  const decimalComma = delimiter === ';';
  const delimiterCode = delimiter === 'whitespace' ? -1 : delimiter.charCodeAt(0);
  const bounds = [0, 0];
  // Finds cell `index` of the row (trimmed) into bounds; false when the row has too few cells.
  const locate = (row: number, index: number): boolean => {
    const end = ends[firstRow + row]!;
    let start = starts[firstRow + row]!;
    if (delimiterCode < 0) {
      while (start < end && isBlank(text.charCodeAt(start))) start += 1;
      for (let skipped = 0; skipped < index; skipped += 1) {
        while (start < end && !isBlank(text.charCodeAt(start))) start += 1;
        while (start < end && isBlank(text.charCodeAt(start))) start += 1;
      }
      if (start >= end) return false;
      let stop = start;
      while (stop < end && !isBlank(text.charCodeAt(stop))) stop += 1;
      bounds[0] = start;
      bounds[1] = stop;
      return true;
    }
    for (let skipped = 0; skipped < index; skipped += 1) {
      const next = text.indexOf(delimiter, start);
      if (next < 0 || next >= end) return false;
      start = next + 1;
    }
    const next = text.indexOf(delimiter, start);
    let stop = next < 0 || next > end ? end : next;
    while (start < stop && isBlank(text.charCodeAt(start))) start += 1;
    while (stop > start && isBlank(text.charCodeAt(stop - 1))) stop -= 1;
    bounds[0] = start;
    bounds[1] = stop;
    return true;
  };
  return {
    count: starts.length - firstRow,
    delimiter,
    columnNames,
    line: (row) => lineNumbers[firstRow + row]!,
    cell: (row, index) => (locate(row, index) ? text.slice(bounds[0], bounds[1]) : null),
    number: (row, index) =>
      locate(row, index) ? parseNumberRange(text, bounds[0]!, bounds[1]!, decimalComma) : undefined,
    cellCount: (row) => splitLine(text.slice(starts[firstRow + row], ends[firstRow + row]), delimiter).length,
  };
}

/**
 * Reads several numeric columns of an unquoted table in one pass over each line. Returns null at the
 * first problem (a short row, a cell that is not a number), so the caller can read column by column
 * and report it precisely.
 */
function readColumnsInOnePass(
  scanned: ScannedText,
  firstRow: number,
  indices: readonly number[],
): Float64Array[] | null {
  const { text, delimiter, starts, ends } = scanned;
  const rows = starts.length - firstRow;
  const decimalComma = delimiter === ';';
  const delimiterCode = delimiter === 'whitespace' ? -1 : delimiter.charCodeAt(0);
  const lastIndex = Math.max(...indices);
  const slotOf = new Int32Array(lastIndex + 1).fill(-1);
  indices.forEach((index, slot) => {
    slotOf[index] = slot;
  });
  const columns = indices.map(() => new Float64Array(rows));
  for (let row = 0; row < rows; row += 1) {
    const end = ends[firstRow + row]!;
    let position = starts[firstRow + row]!;
    for (let index = 0; index <= lastIndex; index += 1) {
      let cellStart = position;
      let cellEnd: number;
      if (delimiterCode < 0) {
        while (cellStart < end && isBlank(text.charCodeAt(cellStart))) cellStart += 1;
        if (cellStart >= end) return null;
        cellEnd = cellStart;
        while (cellEnd < end && !isBlank(text.charCodeAt(cellEnd))) cellEnd += 1;
        position = cellEnd;
      } else {
        if (cellStart > end) return null;
        cellEnd = cellStart;
        while (cellEnd < end && text.charCodeAt(cellEnd) !== delimiterCode) cellEnd += 1;
        position = cellEnd + 1;
        while (cellStart < cellEnd && isBlank(text.charCodeAt(cellStart))) cellStart += 1;
        while (cellEnd > cellStart && isBlank(text.charCodeAt(cellEnd - 1))) cellEnd -= 1;
      }
      const slot = slotOf[index]!;
      if (slot < 0) continue;
      const value = parseNumberRange(text, cellStart, cellEnd, decimalComma);
      if (value === null) return null;
      columns[slot]![row] = value;
    }
  }
  return columns;
}

function readNumbers(cells: Cells, index: number, role: string): Float64Array {
  const values = new Float64Array(cells.count);
  const label = cells.columnNames[index]?.trim();
  const name = label ? `'${label.slice(0, 40)}'` : `${index}`;
  for (let row = 0; row < cells.count; row += 1) {
    const value = cells.number(row, index);
    if (value === undefined) {
      throw new ReaderError(
        `line ${cells.line(row)} has ${cells.cellCount(row)} cells (split at ${describeDelimiter(cells.delimiter)}), but the ${role} column ${name} is cell ${index + 1}`,
      );
    }
    if (value === null) {
      const decimalComma = cells.delimiter === ';';
      throw new ReaderError(
        `line ${cells.line(row)}, ${role} column ${name}: '${cells.cell(row, index)!.slice(0, 40)}' is not a number (allowed: decimal numbers${decimalComma ? ' with a decimal point or comma' : ''}, NaN, nan, null or an empty cell)`,
      );
    }
    values[row] = value;
  }
  return values;
}

function keywordNumber(keywords: CsvTable['keywords'], key: string): number | null {
  const entry = keywords.get(key);
  if (!entry) return null;
  const value = parseNumberCell(entry.value, false);
  if (value === null || !Number.isFinite(value)) {
    throw new ReaderError(
      `comment line ${entry.line}: ${key} must be a number, got '${entry.value.slice(0, 40)}'`,
    );
  }
  return value;
}

function keywordString(keywords: CsvTable['keywords'], key: string): string | null {
  const value = keywords.get(key)?.value.trim();
  return value ? value : null;
}

/**
 * Reads a light curve from a delimited text table (see readCsvTable). Columns are the uploader's
 * choice, else found by their common names (time/t/bjd/btjd/jd/mjd/hjd; flux/pdcsap_flux/sap_flux/
 * f/relative_flux; flux_err/flux_error/err/e_flux/sigma; quality/flag; object/target). The time
 * system comes from comment keywords (`# TIMESYS = TDB`, TIMEREF, TIMEUNIT, BJDREFI + BJDREFF or
 * BJDREF, OBJECT), else from the time column's name (BTJD, BKJD, BJD_TDB); fields neither gives are
 * null. Times are converted to days by a unit in brackets after the time column's name ("time (h)"),
 * else by TIMEUNIT, else taken as days.
 *
 * @param input - the file's bytes or text, at most maxBytes (default 200 MB)
 * @param options - the column choice and caps (maxBytes; maxRows, default 5,000,000)
 * @returns the light curve; empty and NaN cells are NaN, quality blanks 0
 * @throws ReaderError when there is no time or flux column (naming the columns found), a chosen column
 *   does not exist, a cell is not a number (naming the line), the object column names two targets, or
 *   a cap is exceeded
 * @see RFC 4180 (Common Format and MIME Type for CSV Files), for quoted fields
 */
export function readCsvLightCurve(input: Uint8Array | string, options: CsvReadOptions = {}): LightCurve {
  const { maxBytes, maxRows } = resolveLimits(options);
  const scanned = scanText(input, maxBytes, maxRows);
  let cells: Cells;
  let firstRow = -1;
  if (scanned.hasQuote && scanned.delimiter !== 'whitespace') {
    cells = rowCells(readCsvTable(input, options));
  } else {
    const first = splitLine(scanned.text.slice(scanned.starts[0], scanned.ends[0]), scanned.delimiter);
    const header = findHeader(first, scanned);
    firstRow = header.headerSource === 'row' ? 1 : 0;
    checkRowCount(scanned.starts.length - firstRow, maxRows);
    cells = textCells(scanned, firstRow, header.columnNames);
  }
  const names = cells.columnNames;
  const { keywords } = scanned;
  const chosen = chooseColumns(names, options.columns);
  const timeName = names[chosen.time] ?? '';

  const fromName = timeSystemFromColumnName(timeName);
  const bjdRefInteger = keywordNumber(keywords, 'BJDREFI');
  const bjdRefFraction = keywordNumber(keywords, 'BJDREFF');
  const bjdRefKeyword =
    bjdRefInteger !== null || bjdRefFraction !== null
      ? (bjdRefInteger ?? 0) + (bjdRefFraction ?? 0)
      : keywordNumber(keywords, 'BJDREF');
  const timeunit = keywordString(keywords, 'TIMEUNIT');
  const timeSystem: TimeSystem = {
    timesys: keywordString(keywords, 'TIMESYS') ?? fromName.timesys,
    timeref: keywordString(keywords, 'TIMEREF') ?? fromName.timeref,
    timeunit,
    bjdRefDays: bjdRefKeyword ?? fromName.bjdRefDays,
  };

  const daysPerUnit = daysPerTimeUnit(unitInColumnName(timeName), timeunit);
  const roles: [number | null, string][] = [
    [chosen.time, 'time'],
    [chosen.flux, 'flux'],
    [chosen.fluxErr, 'flux error'],
    [chosen.quality, 'quality'],
  ];
  const wanted = roles.filter(([index]) => index !== null).map(([index]) => index as number);
  const inOnePass = firstRow >= 0 ? readColumnsInOnePass(scanned, firstRow, wanted) : null;
  // Without the one-pass result (a quoted table, or a problem to report), read column by column.
  const [timeDays, flux, fluxErr, flags] = roles.map(([index, role]) =>
    index === null ? null : (inOnePass?.[wanted.indexOf(index)] ?? readNumbers(cells, index, role)),
  ) as [Float64Array, Float64Array, Float64Array | null, Float64Array | null];
  if (daysPerUnit !== 1)
    for (let i = 0; i < timeDays.length; i += 1) timeDays[i] = timeDays[i]! * daysPerUnit;
  let quality: Int32Array | null = null;
  if (flags !== null) {
    quality = new Int32Array(flags.length);
    // A blank flag reads as 0, "no flag"; flags beyond 32 bits become 1, "bad".
    for (let i = 0; i < flags.length; i += 1) {
      const flag = flags[i]!;
      quality[i] = Number.isNaN(flag) ? 0 : Math.abs(flag) <= 2_147_483_647 ? Math.trunc(flag) : 1;
    }
  }

  let objectName = keywordString(keywords, 'OBJECT');
  if (objectName === null && chosen.objectName !== null) {
    const index = chosen.objectName;
    for (let row = 0; row < cells.count; row += 1) {
      const cell = cells.cell(row, index)?.trim() ?? '';
      if (cell === '') continue;
      if (objectName === null) objectName = cell;
      else if (cell !== objectName) {
        throw new ReaderError(
          `the file holds more than one target: column '${normaliseColumnName(names[index] ?? '') || index}' has '${objectName.slice(0, 40)}' and, on line ${cells.line(row)}, '${cell.slice(0, 40)}'; upload one target per file`,
        );
      }
    }
  }
  return { timeDays, flux, fluxErr, quality, timeSystem, objectName };
}
