import { describe, expect, it } from 'vitest';
import { parseFitsCard, readFitsHeader } from '../../../../../server/science/readers/fits-header';
import { ReaderError } from '../../../../../server/science/readers/reader-error';
import { card, headerBytes } from './support/fits-writer';

const pad = (text: string) => text.padEnd(80);

describe('parseFitsCard', () => {
  it('reads a quoted string with a doubled quote inside, dropping trailing spaces but keeping leading ones', () => {
    // FITS Standard 4.0 §4.2.1.1: '' inside a string is one quote; trailing spaces are not significant.
    const parsed = parseFitsCard(pad("OBJECT  = '  O''Neil star   ' / the target"));
    expect(parsed).toEqual({
      keyword: 'OBJECT',
      kind: 'string',
      value: "  O'Neil star",
      comment: 'the target',
    });
  });

  it('reads logical, integer and real values, with E and D exponents', () => {
    expect(parseFitsCard(pad('SIMPLE  =                    T'))).toMatchObject({
      kind: 'logical',
      value: true,
    });
    expect(parseFitsCard(pad('EXTEND  =                    F / no'))).toMatchObject({
      kind: 'logical',
      value: false,
    });
    expect(parseFitsCard(pad('NAXIS2  =                 -42'))).toMatchObject({
      kind: 'integer',
      value: -42,
    });
    expect(parseFitsCard(pad('BJDREFF =       0.00074287037'))).toMatchObject({
      kind: 'real',
      value: 0.00074287037,
    });
    expect(parseFitsCard(pad('TSCAL1  =              1.5D-03'))).toMatchObject({
      kind: 'real',
      value: 1.5e-3,
    });
    expect(parseFitsCard(pad('TZERO1  =              3.2768E4'))).toMatchObject({
      kind: 'real',
      value: 32768,
    });
    expect(parseFitsCard(pad('TZERO2  =                  .5'))).toMatchObject({ kind: 'real', value: 0.5 });
  });

  it('reads an empty value field as an undefined value, and a complex value as its text', () => {
    expect(parseFitsCard(pad('BLANKVAL=                      / nothing here'))).toEqual({
      keyword: 'BLANKVAL',
      kind: 'undefined',
      value: null,
      comment: 'nothing here',
    });
    expect(parseFitsCard(pad('CVALUE  = (1.5, -2.0)'))).toMatchObject({
      kind: 'complex',
      value: '1.5, -2.0',
    });
  });

  it('treats COMMENT, HISTORY, blank keywords, CONTINUE and cards without "= " as commentary', () => {
    expect(parseFitsCard(pad('COMMENT = not a value'))).toMatchObject({
      kind: 'commentary',
      keyword: 'COMMENT',
    });
    expect(parseFitsCard(pad('HISTORY made by hand'))).toMatchObject({
      kind: 'commentary',
      value: 'made by hand',
    });
    expect(parseFitsCard(pad("CONTINUE  'the rest&'"))).toMatchObject({
      kind: 'commentary',
      keyword: 'CONTINUE',
    });
    expect(parseFitsCard(pad('        a blank keyword'))).toMatchObject({ kind: 'commentary', keyword: '' });
    expect(parseFitsCard(pad('NOVALUE   no equals sign'))).toMatchObject({
      kind: 'commentary',
      keyword: 'NOVALUE',
    });
  });

  it.each([
    ["OBJECT  = 'no closing quote", 'no closing quote'],
    ['NAXIS   =                 2x', "'2x' is not a FITS value"],
    ['NAXIS   =                  2 extra', "unexpected 'extra' after the value"],
    ['naxis   =                  2', "keyword 'naxis' may hold only A-Z, 0-9, '-' and '_'"],
    ['NA XIS  =                  2', 'may hold only'],
    ['CVALUE  = (1.5, -2.0', 'no closing parenthesis'],
  ])('refuses the card %j, saying %j', (text, message) => {
    expect(() => parseFitsCard(pad(text), 'HDU 1, header card 37')).toThrow(ReaderError);
    expect(() => parseFitsCard(pad(text), 'HDU 1, header card 37')).toThrow(message);
    expect(() => parseFitsCard(pad(text), 'HDU 1, header card 37')).toThrow(/^HDU 1, header card 37/);
  });

  it('refuses a card with a byte outside printable ASCII, naming the character position', () => {
    expect(() => parseFitsCard(pad("OBJECT  = 'caf\u00e9'"), 'header card 3')).toThrow(
      'header card 3 is not valid: character 15 is byte 0xe9; only printable ASCII is allowed',
    );
    expect(() => parseFitsCard('SHORT')).toThrow('a card is 80 characters, this one has 5');
  });
});

describe('readFitsHeader', () => {
  it('reads cards up to END across blocks and says where the data begin', () => {
    const cards = Array.from({ length: 40 }, (_, i) => card(`KEY${i}`, i));
    const bytes = headerBytes([card('SIMPLE', true), ...cards]);
    expect(bytes.length).toBe(5760); // 42 cards need two 2880-byte blocks
    const header = readFitsHeader(bytes, 0, 1);
    expect(header.cards).toHaveLength(41);
    expect(header.keywords.get('KEY39')?.value).toBe(39);
    expect(header.dataOffset).toBe(5760);
  });

  it('keeps the first card when a keyword repeats', () => {
    const header = readFitsHeader(
      headerBytes([card('SIMPLE', true), card('OBJECT', 'first'), card('OBJECT', 'second')]),
      0,
      1,
    );
    expect(header.keywords.get('OBJECT')?.value).toBe('first');
  });

  it('when the file ends before the END card, names the truncated header', () => {
    const bytes = headerBytes([card('SIMPLE', true)]).slice(0, 2880);
    bytes.fill(0x20, 80, 160); // blank out END
    expect(() => readFitsHeader(bytes, 0, 1)).toThrow(
      'truncated header: the file ends after 36 cards of HDU 1 without an END card',
    );
    expect(() => readFitsHeader(bytes.slice(0, 1000), 0, 1)).toThrow(
      'truncated header: HDU 1 needs at least one 2880-byte block, found 1000 bytes',
    );
  });

  it('names the card number within the HDU when a card is not valid', () => {
    const cards = [
      card('SIMPLE', true),
      ...Array.from({ length: 35 }, (_, i) => card(`K${i}`, i)),
      pad('BAD     = ?'),
    ];
    expect(() => readFitsHeader(headerBytes(cards), 0, 2)).toThrow(
      /^HDU 2, header card 37 \(BAD\) is not valid/,
    );
  });
});
