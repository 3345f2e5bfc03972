/**
 * CSV export, one record at a time, as RFC 4180 describes it: CRLF line ends, a header record of the
 * column names, fields holding a comma, a double quote, CR or LF enclosed in double quotes with inner
 * quotes doubled (RFC 4180 §2, rules 1, 3, 6 and 7).
 *
 * Two additions that RFC 4180 does not have:
 * - Comment lines: the file begins with `# ` lines, the caution first. RFC 4180 knows no comments, so a
 *   strict reader needs to be told: astropy `ascii.read(path, format='csv', comment='#')`, pandas
 *   `read_csv(path, comment='#')`. A text field that begins with `#` (or with white space) is quoted so
 *   that such a reader never takes a record for a comment.
 * - Formula injection: a text cell that begins with = + - @, a tab or a CR gets a leading single quote,
 *   as OWASP's "CSV Injection" guidance advises, so a spreadsheet shows it as text. Number columns are
 *   never escaped: -3.5 in a double column stays -3.5.
 */
import { CAUTION, type Cell, type Column, cellsOf, type ExportRows } from './columns';

export interface CsvOptions {
  /** Lines written as `# ` comments after the caution, e.g. the campaign and the export time. */
  preamble?: readonly string[];
}

const CRLF = '\r\n';
const FORMULA_START = /^[=+\-@\t\r]/;
const NEEDS_QUOTES = /[",\r\n]|^[\s#]|\s$/;

/** A text value as one CSV field: formula-escaped, then quoted when it has to be. */
export function csvText(text: string): string {
  const safe = FORMULA_START.test(text) ? `'${text}` : text;
  if (safe === '') return '""';
  return NEEDS_QUOTES.test(safe) ? `"${safe.replaceAll('"', '""')}"` : safe;
}

/** One checked cell as a CSV field; a null cell is an empty field. */
export function csvField(cell: Cell): string {
  if (cell === null) return '';
  if (typeof cell === 'string') return csvText(cell);
  return String(cell);
}

function commentLines(lines: readonly string[]): string {
  return lines
    .flatMap((line) => line.split(/\r\n|\r|\n/))
    .map((line) => `# ${line}${CRLF}`)
    .join('');
}

/**
 * Yields the CSV file piece by piece: the comment lines and header record first, then one CRLF-terminated
 * record per row, reading `rows` only as fast as the consumer pulls.
 * @throws Error from {@link cellsOf} when a row's value does not fit its column.
 */
export async function* csvLines(
  columns: readonly Column[],
  rows: ExportRows,
  options: CsvOptions = {},
): AsyncGenerator<string> {
  yield commentLines([CAUTION, ...(options.preamble ?? [])]) +
    columns.map((column) => csvText(column.name)).join(',') +
    CRLF;
  for await (const row of rows) {
    yield cellsOf(columns, row).map(csvField).join(',') + CRLF;
  }
}
