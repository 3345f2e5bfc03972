/**
 * VOTable export (IVOA VOTable 1.4 Recommendation 2019-10-21), TABLEDATA serialization, written one
 * TR at a time. VOTable 1.4 keeps the namespace of 1.3, http://www.ivoa.net/xml/VOTable/v1.3, and is
 * told apart by version="1.4" (astropy 5.2.1 writes 1.4 files with that namespace too).
 *
 * Text columns are FIELDs of datatype unicodeChar, not char: in VOTable 1.4 char holds ASCII only and
 * target names or notes may not. A null cell is an empty TD, which astropy reads as masked for every
 * datatype here without warnings; so no VALUES null is declared.
 */
import { CAUTION, type Cell, type Column, cellsOf, type ExportRows } from './columns';

export interface VotableHead {
  /** The TABLE's name, e.g. 'follow_up_list'. */
  tableName: string;
  /** The campaign, one INFO per entry named campaign.<key>. */
  campaign: Readonly<Record<string, string | number | boolean | null>>;
  exportedAt: Date;
  /** A sentence for the RESOURCE's DESCRIPTION, before the caution. */
  description?: string;
}

const VOTABLE_NAMESPACE = 'http://www.ivoa.net/xml/VOTable/v1.3';
const VOTABLE_SCHEMA = 'http://www.ivoa.net/xml/VOTable/VOTable-1.4.xsd';

// XML 1.0 §2.2 Char: no C0 controls but tab, LF and CR; no lone surrogates; no U+FFFE, U+FFFF.
const NOT_XML_CHAR =
  // biome-ignore lint/suspicious/noControlCharactersInRegex: these are the characters XML 1.0 forbids.
  /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;
const XML_SPECIAL = /[&<>"\t\n\r]/g;
const XML_ENTITY: Record<string, string> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&quot;',
  '\t': '&#9;',
  '\n': '&#10;',
  '\r': '&#13;',
};

/**
 * Text for element content or a double-quoted attribute: & < > " escaped, tab/LF/CR as character
 * references (so attribute normalisation keeps them), characters XML 1.0 forbids replaced by U+FFFD.
 */
export function xmlText(text: string): string {
  return text.replace(NOT_XML_CHAR, '\uFFFD').replace(XML_SPECIAL, (c) => XML_ENTITY[c]!);
}

const DATATYPE = { int: 'int', double: 'double', char: 'unicodeChar', boolean: 'boolean' } as const;

function attribute(name: string, value: string | undefined): string {
  return value === undefined ? '' : ` ${name}="${xmlText(value)}"`;
}

function field(column: Column): string {
  return (
    `<FIELD${attribute('name', column.name)}${attribute('datatype', DATATYPE[column.type])}` +
    `${column.type === 'char' ? ' arraysize="*"' : ''}${attribute('unit', column.unit)}` +
    `${attribute('ucd', column.ucd)}><DESCRIPTION>${xmlText(column.description)}</DESCRIPTION></FIELD>\n`
  );
}

function td(cell: Cell): string {
  if (cell === null) return '<TD/>';
  if (typeof cell === 'string') return `<TD>${xmlText(cell)}</TD>`;
  return `<TD>${String(cell)}</TD>`;
}

/**
 * Yields the VOTable document: declaration, RESOURCE with its DESCRIPTION and INFOs (caution, campaign,
 * export time) and the FIELDs in the first piece, then one TR per row, then the closing tags.
 * @throws Error from {@link cellsOf} when a row's value does not fit its column.
 */
export async function* votableChunks(
  columns: readonly Column[],
  rows: ExportRows,
  head: VotableHead,
): AsyncGenerator<string> {
  const description = head.description ? `${head.description} ${CAUTION}` : CAUTION;
  const infos = [
    ['caution', CAUTION],
    ...Object.entries(head.campaign).map(([key, value]) => [
      `campaign.${key}`,
      value === null ? '' : String(value),
    ]),
    ['exportedAt', head.exportedAt.toISOString()],
  ];
  yield '<?xml version="1.0" encoding="UTF-8"?>\n' +
    `<VOTABLE version="1.4" xmlns="${VOTABLE_NAMESPACE}" ` +
    'xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance" ' +
    `xsi:schemaLocation="${VOTABLE_NAMESPACE} ${VOTABLE_SCHEMA}">\n` +
    '<RESOURCE type="results">\n' +
    `<DESCRIPTION>${xmlText(description)}</DESCRIPTION>\n` +
    infos.map(([name, value]) => `<INFO${attribute('name', name)}${attribute('value', value)}/>\n`).join('') +
    `<TABLE${attribute('name', head.tableName)}>\n` +
    columns.map(field).join('') +
    '<DATA><TABLEDATA>\n';
  for await (const row of rows) {
    yield `<TR>${cellsOf(columns, row).map(td).join('')}</TR>\n`;
  }
  yield '</TABLEDATA></DATA>\n</TABLE>\n</RESOURCE>\n</VOTABLE>\n';
}
