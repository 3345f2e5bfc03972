/**
 * JSON export (RFC 8259), written piece by piece so the whole document is never one string:
 * `{"caution": …, "campaign": {…}, "exportedAt": …, "columns": […], "rows": [{…}, …]}`.
 * Rows are objects keyed by column name; numbers stay JSON numbers, a null cell is null.
 */
import { CAUTION, type Column, cellsOf, type ExportRows } from './columns';

export interface JsonExportHead {
  /** The campaign the export comes from, as the route chooses to describe it (id, name, …). */
  campaign: Readonly<Record<string, string | number | boolean | null>>;
  exportedAt: Date;
}

/**
 * Yields the JSON document: the head in the first piece, then one piece per row.
 * @throws Error from {@link cellsOf} when a row's value does not fit its column.
 */
export async function* jsonChunks(
  columns: readonly Column[],
  rows: ExportRows,
  head: JsonExportHead,
): AsyncGenerator<string> {
  const describedColumns = columns.map(({ name, type, unit, ucd, description }) => ({
    name,
    type,
    unit: unit ?? null,
    ucd: ucd ?? null,
    description,
  }));
  const keys = columns.map((column) => JSON.stringify(column.name));
  yield `{"caution":${JSON.stringify(CAUTION)},"campaign":${JSON.stringify(head.campaign)},` +
    `"exportedAt":${JSON.stringify(head.exportedAt.toISOString())},` +
    `"columns":${JSON.stringify(describedColumns)},"rows":[`;
  let separator = '\n';
  for await (const row of rows) {
    const cells = cellsOf(columns, row);
    yield `${separator}{${cells.map((cell, i) => `${keys[i]}:${JSON.stringify(cell)}`).join(',')}}`;
    separator = ',\n';
  }
  yield '\n]}\n';
}
