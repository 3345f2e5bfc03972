import { describe, expect, it } from 'vitest';
import { deckActionForKey, stepTimeCursor } from '@/features/deck/lib/keyboard';

describe('deckActionForKey', () => {
  it('maps → to dip, ← to flat, ↑ to unsure, M to marking and Z to undo', () => {
    expect(deckActionForKey({ key: 'ArrowRight' })).toEqual({ type: 'verdict', answer: 'dip' });
    expect(deckActionForKey({ key: 'ArrowLeft' })).toEqual({ type: 'verdict', answer: 'flat' });
    expect(deckActionForKey({ key: 'ArrowUp' })).toEqual({ type: 'verdict', answer: 'unsure' });
    expect(deckActionForKey({ key: 'm' })).toEqual({ type: 'toggle-mark' });
    expect(deckActionForKey({ key: 'M' })).toEqual({ type: 'toggle-mark' });
    expect(deckActionForKey({ key: 'z' })).toEqual({ type: 'undo' });
    expect(deckActionForKey({ key: 'Z' })).toEqual({ type: 'undo' });
  });

  it('leaves other keys, ↓ and browser shortcuts (Ctrl+Z, Cmd+←, Alt+→) alone', () => {
    expect(deckActionForKey({ key: 'ArrowDown' })).toBeNull();
    expect(deckActionForKey({ key: 'Enter' })).toBeNull();
    expect(deckActionForKey({ key: 'z', ctrlKey: true })).toBeNull();
    expect(deckActionForKey({ key: 'ArrowLeft', metaKey: true })).toBeNull();
    expect(deckActionForKey({ key: 'ArrowRight', altKey: true })).toBeNull();
    expect(deckActionForKey({ key: 'ArrowRight', shiftKey: true })).toBeNull();
  });

  it('when typing in a field, takes nothing; on the time cursor, leaves the arrows to the cursor', () => {
    expect(deckActionForKey({ key: 'm', target: 'text-field' })).toBeNull();
    expect(deckActionForKey({ key: 'ArrowRight', target: 'text-field' })).toBeNull();
    expect(deckActionForKey({ key: 'ArrowRight', target: 'time-cursor' })).toBeNull();
    expect(deckActionForKey({ key: 'm', target: 'time-cursor' })).toEqual({ type: 'toggle-mark' });
    expect(deckActionForKey({ key: 'ArrowUp', target: 'button' })).toEqual({
      type: 'verdict',
      answer: 'unsure',
    });
  });
});

describe('stepTimeCursor', () => {
  it('moves by a step with the arrows, a tenth with Page keys, and to the ends with Home and End', () => {
    expect(stepTimeCursor('ArrowRight', 5, 12, 0.1)).toBeCloseTo(5.1);
    expect(stepTimeCursor('ArrowLeft', 5, 12, 0.1)).toBeCloseTo(4.9);
    expect(stepTimeCursor('PageUp', 5, 12, 0.1)).toBeCloseTo(6.2);
    expect(stepTimeCursor('Home', 5, 12, 0.1)).toBe(0);
    expect(stepTimeCursor('End', 5, 12, 0.1)).toBe(12);
  });

  it('stays within the snippet and ignores other keys', () => {
    expect(stepTimeCursor('ArrowRight', 11.95, 12, 0.1)).toBe(12);
    expect(stepTimeCursor('ArrowLeft', 0.05, 12, 0.1)).toBe(0);
    expect(stepTimeCursor('m', 5, 12, 0.1)).toBeNull();
  });
});
