import { describe, expect, it } from 'vitest';
import { type ContrastUse, contrastPairs, palette, themeVariables } from '@/config/design-tokens';
import { contrastRatio, relativeLuminance } from '@/lib/color-contrast';

// Vitest blanks every CSS import, even `?raw`, so read the file itself. This tsconfig carries browser types
// only, hence the one-method shape instead of @types/node.
interface TextFileReader {
  readFileSync(path: URL, encoding: 'utf8'): string;
}
const fs = (await import('node:fs' as string)) as TextFileReader;
const appCss = fs.readFileSync(new URL('../../../../src/styles/app.css', import.meta.url), 'utf8');

// WCAG 2.2, §1.4.3 and the relative luminance definition: 4.5:1 for normal text, 3:1 for large text;
// §1.4.11 Non-text Contrast: 3:1 for control boundaries, focus indicators and meaningful graphics.
const required: Record<ContrastUse, number> = { text: 4.5, 'large-text': 3, ui: 3 };

describe('the contrast formula', () => {
  it('gives 21:1 for black on white, the maximum (WCAG 2.2, definition of contrast ratio)', () => {
    expect(contrastRatio('#000000', '#ffffff')).toBeCloseTo(21, 5);
  });

  it('gives about 4.48:1 for #777777 on white, just under the 4.5:1 bar (WCAG relative luminance formula)', () => {
    expect(contrastRatio('#777777', '#ffffff')).toBeCloseTo(4.48, 2);
  });

  it('is symmetric and gives 1:1 for a colour on itself', () => {
    expect(contrastRatio('#ffffff', '#777777')).toBeCloseTo(contrastRatio('#777777', '#ffffff'), 10);
    expect(contrastRatio(palette.amber, palette.amber)).toBe(1);
  });

  it('gives luminance 0 for black and 1 for white', () => {
    expect(relativeLuminance('#000000')).toBe(0);
    expect(relativeLuminance('#ffffff')).toBeCloseTo(1, 10);
  });

  it('when the colour is not #rrggbb, throws naming what it got', () => {
    expect(() => relativeLuminance('amber')).toThrow('got amber');
  });
});

describe('the palette', () => {
  it.each(contrastPairs.map((pair) => [pair.foreground, pair.background, pair.use, pair.where] as const))(
    '%s on %s (%s, %s) meets WCAG 2.2 AA',
    (foreground, background, use) => {
      const ratio = contrastRatio(palette[foreground], palette[background]);
      expect(ratio).toBeGreaterThanOrEqual(required[use]);
    },
  );

  it('declares every colour as a #rrggbb hex value', () => {
    for (const hex of Object.values(palette)) expect(hex).toMatch(/^#[0-9a-f]{6}$/);
  });
});

describe('app.css', () => {
  const theme = /@theme\s*\{([^}]*)\}/.exec(appCss)?.[1] ?? '';

  it('has a Tailwind @theme block', () => {
    expect(theme).not.toBe('');
  });

  it.each(Object.entries(themeVariables()))('declares %s exactly as design-tokens.ts does', (name, value) => {
    expect(theme).toContain(`${name}: ${value};`);
  });

  it('declares no colour that design-tokens.ts does not know', () => {
    const declared = [...theme.matchAll(/(--color-[a-z-]+):/g)].map((match) => match[1]);
    const known = Object.keys(themeVariables());
    expect(declared.filter((name) => name !== '--color-' && !known.includes(name ?? ''))).toEqual([]);
  });
});
