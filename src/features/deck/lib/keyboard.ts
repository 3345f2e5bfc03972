import type { Answer } from './cards';

export type DeckAction = { type: 'verdict'; answer: Answer } | { type: 'toggle-mark' } | { type: 'undo' };

export interface KeyPress {
  key: string;
  altKey?: boolean;
  ctrlKey?: boolean;
  metaKey?: boolean;
  shiftKey?: boolean;
  /** Where the key went: typing in a field or adjusting the time cursor keeps the arrows to itself. */
  target?: 'text-field' | 'time-cursor' | 'button' | 'other';
}

export const shortcuts: readonly { keys: string; does: string }[] = [
  { keys: '→', does: 'Dip' },
  { keys: '←', does: 'Flat' },
  { keys: '↑', does: 'Unsure' },
  { keys: 'M', does: 'Mark or unmark at the time cursor' },
  { keys: 'Z', does: 'Undo the last verdict' },
];

/** The Deck's keyboard shortcuts: → dip, ← flat, ↑ unsure, M mark, Z undo. */
export function deckActionForKey(press: KeyPress): DeckAction | null {
  // Browser and system shortcuts (Ctrl+Z, Cmd+←) are not ours to take.
  if (press.altKey || press.ctrlKey || press.metaKey) return null;
  if (press.target === 'text-field') return null;
  const key = press.key.length === 1 ? press.key.toLowerCase() : press.key;
  if (key === 'm') return { type: 'toggle-mark' };
  if (key === 'z') return press.shiftKey ? null : { type: 'undo' };
  if (press.target === 'time-cursor') return null;
  if (press.shiftKey) return null;
  if (key === 'ArrowRight') return { type: 'verdict', answer: 'dip' };
  if (key === 'ArrowLeft') return { type: 'verdict', answer: 'flat' };
  if (key === 'ArrowUp') return { type: 'verdict', answer: 'unsure' };
  return null;
}

/** Moves the keyboard time cursor like a slider: arrows by a small step, Page keys by a tenth, Home/End. */
export function stepTimeCursor(
  key: string,
  valueHours: number,
  spanHours: number,
  stepHours: number,
): number | null {
  const big = spanHours / 10;
  const clamp = (value: number) => Math.min(spanHours, Math.max(0, value));
  switch (key) {
    case 'ArrowRight':
    case 'ArrowUp':
      return clamp(valueHours + stepHours);
    case 'ArrowLeft':
    case 'ArrowDown':
      return clamp(valueHours - stepHours);
    case 'PageUp':
      return clamp(valueHours + big);
    case 'PageDown':
      return clamp(valueHours - big);
    case 'Home':
      return 0;
    case 'End':
      return spanHours;
    default:
      return null;
  }
}
