import type { RulingValue } from './splits';

export type ReviewAction =
  | { type: 'rule'; ruling: RulingValue }
  | { type: 'focus-note' }
  | { type: 'leave-note' }
  | { type: 'next' }
  | { type: 'previous' };

export interface ReviewKeyPress {
  key: string;
  altKey?: boolean;
  ctrlKey?: boolean;
  metaKey?: boolean;
  shiftKey?: boolean;
  /** Typing in the note (or any field) keeps every letter to itself. */
  inTextField?: boolean;
}

export const reviewShortcuts: readonly { keys: readonly string[]; does: string }[] = [
  { keys: ['D'], does: 'Rule dip' },
  { keys: ['F'], does: 'Rule flat' },
  { keys: ['S'], does: 'Rule systematic' },
  { keys: ['N'], does: 'Write a note' },
  { keys: ['J', '→'], does: 'Next split' },
  { keys: ['K', '←'], does: 'Previous split' },
];

const rulingKeys: Record<string, RulingValue> = { d: 'dip', f: 'flat', s: 'systematic' };

/** The review's shortcuts: D dip, F flat, S systematic, N note, J or → next, K or ← previous. */
export function reviewActionForKey(press: ReviewKeyPress): ReviewAction | null {
  // Browser and system shortcuts (Ctrl+F, Cmd+←) are not ours to take.
  if (press.altKey || press.ctrlKey || press.metaKey) return null;
  if (press.inTextField) return press.key === 'Escape' ? { type: 'leave-note' } : null;
  if (press.shiftKey) return null;
  const key = press.key.length === 1 ? press.key.toLowerCase() : press.key;
  const ruling = rulingKeys[key];
  if (ruling) return { type: 'rule', ruling };
  if (key === 'n') return { type: 'focus-note' };
  if (key === 'j' || key === 'ArrowRight') return { type: 'next' };
  if (key === 'k' || key === 'ArrowLeft') return { type: 'previous' };
  return null;
}
