/**
 * Dipdeck's design tokens: the one source of truth for colour, type, and shape.
 * `src/styles/app.css` repeats these values in its Tailwind `@theme` block because Tailwind reads CSS,
 * not TypeScript; a unit test keeps the two from drifting.
 */

export const palette = {
  /** Warm paper: the page background. */
  paper: '#f6f1e7',
  /** Slightly lifted paper for cards, inputs and tables. */
  surface: '#fffbf4',
  /** Deep ink: body text and primary buttons. */
  ink: '#1d2330',
  /** Secondary text: hints, captions, table headings. */
  muted: '#5d5a53',
  /** Hairlines and card borders; decorative only, never the sole boundary of a control. */
  line: '#ddd3c1',
  /** Borders of inputs and other controls, which need 3:1 against their surroundings. */
  edge: '#8a8173',
  /** Amber: dips, marks and the focus ring. Graphics only; use `amberInk` for amber text. */
  amber: '#c2780e',
  amberInk: '#8a4f00',
  amberWash: '#fbebcd',
  /** Cool slate: flat light curves and neutral data. */
  slate: '#4d6377',
  slateWash: '#e2e8ec',
  danger: '#a3302a',
  dangerWash: '#f9e3de',
  success: '#2b6a46',
  successWash: '#dff0e4',
} as const;

export type PaletteName = keyof typeof palette;

/**
 * What a pair is used for decides the contrast it needs:
 * `text` is normal-size text (4.5:1), `large-text` is ≥ 24 px or ≥ 18.66 px bold (3:1),
 * `ui` is a control boundary, focus indicator or meaningful graphic (3:1).
 */
export type ContrastUse = 'text' | 'large-text' | 'ui';

export interface ContrastPair {
  foreground: PaletteName;
  background: PaletteName;
  use: ContrastUse;
  where: string;
}

export const contrastPairs: readonly ContrastPair[] = [
  { foreground: 'ink', background: 'paper', use: 'text', where: 'body text' },
  { foreground: 'ink', background: 'surface', use: 'text', where: 'text in cards, inputs, tables' },
  { foreground: 'muted', background: 'paper', use: 'text', where: 'hints and captions' },
  { foreground: 'muted', background: 'surface', use: 'text', where: 'table headings, hints in cards' },
  { foreground: 'paper', background: 'ink', use: 'text', where: 'primary button label' },
  { foreground: 'ink', background: 'amberWash', use: 'text', where: 'highlighted notes' },
  { foreground: 'amberInk', background: 'paper', use: 'text', where: 'amber labels and eyebrows' },
  { foreground: 'amberInk', background: 'surface', use: 'text', where: 'amber labels in cards' },
  { foreground: 'amberInk', background: 'amberWash', use: 'text', where: 'role badges' },
  { foreground: 'slate', background: 'paper', use: 'text', where: 'flat labels, numbers' },
  { foreground: 'slate', background: 'surface', use: 'text', where: 'numbers in tables' },
  { foreground: 'slate', background: 'slateWash', use: 'text', where: 'neutral badges' },
  { foreground: 'danger', background: 'paper', use: 'text', where: 'field errors' },
  { foreground: 'danger', background: 'surface', use: 'text', where: 'errors in cards' },
  { foreground: 'danger', background: 'dangerWash', use: 'text', where: 'error alerts, suspended badge' },
  { foreground: 'success', background: 'paper', use: 'text', where: 'confirmations' },
  { foreground: 'success', background: 'successWash', use: 'text', where: 'success alerts, active badge' },
  { foreground: 'amber', background: 'paper', use: 'ui', where: 'focus ring, dip marks on the page' },
  { foreground: 'amber', background: 'surface', use: 'ui', where: 'dip marks in cards' },
  { foreground: 'amber', background: 'ink', use: 'ui', where: 'active-link marker on ink' },
  { foreground: 'slate', background: 'surface', use: 'ui', where: 'flat light-curve lines' },
  { foreground: 'edge', background: 'paper', use: 'ui', where: 'control borders on the page' },
  { foreground: 'edge', background: 'surface', use: 'ui', where: 'control borders in cards' },
  { foreground: 'ink', background: 'paper', use: 'ui', where: 'primary button against the page' },
];

export const fonts = {
  sans: '"IBM Plex Sans", ui-sans-serif, system-ui, sans-serif',
  mono: '"IBM Plex Mono", ui-monospace, "SFMono-Regular", monospace',
} as const;

/** Type scale in rem, each with its line height: a 1.2-ish ratio, roomier at the small end for reading. */
export const typeScale = {
  xs: { size: '0.75rem', lineHeight: '1.1rem' },
  sm: { size: '0.875rem', lineHeight: '1.3rem' },
  base: { size: '1rem', lineHeight: '1.55rem' },
  lg: { size: '1.125rem', lineHeight: '1.7rem' },
  xl: { size: '1.375rem', lineHeight: '1.9rem' },
  '2xl': { size: '1.75rem', lineHeight: '2.2rem' },
  '3xl': { size: '2.25rem', lineHeight: '2.6rem' },
  '4xl': { size: '3rem', lineHeight: '3.3rem' },
} as const;

export const radii = {
  sm: '4px',
  md: '8px',
  lg: '14px',
} as const;

/** The smallest target a pointer or finger should have to hit (WCAG 2.2, §2.5.5 target size, enhanced). */
export const minTargetPx = 44;

/** The CSS custom properties the Tailwind theme must declare, exactly as written in app.css. */
export function themeVariables(): Record<string, string> {
  const variables: Record<string, string> = {};
  for (const [name, hex] of Object.entries(palette)) variables[`--color-${kebab(name)}`] = hex;
  variables['--font-sans'] = fonts.sans;
  variables['--font-mono'] = fonts.mono;
  for (const [name, step] of Object.entries(typeScale)) {
    variables[`--text-${name}`] = step.size;
    variables[`--text-${name}--line-height`] = step.lineHeight;
  }
  for (const [name, value] of Object.entries(radii)) variables[`--radius-${name}`] = value;
  variables['--spacing-target'] = `${minTargetPx}px`;
  return variables;
}

function kebab(name: string): string {
  return name.replace(/[A-Z]/g, (letter) => `-${letter.toLowerCase()}`);
}
