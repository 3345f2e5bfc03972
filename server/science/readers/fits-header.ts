// FITS header cards and headers. There is no well-maintained FITS reader on npm, so this is our own,
// kept small and strict: it reads what the standard allows and names the card when something is not.
import { ReaderError } from './reader-error';

/** FITS Standard 4.0 §3.1: a file is a sequence of 2880-byte blocks. */
export const FITS_BLOCK_BYTES = 2880;
/** FITS Standard 4.0 §4.1: a header card is 80 ASCII characters. */
export const FITS_CARD_BYTES = 80;
const CARDS_PER_BLOCK = FITS_BLOCK_BYTES / FITS_CARD_BYTES;

/** A keyword's value: string, logical, number; null for an undefined value (§4.2.3 "undefined"). */
export type FitsValue = string | boolean | number | null;

/** What the value field held (§4.2): kept so integers can be told from reals. */
export type FitsValueKind =
  | 'string'
  | 'logical'
  | 'integer'
  | 'real'
  | 'complex'
  | 'undefined'
  | 'commentary';

/** One 80-character header card. */
export interface FitsCard {
  /** Bytes 1–8, trailing spaces removed; '' for a blank keyword. */
  keyword: string;
  kind: FitsValueKind;
  /** The value; for a complex value the text between the parentheses; for commentary cards the text. */
  value: FitsValue;
  /** The comment after '/', trimmed; '' when there is none. */
  comment: string;
}

/** One HDU's header. */
export interface FitsHeader {
  /** Every card before END, in order. */
  cards: FitsCard[];
  /** Keyword → card, for valued keywords; the first card wins when a keyword repeats. */
  keywords: Map<string, FitsCard>;
  /** Byte offset of the header's first card in the file. */
  startOffset: number;
  /** Byte offset just past the header's last block: where the HDU's data begin. */
  dataOffset: number;
}

// §4.1.2.1: keyword characters are upper-case letters, digits, hyphen and underscore.
const KEYWORD = /^[A-Z0-9_-]*$/;
// §4.2.3 and §4.2.4: integer and real numbers, with E or D exponents for reals.
const INTEGER = /^[+-]?\d+$/;
const REAL = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[EeDd][+-]?\d+)?$/;
// §4.1.2.2: COMMENT, HISTORY and blank keywords have no value; CONTINUE (long strings, §4.2.1.2)
// and HIERARCH (an ESO convention) are read as commentary here.
const COMMENTARY = new Set(['COMMENT', 'HISTORY', '', 'CONTINUE', 'HIERARCH']);

function invalid(where: string, why: string): ReaderError {
  return new ReaderError(`${where} is not valid: ${why}`);
}

/** Reads a value field (bytes 11–80, here as text starting at position 0) into value and comment. */
function parseValueField(field: string, where: string): Pick<FitsCard, 'kind' | 'value' | 'comment'> {
  let position = 0;
  while (position < field.length && field[position] === ' ') position += 1;
  let kind: FitsValueKind;
  let value: FitsValue;
  if (position === field.length || field[position] === '/') {
    kind = 'undefined';
    value = null;
  } else if (field[position] === "'") {
    // §4.2.1.1: a string between single quotes, a quote inside written as two; trailing spaces are
    // not significant, leading ones are.
    let text = '';
    position += 1;
    for (;;) {
      if (position >= field.length) throw invalid(where, 'a string value has no closing quote');
      const character = field[position]!;
      if (character === "'") {
        if (field[position + 1] === "'") {
          text += "'";
          position += 2;
          continue;
        }
        position += 1;
        break;
      }
      text += character;
      position += 1;
    }
    kind = 'string';
    value = text.replace(/ +$/, '');
  } else if (field[position] === '(') {
    // §4.2.5 and §4.2.6: complex values, (real, imaginary); kept as text, no reader needs them.
    const close = field.indexOf(')', position);
    if (close < 0) throw invalid(where, 'a complex value has no closing parenthesis');
    kind = 'complex';
    value = field.slice(position + 1, close).trim();
    position = close + 1;
  } else {
    let end = position;
    while (end < field.length && field[end] !== ' ' && field[end] !== '/') end += 1;
    const token = field.slice(position, end);
    position = end;
    if (token === 'T' || token === 'F') {
      // §4.2.2: logical T or F.
      kind = 'logical';
      value = token === 'T';
    } else if (INTEGER.test(token)) {
      kind = 'integer';
      value = Number(token);
    } else if (REAL.test(token)) {
      kind = 'real';
      value = Number(token.replace(/[Dd]/, 'E'));
    } else {
      throw invalid(where, `'${token}' is not a FITS value (a quoted string, T or F, a number, or (re, im))`);
    }
  }
  while (position < field.length && field[position] === ' ') position += 1;
  let comment = '';
  if (position < field.length) {
    if (field[position] !== '/') {
      throw invalid(
        where,
        `unexpected '${field.slice(position).trim()}' after the value (a comment starts with '/')`,
      );
    }
    comment = field.slice(position + 1).trim();
  }
  return { kind, value, comment };
}

/**
 * Parses one 80-character header card.
 *
 * @param card - exactly 80 characters, each printable ASCII (0x20–0x7E)
 * @param where - how the card is named in error messages, e.g. "HDU 2, header card 37"
 * @returns keyword, kind of value, value and comment
 * @throws ReaderError naming the card when it is not 80 printable ASCII characters, its keyword has
 *   characters other than A–Z, 0–9, '-' and '_', or its value is not a FITS value
 * @see FITS Standard 4.0, 2018 (IAU FITS Working Group), §4.1 and §4.2
 */
export function parseFitsCard(card: string, where = 'the header card'): FitsCard {
  if (card.length !== FITS_CARD_BYTES)
    throw invalid(where, `a card is 80 characters, this one has ${card.length}`);
  for (let i = 0; i < card.length; i += 1) {
    const code = card.charCodeAt(i);
    // §4.1.1: only the printable ASCII characters, hexadecimal 20 to 7E.
    if (code < 0x20 || code > 0x7e) {
      throw invalid(
        where,
        `character ${i + 1} is byte 0x${code.toString(16).padStart(2, '0')}; only printable ASCII is allowed`,
      );
    }
  }
  const keyword = card.slice(0, 8).replace(/ +$/, '');
  // §4.1.2.1: left-justified, no embedded spaces.
  if (!KEYWORD.test(keyword)) {
    throw invalid(where, `keyword '${keyword}' may hold only A-Z, 0-9, '-' and '_'`);
  }
  // §4.1.2.2: a value follows only when bytes 9–10 are "= ".
  if (COMMENTARY.has(keyword) || card.slice(8, 10) !== '= ') {
    return { keyword, kind: 'commentary', value: card.slice(8).replace(/ +$/, ''), comment: '' };
  }
  return { keyword, ...parseValueField(card.slice(10), `${where} (${keyword})`) };
}

/**
 * Reads one HDU's header: 2880-byte blocks of 80-character cards up to the END card.
 *
 * @param bytes - the whole file
 * @param startOffset - where the header starts: 0 or a multiple of 2880 within the file
 * @param hduNumber - the HDU's 1-based number, for error messages (1 is the primary HDU)
 * @returns the header, with where its data begin
 * @throws ReaderError when the file ends before END or a card is not valid
 * @see FITS Standard 4.0, 2018 (IAU FITS Working Group), §3.1, §4.1 and §4.4.1
 */
export function readFitsHeader(bytes: Uint8Array, startOffset: number, hduNumber: number): FitsHeader {
  const cards: FitsCard[] = [];
  const keywords = new Map<string, FitsCard>();
  let offset = startOffset;
  let cardNumber = 0;
  // Each pass reads one whole block, so the loop ends within bytes.length / 2880 passes.
  while (offset + FITS_BLOCK_BYTES <= bytes.length) {
    for (let i = 0; i < CARDS_PER_BLOCK; i += 1) {
      cardNumber += 1;
      const cardStart = offset + i * FITS_CARD_BYTES;
      const text = String.fromCharCode(...bytes.subarray(cardStart, cardStart + FITS_CARD_BYTES));
      const card = parseFitsCard(text, `HDU ${hduNumber}, header card ${cardNumber}`);
      if (card.keyword === 'END') {
        return { cards, keywords, startOffset, dataOffset: offset + FITS_BLOCK_BYTES };
      }
      cards.push(card);
      if (card.kind !== 'commentary' && !keywords.has(card.keyword)) keywords.set(card.keyword, card);
    }
    offset += FITS_BLOCK_BYTES;
  }
  const found = bytes.length - startOffset;
  throw new ReaderError(
    cardNumber === 0
      ? `truncated header: HDU ${hduNumber} needs at least one 2880-byte block, found ${found} bytes`
      : `truncated header: the file ends after ${cardNumber} cards of HDU ${hduNumber} without an END card`,
  );
}

/** The value of a keyword, or undefined when the header does not have it. */
export function headerValue(header: FitsHeader, keyword: string): FitsValue | undefined {
  return header.keywords.get(keyword)?.value;
}

/**
 * An integer keyword's value.
 *
 * @throws ReaderError when it is missing (and required) or not an integer in [min, max]
 */
export function headerInteger(
  header: FitsHeader,
  keyword: string,
  hduNumber: number,
  range: { min: number; max?: number },
  required: true,
): number;
export function headerInteger(
  header: FitsHeader,
  keyword: string,
  hduNumber: number,
  range: { min: number; max?: number },
  required: false,
): number | null;
export function headerInteger(
  header: FitsHeader,
  keyword: string,
  hduNumber: number,
  range: { min: number; max?: number },
  required: boolean,
): number | null {
  const card = header.keywords.get(keyword);
  if (!card) {
    if (required)
      throw new ReaderError(`HDU ${hduNumber} has no ${keyword} keyword, which the FITS Standard requires`);
    return null;
  }
  const value = card.value;
  if (card.kind !== 'integer' || typeof value !== 'number') {
    throw new ReaderError(`${keyword} in HDU ${hduNumber} must be an integer, got ${describeValue(card)}`);
  }
  if (value < range.min || (range.max !== undefined && value > range.max)) {
    const allowed = range.max === undefined ? `at least ${range.min}` : `from ${range.min} to ${range.max}`;
    throw new ReaderError(`${keyword} in HDU ${hduNumber} must be ${allowed}, got ${value}`);
  }
  return value;
}

/**
 * A real (or integer) keyword's value, or null when absent.
 *
 * @throws ReaderError when present but not a number
 */
export function headerNumber(header: FitsHeader, keyword: string, hduNumber: number): number | null {
  const card = header.keywords.get(keyword);
  if (!card || card.kind === 'undefined') return null;
  if ((card.kind !== 'integer' && card.kind !== 'real') || typeof card.value !== 'number') {
    throw new ReaderError(`${keyword} in HDU ${hduNumber} must be a number, got ${describeValue(card)}`);
  }
  return card.value;
}

/**
 * A string keyword's value, or null when absent.
 *
 * @throws ReaderError when present but not a string
 */
export function headerString(header: FitsHeader, keyword: string, hduNumber: number): string | null {
  const card = header.keywords.get(keyword);
  if (!card || card.kind === 'undefined') return null;
  if (card.kind !== 'string' || typeof card.value !== 'string') {
    throw new ReaderError(
      `${keyword} in HDU ${hduNumber} must be a quoted string, got ${describeValue(card)}`,
    );
  }
  return card.value;
}

function describeValue(card: FitsCard): string {
  if (card.kind === 'string') return `'${card.value}'`;
  if (card.kind === 'logical') return card.value ? 'T' : 'F';
  if (card.kind === 'undefined') return 'no value';
  return String(card.value);
}
