// A tiny FITS writer for tests and benchmarks: header cards, primary and image HDUs, binary tables.
// It writes stored values as given (no scaling) so tests control every byte; not for production.

const BLOCK = 2880;
const CARD = 80;

/** A header value: numbers are written as integers when whole, else as reals; `{ raw }` as written. */
export type CardValue = string | number | boolean | null | { raw: string };

/** One 80-character card: keyword in bytes 1–8, "= " and the value right-justified to byte 30. */
export function card(keyword: string, value?: CardValue, comment?: string): string {
  let text: string;
  if (value === undefined) {
    text = `${keyword.padEnd(8)}${comment ?? ''}`;
  } else {
    let field: string;
    if (value === null) field = ''.padStart(20);
    else if (typeof value === 'string') field = `'${value.replaceAll("'", "''").padEnd(8)}'`.padEnd(20);
    else if (typeof value === 'boolean') field = (value ? 'T' : 'F').padStart(20);
    else if (typeof value === 'number') field = String(value).toUpperCase().padStart(20);
    else field = value.raw.padStart(20);
    text = `${keyword.padEnd(8)}= ${field}${comment === undefined ? '' : ` / ${comment}`}`;
  }
  if (text.length > CARD) throw new Error(`card too long: ${text}`);
  return text.padEnd(CARD);
}

/** The cards followed by END, padded with spaces to whole 2880-byte blocks. */
export function headerBytes(cards: readonly string[]): Uint8Array {
  const all = [...cards, 'END'.padEnd(CARD)];
  const length = Math.ceil((all.length * CARD) / BLOCK) * BLOCK;
  const bytes = new Uint8Array(length).fill(0x20);
  all.forEach((text, index) => {
    for (let i = 0; i < CARD; i += 1) bytes[index * CARD + i] = text.charCodeAt(i);
  });
  return bytes;
}

function padData(data: Uint8Array): Uint8Array {
  const padded = new Uint8Array(Math.ceil(data.length / BLOCK) * BLOCK);
  padded.set(data);
  return padded;
}

export function concat(...parts: readonly Uint8Array[]): Uint8Array {
  const bytes = new Uint8Array(parts.reduce((sum, part) => sum + part.length, 0));
  let offset = 0;
  for (const part of parts) {
    bytes.set(part, offset);
    offset += part.length;
  }
  return bytes;
}

export interface ImageSpec {
  bitpix: 8 | 16 | 32 | -32 | -64;
  axes: number[];
}

function imageData({ bitpix, axes }: ImageSpec): Uint8Array {
  const count = axes.length === 0 ? 0 : axes.reduce((product, length) => product * length, 1);
  const data = new Uint8Array((count * Math.abs(bitpix)) / 8);
  const view = new DataView(data.buffer);
  for (let i = 0; i < count; i += 1) {
    if (bitpix === 8) view.setUint8(i, i % 256);
    else if (bitpix === 16) view.setInt16(i * 2, i - 100);
    else if (bitpix === 32) view.setInt32(i * 4, i * 1000);
    else if (bitpix === -32) view.setFloat32(i * 4, i / 3);
    else view.setFloat64(i * 8, i / 7);
  }
  return data;
}

/** A primary HDU: SIMPLE, BITPIX, NAXIS (and an image when given), then the extra cards. */
export function primaryHdu(options: { cards?: string[]; image?: ImageSpec } = {}): Uint8Array {
  const image = options.image;
  const cards = [
    card('SIMPLE', true, 'conforms to FITS standard'),
    card('BITPIX', image?.bitpix ?? 8),
    card('NAXIS', image?.axes.length ?? 0),
    ...(image?.axes.map((length, i) => card(`NAXIS${i + 1}`, length)) ?? []),
    card('EXTEND', true),
    ...(options.cards ?? []),
  ];
  return concat(headerBytes(cards), image ? padData(imageData(image)) : new Uint8Array(0));
}

/** An IMAGE extension. */
export function imageHdu(image: ImageSpec, options: { extname?: string; cards?: string[] } = {}): Uint8Array {
  const cards = [
    card('XTENSION', 'IMAGE', 'image extension'),
    card('BITPIX', image.bitpix),
    card('NAXIS', image.axes.length),
    ...image.axes.map((length, i) => card(`NAXIS${i + 1}`, length)),
    card('PCOUNT', 0),
    card('GCOUNT', 1),
    ...(options.extname ? [card('EXTNAME', options.extname)] : []),
    ...(options.cards ?? []),
  ];
  return concat(headerBytes(cards), padData(imageData(image)));
}

/** A stored cell: a number (or bigint for K), a boolean or null for L, a string for A, an array for repeat > 1. */
export type CellValue = number | bigint | boolean | string | null | readonly number[];

export interface TableColumnSpec {
  name?: string;
  /** TFORMn, e.g. 'D', '1E', '2D', '8A', 'L'. */
  form: string;
  unit?: string;
  scale?: number;
  zero?: number;
  tnull?: number;
  values: readonly CellValue[];
}

const TYPE_BYTES: Record<string, number> = { L: 1, B: 1, I: 2, J: 4, K: 8, A: 1, E: 4, D: 8, P: 8 };

function parseForm(form: string): { repeat: number; type: string; width: number } {
  const match = /^(\d*)([A-Z])/.exec(form);
  if (!match) throw new Error(`bad form ${form}`);
  const repeat = match[1] ? Number(match[1]) : 1;
  const type = match[2]!;
  return { repeat, type, width: repeat * (TYPE_BYTES[type] ?? 1) };
}

function writeElement(
  view: DataView,
  offset: number,
  type: string,
  value: number | bigint | boolean | null,
): void {
  switch (type) {
    case 'L':
      view.setUint8(offset, value === null ? 0 : value ? 0x54 : 0x46);
      break;
    case 'B':
      view.setUint8(offset, Number(value));
      break;
    case 'I':
      view.setInt16(offset, Number(value));
      break;
    case 'J':
      view.setInt32(offset, Number(value));
      break;
    case 'K':
      view.setBigInt64(offset, typeof value === 'bigint' ? value : BigInt(Number(value)));
      break;
    case 'E':
      view.setFloat32(offset, Number(value));
      break;
    case 'D':
      view.setFloat64(offset, Number(value));
      break;
    default:
      break; // P and others: left as zero bytes
  }
}

/** The data bytes of a binary table, big-endian, without fill. */
export function tableData(columns: readonly TableColumnSpec[], rows: number): Uint8Array {
  const layouts = columns.map((column) => parseForm(column.form));
  const rowBytes = layouts.reduce((sum, layout) => sum + layout.width, 0);
  const data = new Uint8Array(rowBytes * rows);
  const view = new DataView(data.buffer);
  for (let row = 0; row < rows; row += 1) {
    let offset = row * rowBytes;
    columns.forEach((column, c) => {
      const { repeat, type, width } = layouts[c]!;
      const value = column.values[row] ?? null;
      if (width === 0) {
        // repeat count 0: no bytes
      } else if (type === 'A') {
        const text = String(value ?? '');
        for (let i = 0; i < repeat; i += 1) data[offset + i] = i < text.length ? text.charCodeAt(i) : 0x20;
      } else if (Array.isArray(value)) {
        const size = TYPE_BYTES[type]!;
        for (let i = 0; i < repeat; i += 1) writeElement(view, offset + i * size, type, value[i] ?? 0);
      } else {
        writeElement(view, offset, type, value as number | bigint | boolean | null);
      }
      offset += width;
    });
  }
  return data;
}

/** A BINTABLE extension. `cards` come after the column keywords; `rows` defaults to the longest column. */
export function binTableHdu(
  columns: readonly TableColumnSpec[],
  options: { extname?: string; cards?: string[]; rows?: number; naxis2?: number; pad?: boolean } = {},
): Uint8Array {
  const rows = options.rows ?? Math.max(0, ...columns.map((column) => column.values.length));
  const rowBytes = columns.reduce((sum, column) => sum + parseForm(column.form).width, 0);
  const cards = [
    card('XTENSION', 'BINTABLE', 'binary table extension'),
    card('BITPIX', 8),
    card('NAXIS', 2),
    card('NAXIS1', rowBytes),
    card('NAXIS2', options.naxis2 ?? rows),
    card('PCOUNT', 0),
    card('GCOUNT', 1),
    card('TFIELDS', columns.length),
  ];
  columns.forEach((column, i) => {
    const n = i + 1;
    if (column.name !== undefined) cards.push(card(`TTYPE${n}`, column.name));
    cards.push(card(`TFORM${n}`, column.form));
    if (column.unit !== undefined) cards.push(card(`TUNIT${n}`, column.unit));
    if (column.scale !== undefined) cards.push(card(`TSCAL${n}`, column.scale));
    if (column.zero !== undefined) cards.push(card(`TZERO${n}`, column.zero));
    if (column.tnull !== undefined) cards.push(card(`TNULL${n}`, column.tnull));
  });
  if (options.extname) cards.push(card('EXTNAME', options.extname));
  cards.push(...(options.cards ?? []));
  const data = tableData(columns, rows);
  return concat(headerBytes(cards), options.pad === false ? data : padData(data));
}

/** A whole file: a primary HDU (empty when not given) and the extensions. */
export function fitsFile(...hdus: readonly Uint8Array[]): Uint8Array {
  return concat(...hdus);
}

/** A typical light-curve file: empty primary with OBJECT, one 'LIGHTCURVE' table of TIME (D), PDCSAP_FLUX (E), PDCSAP_FLUX_ERR (E), QUALITY (J). */
export function lightCurveFits(
  timeDays: ArrayLike<number>,
  flux: ArrayLike<number>,
  fluxErr: ArrayLike<number>,
  options: { objectName?: string; tableCards?: string[] } = {},
): Uint8Array {
  const rows = timeDays.length;
  const quality = Array.from({ length: rows }, (_, i) => (i % 97 === 0 ? 1 : 0));
  return fitsFile(
    primaryHdu({ cards: options.objectName ? [card('OBJECT', options.objectName)] : [] }),
    binTableHdu(
      [
        { name: 'TIME', form: 'D', unit: 'BJD - 2457000, days', values: Array.from(timeDays) },
        { name: 'PDCSAP_FLUX', form: 'E', unit: 'e-/s', values: Array.from(flux) },
        { name: 'PDCSAP_FLUX_ERR', form: 'E', unit: 'e-/s', values: Array.from(fluxErr) },
        { name: 'QUALITY', form: 'J', values: quality },
      ],
      {
        extname: 'LIGHTCURVE',
        cards: options.tableCards ?? [
          card('TIMESYS', 'TDB'),
          card('TIMEREF', 'SOLARSYSTEM'),
          card('TIMEUNIT', 'd'),
          card('BJDREFI', 2457000),
          card('BJDREFF', { raw: '0.0' }),
        ],
      },
    ),
  );
}
